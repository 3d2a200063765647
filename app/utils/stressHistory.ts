import type { FlagVerdict } from '#shared/review/flags'
import { PRECONSOLIDATION_SOURCES, type PreconsolidationSource } from '#shared/lab/sources'
import type { ProfilePoint } from '#shared/types/calc'
import type { PreconsolidationPointRow } from '#shared/types/lab'
import type { ModelStratum, SiteModelDefinition } from '#shared/site-model/definition'
import { stratumBounds } from '#shared/site-model/definition-plain'
import { trendPreconsolidation } from '#shared/site-model/convert'
import { assignBands, sampleTrend, stressAt, type StressAt, type TrendSample } from '#shared/plots/stress-history'

export { assignBands, sampleTrend, stressAt }
export type { StressAt, TrendSample }

/**
 * The stress-history reading of a site model on the client: σ'v0 at any depth
 * from the computed profile, which band each σ'p point belongs to, whether it is
 * fitted, and the σ'p, OCR and POP lines of the strata's trends. Pure functions,
 * SI units.
 */

export type PointSource = PreconsolidationSource
export const POINT_SOURCES: readonly PointSource[] = PRECONSOLIDATION_SOURCES

/** An open reviewer flag as it bears on a point. */
export interface PointFlag {
  id: string
  verdict: FlagVerdict
  comment: string
  author: string | null
  targetType: string
}

/** An oedometer test as GET …/tests/oedometer lists it, as far as the canvas reads it. */
export interface ListedTest {
  id: string
  depth: number
  stratumCode: string | null
  point: { identifier: string }
  sample: { identifier: string }
  reading: { qualityClass: string | null }
  adoption: { id: string } | null
}

/**
 * A test with open reviewer flags and no σ'p adopted from it (a disturbed
 * specimen, say): it has no σ'p point, so the canvas marks it at its sample
 * depth on the stress track's edge instead. Never fitted.
 */
export interface FlaggedTest {
  testId: string
  pointIdentifier: string
  sampleIdentifier: string
  depth: number
  stratumCode: string | null
  qualityClass: string | null
  flags: PointFlag[]
}

/** The flagged tests without an adoption, shallowest first; a flag on an adopted test shows on its σ'p point instead. */
export function flaggedUnadoptedTests(tests: readonly ListedTest[], flags: readonly (PointFlag & { targetId: string, status?: string })[]): FlaggedTest[] {
  const byTest = new Map<string, PointFlag[]>()
  for (const f of flags) {
    if (f.targetType !== 'oedometer-test' || (f.status && f.status !== 'open')) continue
    byTest.set(f.targetId, [...(byTest.get(f.targetId) ?? []), { id: f.id, verdict: f.verdict, comment: f.comment, author: f.author, targetType: f.targetType }])
  }
  return tests
    .filter(t => !t.adoption && byTest.has(t.id))
    .map(t => ({ testId: t.id, pointIdentifier: t.point.identifier, sampleIdentifier: t.sample.identifier, depth: t.depth, stratumCode: t.stratumCode, qualityClass: t.reading.qualityClass, flags: byTest.get(t.id)! }))
    .sort((a, b) => a.depth - b.depth || a.pointIdentifier.localeCompare(b.pointIdentifier))
}

export type PointState = 'included' | 'excluded' | 'flagged-out' | 'unassigned'

/** Points a reviewer flagged `exclude` (open flags): drawn, never fitted. */
export function reviewerExcluded(flags: ReadonlyMap<string, readonly PointFlag[]>): Set<string> {
  const out = new Set<string>()
  for (const [id, list] of flags) if (list.some(f => f.verdict === 'exclude')) out.add(id)
  return out
}

/** Ids the engineer left out of band `i`: the trend's list, or the session's pending list before the first fit. */
export function engineerExcluded(s: ModelStratum, pending: Readonly<Record<string, readonly string[]>>): Set<string> {
  return new Set(s.trend ? s.trend.excludedPointIds : pending[s.code] ?? [])
}

export function pointState(id: string, band: number, def: SiteModelDefinition, pending: Readonly<Record<string, readonly string[]>>, flaggedOut: ReadonlySet<string>): PointState {
  if (band < 0) return 'unassigned'
  if (flaggedOut.has(id)) return 'flagged-out'
  const s = def.strata[band]
  if (!s) return 'unassigned'
  return engineerExcluded(s, pending).has(id) ? 'excluded' : 'included'
}

export interface FitInput {
  included: PreconsolidationPointRow[]
  /** Everything of the band not fitted: by the engineer and by reviewer flags. */
  excludedIds: string[]
  /** Points without a positive σ'v0 in the current profile (cannot enter a POP/OCR fit). */
  withoutStress: number
}

/** The band's points split into fitted and left out, with σ'v0 from the current profile. */
export function fitInput(bandIndex: number, def: SiteModelDefinition, points: readonly PreconsolidationPointRow[], bands: Int32Array, pending: Readonly<Record<string, readonly string[]>>, flaggedOut: ReadonlySet<string>, profile: readonly ProfilePoint[]): FitInput {
  const s = def.strata[bandIndex]
  const included: PreconsolidationPointRow[] = []
  const excludedIds: string[] = []
  let withoutStress = 0
  if (!s) return { included, excludedIds, withoutStress }
  const mine = engineerExcluded(s, pending)
  points.forEach((p, k) => {
    if (bands[k] !== bandIndex) return
    if (flaggedOut.has(p.id) || mine.has(p.id)) { excludedIds.push(p.id); return }
    const e = stressAt(profile, p.depth)?.effectiveStress
    if (e === undefined || !(e > 0)) { withoutStress++; excludedIds.push(p.id); return }
    included.push({ ...p, effectiveStress: e })
  })
  return { included, excludedIds, withoutStress }
}

/** Two id lists hold the same ids (order aside). */
export function sameIds(a: readonly string[], b: readonly string[]): boolean {
  if (a.length !== b.length) return false
  const s = new Set(a)
  return b.every(x => s.has(x))
}

/** A display fit of a band's saved trend, as far as its staleness goes. */
export interface DisplayFitState {
  /** What the fit was asked with (the band, model, log space and each fitted point's id and σ'v0). */
  key: string
  answer: { parameters: Readonly<Record<string, number>> } | null
  /** Asked again and not answered yet: `answer` is still the previous ask's. */
  pending: boolean
}

/**
 * Whether a band's saved trend no longer matches today's points: `ids` when the points that would take part differ
 * from those it was fitted to, `parameters` when the same model fitted again to today's points (and their σ'v0)
 * moves a parameter by more than 0.05 (in its own unit). Only a settled fit of today's inputs can say
 * `parameters`: while a new ask is pending, the answer on hand is an earlier input's and proves nothing.
 */
export function trendStaleness(
  trend: { includedPointIds: readonly string[], parameters: Readonly<Record<string, number>> },
  includedIds: readonly string[],
  fit: DisplayFitState | undefined,
  key: string,
): { ids: boolean, parameters: boolean } {
  const ids = !sameIds(trend.includedPointIds, includedIds)
  let parameters = false
  if (fit?.answer && !fit.pending && fit.key === key) {
    for (const [k, v] of Object.entries(trend.parameters)) {
      const w = fit.answer.parameters[k]
      if (w === undefined) continue
      if (Math.abs(v - w) > 1e-6 * Math.max(1, Math.abs(v)) + 0.05) parameters = true
    }
  }
  return { ids, parameters }
}

/** Knots of a first hand-drawn trend: the band's top and bottom at the median σ'p of its fitted points (or σ'v0 + 20 kPa). */
export function initialKnots(def: SiteModelDefinition, bandIndex: number, fitted: readonly PreconsolidationPointRow[], profile: readonly ProfilePoint[]): { depth: number, preconsolidation: number }[] {
  const b = stratumBounds(def)[bandIndex]
  if (!b) return []
  const s = def.strata[bandIndex]
  const at = (z: number) => {
    if (s?.trend && !s.trend.manual) {
      const e = stressAt(profile, z)?.effectiveStress
      try {
        const v = e !== undefined && e > 0 ? trendPreconsolidation(s, z, e) : null
        if (v !== null && Number.isFinite(v)) return v
      }
      catch {
        // fall through to the points
      }
    }
    const near = fitted.filter(p => Math.abs(p.depth - z) < 0.25 * (b.bottom - b.top)).map(p => p.preconsolidation).sort((x, y) => x - y)
    if (near.length) return near[Math.floor(near.length / 2)]!
    return (stressAt(profile, z)?.effectiveStress ?? 0) + 20
  }
  const top = Math.round((b.top + 0.01) * 1000) / 1000
  const bottom = Math.round((b.bottom - 0.01) * 1000) / 1000
  return [{ depth: top, preconsolidation: Math.round(at(top)) }, { depth: bottom, preconsolidation: Math.round(at(bottom)) }]
}
