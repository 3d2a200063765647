import { GeotechError } from '../geotech/errors'
import { computeSettlement, type SettlementInput } from '../geotech/settlement'

/**
 * The per-grid-point settlement kernel of a run. Everything that does not depend on the
 * plan point — the sublayers, σ'v0 and σ'p at each mid-depth (σ'p raised to σ'v0 where it
 * was lower), Cc, Cr and h/(1 + e0) — is taken once from the engine itself (a
 * `computeSettlement` with no load), so the kernel cannot drift from it; per point only Δσ
 * at each mid-depth and the NC / OC / OC-NC log formulas remain (domain §3, Terzaghi & Peck):
 *   NC:     Δe = Cc·log10(σ'vf/σ'v0)
 *   OC:     Δe = Cr·log10(σ'vf/σ'v0)            (σ'vf ≤ σ'p, and rebound)
 *   OC-NC:  Δe = Cr·log10(σ'p/σ'v0) + Cc·log10(σ'vf/σ'p)
 *   Δh = Δe/(1 + e0)·h
 * The sums are taken in the engine's order (per layer, then over layers), so a grid point
 * equals `computeSettlement(…, { convergence: false }).settlement` to the last bit.
 */
export interface SettlementKernel {
  /** Sublayers in all. */
  count: number
  depth: Float64Array
  effectiveStress: Float64Array
  preconsolidation: Float64Array
  cc: Float64Array
  cr: Float64Array
  /** h/(1 + e0), m. */
  thicknessOverOnePlusE0: Float64Array
  /** The engine's per-layer factors: the row's h and 1 + e0 (the sum uses (Δe/(1 + e0))·h as the engine does). */
  onePlusE0: Float64Array
  thickness: Float64Array
  /** Sublayer ranges of each compressible layer: [start, end) into the arrays. */
  layerStart: Int32Array
  layerEnd: Int32Array
  /** Layer names, for messages. */
  layerName: string[]
}

/**
 * Builds the kernel for the profile in `base` (layers, groundwater, sublayering). Throws the
 * engine's GeotechError for a profile it refuses (σ'p ≤ 0, missing parameters …).
 */
export function buildSettlementKernel(base: Omit<SettlementInput, 'load' | 'stressIncrease' | 'time' | 'designLife'>): SettlementKernel {
  const r = computeSettlement({ ...base, load: { type: 'uniform', pressure: 0 }, stressIncrease: () => 0 }, { convergence: false })
  const rows = r.sublayers
  const n = rows.length
  const k: SettlementKernel = {
    count: n,
    depth: new Float64Array(n),
    effectiveStress: new Float64Array(n),
    preconsolidation: new Float64Array(n),
    cc: new Float64Array(n),
    cr: new Float64Array(n),
    thicknessOverOnePlusE0: new Float64Array(n),
    onePlusE0: new Float64Array(n),
    thickness: new Float64Array(n),
    layerStart: new Int32Array(0),
    layerEnd: new Int32Array(0),
    layerName: [],
  }
  // Rows come in the compressible layers' order, each layer's rows together: a row belongs to
  // the layer whose bottom lies below its mid-depth.
  const starts: number[] = []
  const ends: number[] = []
  let row = 0
  let bottom = 0
  for (const layer of base.layers) {
    bottom += layer.thickness
    if (!layer.compressible) continue
    const start = row
    while (row < n && rows[row]!.depth < bottom) {
      const s = rows[row]!
      k.depth[row] = s.depth
      k.effectiveStress[row] = s.effectiveStress
      k.preconsolidation[row] = s.preconsolidation
      k.cc[row] = layer.cc!
      k.cr[row] = layer.cr!
      k.onePlusE0[row] = 1 + layer.e0!
      k.thickness[row] = s.thickness
      k.thicknessOverOnePlusE0[row] = s.thickness / (1 + layer.e0!)
      row++
    }
    starts.push(start)
    ends.push(row)
    k.layerName.push(layer.name)
  }
  if (row !== n) throw new GeotechError('kernel-mismatch', 'The sublayers could not be matched to their layers.')
  k.layerStart = Int32Array.from(starts)
  k.layerEnd = Int32Array.from(ends)
  return k
}

/**
 * Total primary settlement (m) under Δσ(z) = `loadAt(z)` (kPa). `scratch`, when given
 * (length ≥ count), receives Δσ at each sublayer. Throws like the engine when the load
 * brings σ'v to zero or below.
 */
export function kernelSettlement(k: SettlementKernel, loadAt: (depth: number) => number): number {
  const { depth, effectiveStress, preconsolidation, cc, cr, onePlusE0, thickness, layerStart, layerEnd } = k
  let total = 0
  for (let j = 0; j < layerStart.length; j++) {
    let sum = 0
    for (let i = layerStart[j]!; i < layerEnd[j]!; i++) {
      const s0 = effectiveStress[i]!
      const sp = preconsolidation[i]!
      const sf = s0 + loadAt(depth[i]!)
      if (!(sf > 0)) {
        throw new GeotechError('final-effective-stress-not-positive', `Layer "${k.layerName[j]}": the load brings σ'v to ${sf.toFixed(1)} kPa at ${Number(depth[i]!.toFixed(3))} m; it must stay positive.`, { depth: depth[i]! })
      }
      let de: number
      if (sf < s0) de = cr[i]! * Math.log10(sf / s0)
      else if (sp <= s0) de = cc[i]! * Math.log10(sf / s0)
      else if (sf <= sp) de = cr[i]! * Math.log10(sf / s0)
      else de = cr[i]! * Math.log10(sp / s0) + cc[i]! * Math.log10(sf / sp)
      sum += (de / onePlusE0[i]!) * thickness[i]!
    }
    total += sum
  }
  return total
}
