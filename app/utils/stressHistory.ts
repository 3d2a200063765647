import type { FlagVerdict } from '#shared/review/flags'
import { PRECONSOLIDATION_SOURCES, type PreconsolidationSource } from '#shared/schemas/lab'
import type { ProfilePoint } from '#shared/types/calc'
import type { PreconsolidationPointRow } from '#shared/types/lab'
import type { ModelStratum, SiteModelDefinition } from '#shared/site-model/definition'
import { stratumBounds } from '#shared/site-model/definition'
import { trendPreconsolidation } from '#shared/site-model/convert'

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

export interface StressAt { totalStress: number, porePressure: number, effectiveStress: number }

/**
 * σv, u and σ'v0 at a depth by linear interpolation between the profile's
 * breakpoints — exact, since the profile is piecewise linear between them.
 * Null outside the profile.
 */
export function stressAt(profile: readonly ProfilePoint[], depth: number): StressAt | null {
  const n = profile.length
  if (!n || !(depth >= profile[0]!.depth) || depth > profile[n - 1]!.depth) return null
  let lo = 0
  let hi = n - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (profile[mid]!.depth <= depth) lo = mid
    else hi = mid
  }
  const a = profile[lo]!
  const b = profile[hi]!
  if (b.depth === a.depth) return { totalStress: a.totalStress, porePressure: a.porePressure, effectiveStress: a.effectiveStress }
  const t = (depth - a.depth) / (b.depth - a.depth)
  const lerp = (x: number, y: number) => x + (y - x) * t
  return { totalStress: lerp(a.totalStress, b.totalStress), porePressure: lerp(a.porePressure, b.porePressure), effectiveStress: lerp(a.effectiveStress, b.effectiveStress) }
}

/**
 * The band each point belongs to: the band of its logged stratum (the nearest by
 * depth when the model has that stratum twice), else the band at its depth.
 * −1 for a point below the model's base.
 */
export function assignBands(points: readonly PreconsolidationPointRow[], def: Pick<SiteModelDefinition, 'strata'>): Int32Array {
  const bounds = stratumBounds(def)
  const base = bounds.length ? bounds[bounds.length - 1]!.bottom : 0
  const byCode = new Map<string, number[]>()
  def.strata.forEach((s, i) => byCode.set(s.code, [...(byCode.get(s.code) ?? []), i]))
  const out = new Int32Array(points.length)
  points.forEach((p, k) => {
    const candidates = p.stratumCode ? byCode.get(p.stratumCode) : undefined
    if (candidates?.length) {
      let best = candidates[0]!
      let bestDistance = Infinity
      for (const i of candidates) {
        const b = bounds[i]!
        const d = p.depth < b.top ? b.top - p.depth : p.depth > b.bottom ? p.depth - b.bottom : 0
        if (d < bestDistance) { best = i; bestDistance = d }
      }
      out[k] = best
      return
    }
    if (p.depth > base) { out[k] = -1; return }
    const i = bounds.findIndex(b => p.depth >= b.top && p.depth < b.bottom)
    out[k] = i === -1 ? bounds.length - 1 : i
  })
  return out
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

export interface TrendSample { depth: number, effectiveStress: number, preconsolidation: number, ocr: number, pop: number }

/**
 * The band's trend sampled within the band only (never across a break): evenly
 * spaced depths plus the profile's breakpoints inside it, so a POP or OCR line
 * follows every kink of σ'v0.
 */
export function sampleTrend(def: SiteModelDefinition, bandIndex: number, profile: readonly ProfilePoint[], steps = 80): TrendSample[] {
  const s = def.strata[bandIndex]
  const b = stratumBounds(def)[bandIndex]
  if (!s?.trend || !b) return []
  const eps = 1e-6
  const depths = new Set<number>()
  for (let i = 0; i <= steps; i++) depths.add(b.top + eps + ((b.bottom - b.top - 2 * eps) * i) / steps)
  for (const p of profile) if (p.depth > b.top && p.depth < b.bottom) depths.add(p.depth)
  if (s.trend.manual) for (const k of s.trend.manual.knots) if (k.depth > b.top && k.depth < b.bottom) depths.add(k.depth)
  const bp = s.trend.parameters.breakpointDepth
  if (bp !== undefined && bp > b.top && bp < b.bottom) { depths.add(bp - eps); depths.add(bp + eps) }
  const out: TrendSample[] = []
  for (const z of [...depths].sort((x, y) => x - y)) {
    const e = stressAt(profile, z)?.effectiveStress
    if (e === undefined || !(e > 0)) continue
    let p: number | null = null
    try {
      p = trendPreconsolidation(s, z, e)
    }
    catch {
      p = null
    }
    if (p === null || !Number.isFinite(p)) continue
    out.push({ depth: z, effectiveStress: e, preconsolidation: p, ocr: p / e, pop: p - e })
  }
  return out
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
