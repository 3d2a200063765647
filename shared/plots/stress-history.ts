import type { ProfilePoint } from '../types/calc'
import { stratumBounds } from '../site-model/definition-plain'
import type { SiteModelDefinition } from '../site-model/definition'
import { trendPreconsolidation } from '../site-model/convert'

/**
 * The stress-history reading of a site model shared by the model canvas and the reports: σ'v0 at any
 * depth from a computed profile, and each stratum's trend sampled within it with its OCR and POP. Pure,
 * SI units.
 */

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

/**
 * The band each point belongs to: the band of its logged stratum (the nearest by
 * depth when the model has that stratum twice), else the band at its depth.
 * −1 for a point below the model's base.
 */
export function assignBands(points: readonly { depth: number, stratumCode: string | null }[], def: Pick<SiteModelDefinition, 'strata'>): Int32Array {
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
