import { RUN_SCATTER_MIN_TESTS, type RunScatterVariable } from '../schemas/settlement-run-limits'
import type { RunPointProbabilistic, RunScatterSource, RunVariableScatter } from '../types/settlement-runs'

/**
 * The words and small sums of a probabilistic settlement run that the editor and the run page
 * share: the scattered parameters' names, reading the probability of exceeding a typed limit off
 * a point's exceedance curve, and which COVs rest on too few tests to be more than an assumption.
 */

/** How the pages name each scattered parameter (trade symbols). */
export const SPREAD_VARIABLE_LABELS: Record<RunScatterVariable, string> = {
  cc: 'Cc',
  cr: 'Cr',
  e0: 'e0',
  cv: 'cv',
  ch: 'ch',
  preconsolidation: 'σ\'p',
}

/** Where a COV came from, in words. */
export const SPREAD_SOURCE_WORDS: Record<RunScatterSource, string> = {
  data: 'from the tests',
  default: 'assumed',
  entered: 'typed in',
}

/** Fewer tests than this and a COV "from the data" is a stated default: an assumption. */
export const SPREAD_MIN_TESTS = RUN_SCATTER_MIN_TESTS

/** True when the COV is not backed by enough tests: a default, or fewer than 3 tests behind it. */
export function isAssumedScatter(v: Pick<RunVariableScatter, 'source' | 'n' | 'trend'>): boolean {
  if (v.source === 'entered') return false
  if (v.source === 'default') return true
  return v.n < SPREAD_MIN_TESTS
}

export interface ExceedanceReading {
  /** P(settlement > limit), 0–1. */
  probability: number
  /**
   * 'atLeast': the limit lies below the smallest settlement on the curve, so the probability is
   * at least the curve's first value; 'atMost': beyond its largest, at most its last; null: read
   * between two points of the curve.
   */
  bound: 'atLeast' | 'atMost' | null
}

/**
 * The probability of exceeding `limit` (m), read off an exceedance curve (settlements increasing,
 * P(S > s) not increasing) by linear interpolation between the two points around it; outside the
 * curve, its end value with the side it lies on. Null for an empty curve or a limit that is not a
 * number.
 */
export function exceedanceAt(curve: RunPointProbabilistic['exceedanceCurve'], limit: number): ExceedanceReading | null {
  const s = curve.settlement
  const p = curve.probability
  const n = Math.min(s.length, p.length)
  if (n === 0 || !Number.isFinite(limit)) return null
  if (limit < at(s, 0)) return { probability: at(p, 0), bound: 'atLeast' }
  if (limit > at(s, n - 1)) return { probability: at(p, n - 1), bound: 'atMost' }
  // The last point at or below the limit (binary search: curves hold a few hundred points).
  let lo = 0
  let hi = n - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (at(s, mid) <= limit) lo = mid
    else hi = mid
  }
  if (at(s, hi) <= limit) lo = hi
  const s0 = at(s, lo)
  const p0 = at(p, lo)
  if (lo === n - 1) return { probability: p0, bound: null }
  const s1 = at(s, hi)
  const p1 = at(p, hi)
  if (!(s1 > s0)) return { probability: p1, bound: null }
  return { probability: p0 + (p1 - p0) * (limit - s0) / (s1 - s0), bound: null }
}

/** A probability as a percentage for the page: one decimal between 1 and 99 %, two beyond. */
export function formatProbability(v: number): string {
  if (!Number.isFinite(v)) return '—'
  const pct = Math.min(100, Math.max(0, v * 100))
  const d = (pct > 0 && pct < 1) || (pct > 99 && pct < 100) ? 2 : 1
  return `${pct.toFixed(d)} %`
}

/** A coefficient of variation as a percentage ("25 %"). */
export function formatCov(v: number): string {
  if (!Number.isFinite(v)) return '—'
  const pct = v * 100
  return `${pct.toFixed(pct < 10 ? 1 : 0)} %`
}

/** The quantiles a point reports, in the order the page lists them. */
export const SPREAD_QUANTILES = [
  { key: 'p05', label: 'P5' },
  { key: 'p10', label: 'P10' },
  { key: 'p50', label: 'P50' },
  { key: 'p90', label: 'P90' },
  { key: 'p95', label: 'P95' },
] as const

/** The value at `i` of an array already known to hold it (0 otherwise). */
function at(a: readonly number[], i: number): number {
  return a[i] ?? 0
}
