import { footprintExtent, type PlanLoad } from '../geotech/plan-loads'
import type { RunGrid } from '../schemas/settlement-runs'
import type { RunGridPair } from '../types/settlement-runs'

/** The grid's columns and rows: the loads' footprints (`footprintExtent`) and the margin, at the spacing. */
export function gridAxes(loads: readonly PlanLoad[], grid: RunGrid): { xs: number[], ys: number[] } | null {
  const box = footprintExtent(loads)
  if (!box || !(grid.spacing > 0) || !(grid.margin >= 0)) return null
  const axis = (a: number, b: number) => {
    const n = Math.floor((b - a + 2 * grid.margin) / grid.spacing + 1e-9)
    return Array.from({ length: n + 1 }, (_, i) => a - grid.margin + i * grid.spacing)
  }
  return { xs: axis(box.x0, box.x1), ys: axis(box.y0, box.y1) }
}

export interface GridDistortion {
  maxDifferential: number
  maxAngularDistortion: number
  worstDifferential: RunGridPair | null
  worstAngularDistortion: RunGridPair | null
}

/**
 * Differential settlement and angular distortion between neighbouring grid points: along x,
 * along y and along both diagonals. Angular distortion β = differential / distance between
 * the two points (Skempton & MacDonald 1956's relative rotation, taken between neighbours;
 * common practice for a grid). `settlement[j][i]` is at (xs[i], ys[j]).
 */
export function gridDistortion(xs: readonly number[], ys: readonly number[], settlement: readonly (readonly number[])[]): GridDistortion {
  const out: GridDistortion = { maxDifferential: 0, maxAngularDistortion: 0, worstDifferential: null, worstAngularDistortion: null }
  const visit = (i: number, j: number, k: number, l: number) => {
    if (k < 0 || k >= xs.length || l >= ys.length) return
    const a = settlement[j]![i]!
    const b = settlement[l]![k]!
    const diff = Math.abs(a - b)
    const dist = Math.hypot(xs[k]! - xs[i]!, ys[l]! - ys[j]!)
    const beta = diff / dist
    const pa = { x: xs[i]!, y: ys[j]! }
    const pb = { x: xs[k]!, y: ys[l]! }
    if (diff > out.maxDifferential || out.worstDifferential === null) {
      out.maxDifferential = diff
      out.worstDifferential = { a: pa, b: pb, value: diff }
    }
    if (beta > out.maxAngularDistortion || out.worstAngularDistortion === null) {
      out.maxAngularDistortion = beta
      out.worstAngularDistortion = { a: pa, b: pb, value: beta }
    }
  }
  for (let j = 0; j < ys.length; j++) {
    for (let i = 0; i < xs.length; i++) {
      visit(i, j, i + 1, j)
      visit(i, j, i, j + 1)
      visit(i, j, i + 1, j + 1)
      visit(i, j, i - 1, j + 1)
    }
  }
  return out
}
