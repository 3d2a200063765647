import { GeotechError } from './errors'

/**
 * Time rate of 1-D primary consolidation (Terzaghi 1925) and secondary
 * compression after it. Units: cv in m²/year, t in years, lengths in m.
 */

/** Which faces of a layer drain: both, or only the top or the bottom. */
export type Drainage = 'double' | 'top' | 'bottom'

/** Terms smaller than this end the series (U is then exact to ~1e-12). */
const SERIES_TOLERANCE = 1e-12

/**
 * Below this Tv the series needs hundreds of terms; the short-time solution
 * U = √(4Tv/π) is used instead. Its error is of order exp(−1/Tv), i.e. nil
 * at Tv = 1e-4 (Terzaghi 1925; any consolidation text).
 */
const SMALL_TV = 1e-4

function requireFinite(value: number, code: string, what: string): void {
  if (!Number.isFinite(value)) {
    throw new GeotechError(code, `${what} must be a finite number (got ${String(value)}).`)
  }
}

/**
 * Average degree of consolidation U(Tv) for a uniform initial excess pore
 * pressure (Terzaghi 1925): U = 1 − Σ 2/M² · exp(−M²Tv), M = π(2m + 1)/2,
 * summed until a term is below 1e-12; √(4Tv/π) below Tv = 1e-4; U(0) = 0.
 */
export function degreeOfConsolidation(tv: number): number {
  requireFinite(tv, 'time-factor-invalid', 'The time factor Tv')
  if (tv < 0) throw new GeotechError('time-factor-negative', `The time factor Tv is ${tv}; it must be ≥ 0.`)
  if (tv === 0) return 0
  if (tv < SMALL_TV) return Math.sqrt((4 * tv) / Math.PI)
  let sum = 0
  for (let m = 0; ; m++) {
    const M = (Math.PI * (2 * m + 1)) / 2
    const M2 = M * M
    const term = (2 / M2) * Math.exp(-M2 * tv)
    sum += term
    if (term < SERIES_TOLERANCE) break
  }
  return 1 - sum
}

/**
 * Tv for a given average degree U (0 ≤ U < 1): the inverse of
 * `degreeOfConsolidation`, by bisection (U is strictly increasing in Tv).
 * U = 1 needs infinite time and throws.
 */
export function timeFactorForDegree(u: number): number {
  requireFinite(u, 'degree-invalid', 'The degree of consolidation U')
  if (u < 0 || u >= 1) {
    throw new GeotechError('degree-out-of-range', `The degree of consolidation U is ${u}; it must be in [0, 1).`)
  }
  if (u === 0) return 0
  if (u <= degreeOfConsolidation(SMALL_TV)) return (Math.PI * u * u) / 4
  let lo = SMALL_TV
  let hi = 1
  while (degreeOfConsolidation(hi) < u) {
    lo = hi
    hi *= 2
  }
  for (let i = 0; i < 200 && hi - lo > 1e-15 * hi; i++) {
    const mid = 0.5 * (lo + hi)
    if (degreeOfConsolidation(mid) < u) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

/** Tv = cv·t/Hdr² (Terzaghi 1925). cv in m²/yr, t in years, Hdr in m. */
export function timeFactor(cv: number, t: number, hdr: number): number {
  requireFinite(cv, 'cv-invalid', 'The coefficient of consolidation cv')
  requireFinite(t, 'time-invalid', 'The time')
  requireFinite(hdr, 'drainage-path-invalid', 'The drainage path')
  if (cv <= 0) throw new GeotechError('cv-not-positive', `The coefficient of consolidation cv is ${cv} m²/yr; it must be positive.`)
  if (t < 0) throw new GeotechError('time-negative', `The time ${t} years is negative.`)
  if (hdr <= 0) throw new GeotechError('drainage-path-not-positive', `The drainage path is ${hdr} m; it must be positive.`)
  return (cv * t) / (hdr * hdr)
}

/** Longest drainage path: half the thickness when both faces drain, the whole thickness when one does. */
export function drainagePath(thickness: number, drainage: Drainage = 'double'): number {
  requireFinite(thickness, 'layer-thickness-invalid', 'The layer thickness')
  if (thickness <= 0) throw new GeotechError('layer-thickness-not-positive', `The layer thickness is ${thickness} m; it must be positive.`)
  if (drainage === 'double') return thickness / 2
  if (drainage === 'top' || drainage === 'bottom') return thickness
  throw new GeotechError('drainage-invalid', `Unknown drainage "${String(drainage)}"; use double, top or bottom.`)
}

/** Time (years) to reach average degree U: t = Tv(U)·Hdr²/cv. */
export function timeForDegree(u: number, cv: number, hdr: number): number {
  const tv = timeFactorForDegree(u)
  timeFactor(cv, 0, hdr)
  return (tv * hdr * hdr) / cv
}

export interface SecondaryCompressionInput {
  /** Secondary compression index Cα (Δe per log10 cycle of time), ≥ 0. */
  calpha: number
  /** Void ratio at the end of primary consolidation, > 0. */
  ep: number
  /** Layer thickness, m. */
  thickness: number
  /** Time at the end of primary consolidation, years (> 0). */
  tp: number
  /** Time of interest, years. */
  t: number
}

/**
 * Secondary compression after primary: Δh = Cα/(1 + ep) · h · log10(t/tp)
 * (Mesri 1973, common practice); 0 for t ≤ tp, since it starts after primary.
 */
export function secondaryCompression(input: SecondaryCompressionInput): number {
  const { calpha, ep, thickness, tp, t } = input
  requireFinite(calpha, 'calpha-invalid', 'Cα')
  requireFinite(ep, 'void-ratio-invalid', 'The void ratio ep')
  requireFinite(thickness, 'layer-thickness-invalid', 'The layer thickness')
  requireFinite(tp, 'time-invalid', 'The end-of-primary time tp')
  requireFinite(t, 'time-invalid', 'The time t')
  if (calpha < 0) throw new GeotechError('calpha-negative', `Cα is ${calpha}; it must be ≥ 0.`)
  if (ep <= 0) throw new GeotechError('void-ratio-not-positive', `The void ratio at the end of primary is ${ep}; it must be positive.`)
  if (thickness <= 0) throw new GeotechError('layer-thickness-not-positive', `The layer thickness is ${thickness} m; it must be positive.`)
  if (tp <= 0) throw new GeotechError('time-not-positive', `The end-of-primary time is ${tp} years; it must be positive.`)
  if (t < 0) throw new GeotechError('time-negative', `The time ${t} years is negative.`)
  if (t <= tp) return 0
  return (calpha / (1 + ep)) * thickness * Math.log10(t / tp)
}

/** One layer as the time rate sees it: thickness (m), cv (m²/year), drained faces, and its drainage group. */
export interface ConsolidatingLayer {
  thickness: number
  cv?: number
  drainage?: Drainage
  /** Consecutive layers with the same group consolidate as one layer (a stratum cut into slices). */
  drainageGroup?: string
}

/** A run of consecutive layers that consolidates as one: `members` index the input array. */
export interface ConsolidationUnit {
  members: number[]
  thickness: number
  /** Thickness-weighted harmonic mean of the members' cv (undefined when any member lacks cv). */
  cv?: number
  drainage: Drainage
  /** Longest drainage path of the whole unit, m. */
  hdr: number
  /** Members whose drainage differs from the unit's (the first member's). */
  mixedDrainage: boolean
}

/**
 * Groups consecutive layers with the same `drainageGroup` into one consolidating layer
 * (each layer without a group is a unit of its own). A stratum the model cuts into
 * slices (for a depth trend, or at a σ'p breakpoint) is still one clay layer whose pore
 * water drains to its own top and bottom: the drainage path is that of the whole
 * stratum, never of a slice (Terzaghi 1925: Hdr is set by the drained faces).
 *
 * The unit's cv is the thickness-weighted harmonic mean, H / Σ(hᵢ/cvᵢ): cv = k/(mv·γw),
 * and vertical flow across layers in series takes the harmonic mean of k (Darcy's law
 * for layers in series; e.g. Freeze & Cherry 1979, §2.4); with mv alike across the
 * slices of one stratum, cv averages the same way. The harmonic mean is governed by the
 * slowest slice, the safe side for t90; for a constant cv every mean gives cv exactly.
 * Applying it to cv is common practice rather than a single published rule.
 * The unit's drainage is its first member's (slices of one stratum share it).
 */
export function consolidationUnits(layers: readonly ConsolidatingLayer[]): ConsolidationUnit[] {
  const units: ConsolidationUnit[] = []
  let current: { group: string, unit: ConsolidationUnit } | null = null
  layers.forEach((layer, i) => {
    const group = layer.drainageGroup
    if (current && group !== undefined && group === current.group) {
      current.unit.members.push(i)
      if ((layer.drainage ?? 'double') !== current.unit.drainage) current.unit.mixedDrainage = true
      return
    }
    const unit: ConsolidationUnit = { members: [i], thickness: 0, drainage: layer.drainage ?? 'double', hdr: 0, mixedDrainage: false }
    units.push(unit)
    current = group === undefined ? null : { group, unit }
  })
  for (const unit of units) {
    let thickness = 0
    let resistance = 0
    let timed = true
    for (const i of unit.members) {
      const l = layers[i]!
      thickness += l.thickness
      if (l.cv === undefined || !(l.cv > 0)) timed = false
      else resistance += l.thickness / l.cv
    }
    unit.thickness = thickness
    if (timed && unit.members.length === 1) unit.cv = layers[unit.members[0]!]!.cv
    else if (timed) unit.cv = thickness / resistance
    unit.hdr = thickness > 0 ? drainagePath(thickness, unit.drainage) : 0
  }
  return units
}
