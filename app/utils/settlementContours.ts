import * as d3 from 'd3'
import type { RunGridResult } from '#shared/types/settlement-runs'

/**
 * Settlement contours over a run's grid (d3-contour marching squares on the row-major grid) and
 * Pastload's own ramp for them: pale sand for little settlement through ochre to deep tide blue for
 * the most. Values in m; the bands' thresholds are round numbers of the display unit.
 */
export interface ContourBand {
  /** Lower bound of the band, m. */
  value: number
  /** Path in grid index space (x = column index, y = row index); map with `gridToPlan`. */
  geometry: d3.ContourMultiPolygon
  colour: string
}

const RAMP = ['#f6efdc', '#efd394', '#dca04a', '#b86d2c', '#7d5a4a', '#3f5f6d', '#1c4450', '#0c242b']

/** A colour for a fraction 0–1 of the largest settlement. */
export function settlementColour(t: number): string {
  return d3.interpolateRgbBasis(RAMP)(Math.min(1, Math.max(0, t)))
}

/**
 * Round thresholds (m) from 0 to the grid's largest settlement, about `count` of them, placed at
 * round values of the display unit (`factor` display units per m: 1000 for mm).
 */
export function contourThresholds(max: number, factor: number, count = 8): number[] {
  if (!(max > 0)) return []
  const shown = d3.ticks(0, max * factor, count)
  return shown.filter(t => t > 0 && t < max * factor).map(t => t / factor)
}

/** The contour bands of a grid at `thresholds` (m), coloured by the ramp. */
export function settlementBands(grid: Pick<RunGridResult, 'xs' | 'ys' | 'settlement'>, thresholds: number[]): ContourBand[] {
  const nx = grid.xs.length
  const ny = grid.ys.length
  if (nx < 2 || ny < 2) return []
  const values = new Array<number>(nx * ny)
  let max = 0
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const v = grid.settlement[j]?.[i] ?? 0
      values[j * nx + i] = v
      if (v > max) max = v
    }
  }
  const levels = [Math.min(0, ...values) - 1e-12, ...thresholds]
  const gen = d3.contours().size([nx, ny]).thresholds(levels)
  return gen(values).map(g => ({ value: g.value, geometry: g, colour: settlementColour(max > 0 ? Math.max(0, g.value) / max : 0) }))
}

/**
 * d3-contour puts grid node (i, j) at (i + 0.5, j + 0.5) of its index space; this maps an index-space
 * point to plan metres by linear interpolation along the (evenly spaced) axes.
 */
export function gridToPlan(grid: Pick<RunGridResult, 'xs' | 'ys'>): (ix: number, iy: number) => { x: number, y: number } {
  const { xs, ys } = grid
  const dx = xs.length > 1 ? (xs[xs.length - 1]! - xs[0]!) / (xs.length - 1) : 1
  const dy = ys.length > 1 ? (ys[ys.length - 1]! - ys[0]!) / (ys.length - 1) : 1
  return (ix, iy) => ({ x: xs[0]! + (ix - 0.5) * dx, y: ys[0]! + (iy - 0.5) * dy })
}

/** SVG path data of a contour band drawn through a plan → screen mapping. */
export function bandPath(band: ContourBand, toPlan: (ix: number, iy: number) => { x: number, y: number }, toScreen: (p: { x: number, y: number }) => [number, number]): string {
  const transform = d3.geoTransform({
    point(ix: number, iy: number) {
      const [sx, sy] = toScreen(toPlan(ix, iy))
      this.stream.point(sx, sy)
    },
  })
  return d3.geoPath(transform)(band.geometry) ?? ''
}
