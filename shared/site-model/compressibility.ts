import { COMPRESSIBILITY_KEYS, depthTrendAt } from './definition-plain'
import type { Compressibility, CompressibilityKey, DepthTrend } from './definition'

/** What a stratum's adopted compressibility is made from: one interpreted oedometer test. */
export interface TestCompressibility {
  id: string
  stratumCode: string | null
  /** Sample mid-depth, m. */
  depth: number
  qualityClass: string | null
  cc: number | null
  cr: number | null
  e0: number | null
  cv: number | null
  calpha: number | null
}

/**
 * The tests a stratum's compressibility is adopted from: its tests with Cc, Cr and
 * e0 read, leaving out tests a reviewer excluded and very poor samples —
 * disturbance flattens the curve and lowers Cc (Lunne, Berre & Strandvik 1997;
 * common practice). The mean and the depth trends use the same tests.
 */
export function eligibleTests(tests: readonly TestCompressibility[], stratumCode: string, excluded: ReadonlySet<string> = new Set()): TestCompressibility[] {
  return tests.filter(t => t.stratumCode === stratumCode && !excluded.has(t.id) && t.qualityClass !== 'very-poor' && t.cc !== null && t.cr !== null && t.e0 !== null)
}

/** The (depth, value) pairs of one parameter over the eligible tests: cv where measured (> 0), Cα where measured (≥ 0). */
function samplesOf(use: readonly TestCompressibility[], key: CompressibilityKey): { id: string, depth: number, value: number }[] {
  return use
    .map(t => ({ id: t.id, depth: t.depth, value: t[key] }))
    .filter((p): p is { id: string, depth: number, value: number } => p.value !== null && Number.isFinite(p.value) && (key === 'cv' ? p.value > 0 : key === 'calpha' ? p.value >= 0 : true))
}

const round = (v: number, d: number) => Math.round(v * 10 ** d) / 10 ** d
const DIGITS: Record<CompressibilityKey, number> = { cc: 3, cr: 3, e0: 3, cv: 2, calpha: 4 }

/**
 * The mean Cc, Cr, e0 (and cv, Cα where measured) of a stratum's eligible
 * oedometer tests (arithmetic mean, common practice). Null when no test is left.
 */
export function meanCompressibility(tests: readonly TestCompressibility[], stratumCode: string, excluded: ReadonlySet<string> = new Set()): (Pick<Compressibility, 'cc' | 'cr' | 'e0' | 'cv' | 'calpha' | 'n'> & { used: string[] }) | null {
  const use = eligibleTests(tests, stratumCode, excluded)
  if (!use.length) return null
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length
  const cv = samplesOf(use, 'cv').map(p => p.value)
  const ca = samplesOf(use, 'calpha').map(p => p.value)
  return {
    cc: round(mean(use.map(t => t.cc!)), DIGITS.cc),
    cr: round(mean(use.map(t => t.cr!)), DIGITS.cr),
    e0: round(mean(use.map(t => t.e0!)), DIGITS.e0),
    ...(cv.length ? { cv: round(mean(cv), DIGITS.cv) } : {}),
    ...(ca.length ? { calpha: round(mean(ca), DIGITS.calpha) } : {}),
    n: use.length,
    used: use.map(t => t.id),
  }
}

/** Fewest tests for a depth trend: with two, the line passes through both and R² says nothing. */
export const MIN_TREND_TESTS = 3

/**
 * Ordinary least squares of value on depth (any regression text): gradient
 * b = Szy/Szz, and the line passes through the centroid (z̄, ȳ), which is the
 * trend's reference depth and value. R² = 1 − SSres/SStot (null when every value
 * is the same). Throws when fewer than MIN_TREND_TESTS pairs or all at one depth.
 */
export function fitDepthTrend(pairs: readonly { id?: string, depth: number, value: number }[]): DepthTrend {
  const n = pairs.length
  if (n < MIN_TREND_TESTS) throw new RangeError(`a depth trend needs at least ${MIN_TREND_TESTS} tests (${n} here)`)
  const zbar = pairs.reduce((s, p) => s + p.depth, 0) / n
  const ybar = pairs.reduce((s, p) => s + p.value, 0) / n
  let szz = 0
  let szy = 0
  let syy = 0
  for (const p of pairs) {
    szz += (p.depth - zbar) ** 2
    szy += (p.depth - zbar) * (p.value - ybar)
    syy += (p.value - ybar) ** 2
  }
  // Depths equal to the last millimetre leave the gradient undefined.
  if (szz < 1e-6) throw new RangeError('a depth trend needs tests at more than one depth')
  const gradient = szy / szz
  const ssres = Math.max(0, syy - gradient * szy)
  const depths = pairs.map(p => p.depth)
  return {
    referenceDepth: zbar,
    value: ybar,
    gradient,
    n,
    // Values equal to rounding (syy at floating-point noise) leave nothing to explain.
    r2: syy > 1e-12 * n * Math.max(1e-12, ybar * ybar) ? Math.min(1, Math.max(0, 1 - ssres / syy)) : null,
    testDepths: { top: Math.min(...depths), bottom: Math.max(...depths) },
    testIds: pairs.map(p => p.id ?? ''),
  }
}

/** Per parameter: the fitted depth trend, or why there is none. */
export type TrendCandidate = { ok: true, trend: DepthTrend } | { ok: false, reason: string }

/**
 * Depth trends of every parameter over the stratum's eligible tests (the same
 * tests as the mean), stored rounded: depth to the millimetre, value and gradient
 * to the parameter's digits plus two.
 */
export function depthTrendCandidates(tests: readonly TestCompressibility[], stratumCode: string, excluded: ReadonlySet<string> = new Set()): Record<CompressibilityKey, TrendCandidate> {
  const use = eligibleTests(tests, stratumCode, excluded)
  const out = {} as Record<CompressibilityKey, TrendCandidate>
  for (const key of COMPRESSIBILITY_KEYS) {
    const pairs = samplesOf(use, key)
    try {
      const t = fitDepthTrend(pairs)
      out[key] = {
        ok: true,
        trend: { ...t, referenceDepth: round(t.referenceDepth, 3), value: round(t.value, DIGITS[key] + 2), gradient: round(t.gradient, DIGITS[key] + 2), r2: t.r2 === null ? null : round(t.r2, 4) },
      }
    }
    catch (err) {
      if (!(err instanceof RangeError)) throw err
      out[key] = { ok: false, reason: err.message }
    }
  }
  return out
}

/** The parameters of a compressibility at a depth: each one's depth trend where it has one, else its constant. */
export function compressibilityAt(c: Compressibility, depth: number): { cc: number, cr: number, e0: number, cv?: number, calpha?: number } {
  const pick = (key: CompressibilityKey, constant: number | undefined): number | undefined => {
    const t = c.trends?.[key]
    return t ? depthTrendAt(t, depth) : constant
  }
  const cv = pick('cv', c.cv)
  const calpha = pick('calpha', c.calpha)
  return { cc: pick('cc', c.cc)!, cr: pick('cr', c.cr)!, e0: pick('e0', c.e0)!, ...(cv !== undefined ? { cv } : {}), ...(calpha !== undefined ? { calpha } : {}) }
}

/** Whether any parameter of a compressibility follows a depth trend. */
export function hasDepthTrend(c: Compressibility | undefined): boolean {
  return !!c?.trends && Object.values(c.trends).some(Boolean)
}
