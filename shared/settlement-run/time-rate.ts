import { consolidationUnits, degreeOfConsolidation, secondaryCompression, timeFactorForDegree, type Drainage } from '../geotech/consolidation'
import type { RunTimeCurve } from '../types/settlement-runs'

/**
 * A run point's time–settlement curve. Primary: Terzaghi (1925), per consolidating unit
 * (a stratum's slices drain together, `consolidationUnits`), S(t) = Σ Uᵢ(Tvᵢ)·Sᵢ with
 * Tv = cv·t/Hdr². Secondary: after each layer's end of primary (U = 95 %, common practice,
 * as the engine takes it), Δh = Cα/(1 + ep)·h·log10(t/tp) (Mesri 1973; domain §3), with
 * ep = e0 − Δe of the layer's mean strain.
 */
export interface CurveLayer {
  /** The stratum the layer belongs to (curve rows are per stratum). */
  stratum: string
  /** Primary settlement of the layer, m. */
  settlement: number
  thickness: number
  e0: number
  cv?: number
  calpha?: number
  drainage?: Drainage
  drainageGroup?: string
}

/** Curve points (log-spaced). */
export const CURVE_POINTS = 81
/** The curve starts where the fastest unit reaches this Tv … */
const START_TV = 1e-4
/** … and ends where the slowest reaches this one (U > 99.99 %), or at the design life if later. */
const END_TV = 4
/** End of primary for secondary compression (common practice; the engine's value). */
const END_OF_PRIMARY_DEGREE = 0.95

/** Log-spaced times from a to b, n points, both ends included. */
export function logSpace(a: number, b: number, n: number): number[] {
  const la = Math.log10(a)
  const lb = Math.log10(b)
  return Array.from({ length: n }, (_, i) => (i === n - 1 ? b : 10 ** (la + ((lb - la) * i) / (n - 1))))
}

/**
 * The curve, or null when a compressible layer has no cv (no time rate) or there is no
 * settlement. `strata` gives the order of the per-stratum rows.
 */
export function timeCurve(layers: readonly CurveLayer[], strata: readonly string[], designLife: number): RunTimeCurve | null {
  if (layers.length === 0 || layers.some(l => l.cv === undefined)) return null
  const units = consolidationUnits(layers)
  if (units.some(u => u.cv === undefined || !(u.hdr > 0))) return null
  const scale = units.map(u => (u.hdr * u.hdr) / u.cv!)
  const t0 = START_TV * Math.min(...scale)
  const t1 = Math.max(END_TV * Math.max(...scale), designLife)
  const years = logSpace(t0, t1, CURVE_POINTS)
  const rows = strata.map(name => ({ name, settlement: new Array<number>(years.length).fill(0) }))
  const rowOf = new Map(rows.map(r => [r.name, r]))
  const primary = new Array<number>(years.length).fill(0)
  const secondary = new Array<number>(years.length).fill(0)
  const tv95 = timeFactorForDegree(END_OF_PRIMARY_DEGREE)
  units.forEach((unit, k) => {
    years.forEach((t, i) => {
      const u = degreeOfConsolidation(t / scale[k]!)
      for (const m of unit.members) {
        const l = layers[m]!
        const s = l.settlement * u
        primary[i] = primary[i]! + s
        const row = rowOf.get(l.stratum)
        if (row) row.settlement[i] = row.settlement[i]! + s
      }
    })
    const tp = tv95 * scale[k]!
    for (const m of unit.members) {
      const l = layers[m]!
      if (l.calpha === undefined || !(l.thickness > 0)) continue
      const ep = l.e0 - (l.settlement / l.thickness) * (1 + l.e0)
      if (!(ep > 0)) continue
      years.forEach((t, i) => {
        secondary[i] = secondary[i]! + secondaryCompression({ calpha: l.calpha!, ep, thickness: l.thickness, tp, t })
      })
    }
  })
  return { years, primary, secondary, total: primary.map((p, i) => p + secondary[i]!), layers: rows }
}
