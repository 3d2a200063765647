import type { RunGridResult } from '../types/settlement-runs'

/**
 * Settlement along a straight section line drawn over a run's grid: values read from the grid by
 * bilinear interpolation between its four surrounding nodes (common practice for a regular grid).
 * Pure; plan coordinates in m (site grid), settlement in m.
 */
export interface SectionSample {
  /** Distance along the section from its start, m. */
  chainage: number
  x: number
  y: number
  /** Settlement, m; null outside the grid. */
  settlement: number | null
}

export interface SectionSummary {
  length: number
  samples: SectionSample[]
  /** Largest settlement along the section and where (null when the section misses the grid). */
  max: SectionSample | null
  min: SectionSample | null
  /** Largest slope of settlement along the section between successive samples (m per m). */
  maxSlope: number
}

/** Index i with axis[i] ≤ v ≤ axis[i + 1] on an ascending axis, or -1 outside it. */
function bracket(axis: readonly number[], v: number): number {
  const n = axis.length
  const first = axis[0]
  const last = axis[n - 1]
  if (n < 2 || first === undefined || last === undefined || v < first - 1e-9 || v > last + 1e-9) return -1
  let lo = 0
  let hi = n - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if ((axis[mid] ?? Infinity) <= v) lo = mid
    else hi = mid
  }
  return lo
}

/** Settlement at plan point (x, y) by bilinear interpolation on the grid, or null outside it. */
export function gridValueAt(grid: Pick<RunGridResult, 'xs' | 'ys' | 'settlement'>, x: number, y: number): number | null {
  const { xs, ys, settlement } = grid
  const i = bracket(xs, x)
  const j = bracket(ys, y)
  if (i < 0 || j < 0) return null
  const x0 = xs[i]
  const x1 = xs[i + 1]
  const y0 = ys[j]
  const y1 = ys[j + 1]
  const s00 = settlement[j]?.[i]
  const s10 = settlement[j]?.[i + 1]
  const s01 = settlement[j + 1]?.[i]
  const s11 = settlement[j + 1]?.[i + 1]
  if (x0 === undefined || x1 === undefined || y0 === undefined || y1 === undefined) return null
  if (s00 === undefined || s10 === undefined || s01 === undefined || s11 === undefined) return null
  const tx = Math.min(1, Math.max(0, (x - x0) / (x1 - x0)))
  const ty = Math.min(1, Math.max(0, (y - y0) / (y1 - y0)))
  return (1 - ty) * ((1 - tx) * s00 + tx * s10) + ty * ((1 - tx) * s01 + tx * s11)
}

/** Samples settlement along the segment a → b at `count` evenly spaced points (ends included). */
export function sectionAlong(
  grid: Pick<RunGridResult, 'xs' | 'ys' | 'settlement'>,
  a: { x: number, y: number },
  b: { x: number, y: number },
  count = 101,
): SectionSummary {
  const n = Math.max(2, Math.min(2001, Math.round(count)))
  const length = Math.hypot(b.x - a.x, b.y - a.y)
  const samples: SectionSample[] = []
  for (let k = 0; k < n; k++) {
    const t = k / (n - 1)
    const x = a.x + t * (b.x - a.x)
    const y = a.y + t * (b.y - a.y)
    samples.push({ chainage: t * length, x, y, settlement: gridValueAt(grid, x, y) })
  }
  let max: SectionSample | null = null
  let min: SectionSample | null = null
  let maxSlope = 0
  let prev: { chainage: number, settlement: number } | null = null
  for (const s of samples) {
    const v = s.settlement
    if (v === null) {
      prev = null
      continue
    }
    if (!max || v > (max.settlement ?? -Infinity)) max = s
    if (!min || v < (min.settlement ?? Infinity)) min = s
    if (prev && s.chainage > prev.chainage) maxSlope = Math.max(maxSlope, Math.abs(v - prev.settlement) / (s.chainage - prev.chainage))
    prev = { chainage: s.chainage, settlement: v }
  }
  return { length, samples, max, min, maxSlope }
}

/** A first section line across the grid: through its middle along the longer side, at 10 % in from the edges. */
export function defaultSection(grid: Pick<RunGridResult, 'xs' | 'ys'>): { a: { x: number, y: number }, b: { x: number, y: number } } {
  const x0 = grid.xs[0] ?? 0
  const x1 = grid.xs[grid.xs.length - 1] ?? 0
  const y0 = grid.ys[0] ?? 0
  const y1 = grid.ys[grid.ys.length - 1] ?? 0
  const cx = (x0 + x1) / 2
  const cy = (y0 + y1) / 2
  if (x1 - x0 >= y1 - y0) {
    const m = (x1 - x0) * 0.1
    return { a: { x: x0 + m, y: cy }, b: { x: x1 - m, y: cy } }
  }
  const m = (y1 - y0) * 0.1
  return { a: { x: cx, y: y0 + m }, b: { x: cx, y: y1 - m } }
}
