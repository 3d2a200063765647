import * as d3 from 'd3'
import { loadFootprint, type PlanLoad } from '../geotech/plan-loads'
import type { RunLoad } from '../schemas/settlement-runs'
import type { RunGridResult, RunPointResult } from '../types/settlement-runs'
import { convert, unitLabel, type UnitSystem } from '../units'
import { settlementFactor, settlementUnitLabel } from './settlement-units'
import { el, n, scaleTicks, svgDocument, text, type AxisTick } from './svg'

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
  const x0 = xs[0] ?? 0
  const y0 = ys[0] ?? 0
  const dx = xs.length > 1 ? ((xs[xs.length - 1] ?? x0) - x0) / (xs.length - 1) : 1
  const dy = ys.length > 1 ? ((ys[ys.length - 1] ?? y0) - y0) / (ys.length - 1) : 1
  return (ix, iy) => ({ x: x0 + (ix - 0.5) * dx, y: y0 + (iy - 0.5) * dy })
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

/** A load's outline on the plan (toe), and an embankment's crest inside it (plan metres). */
export function loadOutlines(l: RunLoad): { x: number, y: number }[][] {
  let plan: PlanLoad
  switch (l.type) {
    case 'uniform': return []
    case 'rectangle': plan = { type: 'rectangle', x: l.x, y: l.y, width: l.width, length: l.length, rotation: l.rotation, pressure: 0 }; break
    case 'circle': plan = { type: 'circle', x: l.x, y: l.y, radius: l.radius, pressure: 0 }; break
    case 'embankment': {
      const crest = loadFootprint({ type: 'rectangle', x: l.x, y: l.y, width: l.crestWidth, length: l.crestLength, rotation: l.rotation, pressure: 0 })
      return [loadFootprint(l) ?? [], ...(l.sideSlope > 0 && crest ? [crest] : [])]
    }
  }
  return [loadFootprint(plan) ?? []]
}

/** The loads' outlines drawn through a plan → screen mapping: toe rings, then crests (`crest`), labelled at the toe's top right. */
export function loadPaths(loads: RunLoad[], toScreen: (p: { x: number, y: number }) => [number, number]) {
  return loads.flatMap((l, i) => loadOutlines(l).map((ring, k) => {
    const pts = ring.map(toScreen)
    return {
      key: `${i}-${k}`,
      crest: k > 0,
      d: pts.length ? `M${pts.map(p => `${p[0].toFixed(1)},${p[1].toFixed(1)}`).join('L')}Z` : '',
      label: k === 0 ? (l.label ?? `Load ${i + 1}`) : '',
      at: pts.length ? { x: Math.max(...pts.map(p => p[0])), y: Math.min(...pts.map(p => p[1])) } : null,
      topLeft: pts.length ? { x: Math.min(...pts.map(p => p[0])), y: Math.min(...pts.map(p => p[1])) } : null,
    }
  }))
}

/** The bands' legend: colour and the range it stands for (m). */
export function bandLegend(bands: ContourBand[], thresholds: number[], max: number): { colour: string, from: number, to: number }[] {
  return bands.map((b, i) => ({ colour: b.colour, from: Math.max(0, b.value), to: thresholds[i] ?? max }))
}

export function gridMaximum(grid: Pick<RunGridResult, 'settlement'> | null | undefined): number {
  let m = 0
  for (const row of grid?.settlement ?? []) for (const v of row) if (v > m) m = v
  return m
}

export interface PlanSceneInput {
  grid: RunGridResult | null
  loads: RunLoad[]
  points: Pick<RunPointResult, 'label' | 'x' | 'y'>[]
  /** The largest settlement's place when it is on the grid (not a named point). */
  maximum: { x: number, y: number } | null
  unitSystem: UnitSystem
  width: number
  height: number
}

/**
 * The run's settlement on a plan drawn to one scale in x and y (north up): the bands clipped to the grid, the
 * loads' outlines, the named points and the largest settlement, with easting and northing ticks. The PDF
 * report's map; the run page draws the same bands and outlines over the site plan (`SettlementContourOverlay`).
 */
export function settlementPlanSvg(input: PlanSceneInput): string {
  const { grid, width, height, unitSystem } = input
  const M = { left: 46, right: 12, top: 10, bottom: 52 }
  const xs = [...(grid?.xs ?? []), ...input.points.map(p => p.x), ...input.loads.flatMap(l => loadOutlines(l).flat().map(p => p.x))]
  const ys = [...(grid?.ys ?? []), ...input.points.map(p => p.y), ...input.loads.flatMap(l => loadOutlines(l).flat().map(p => p.y))]
  const minX = xs.length ? Math.min(...xs) : 0
  const maxX = xs.length ? Math.max(...xs) : 1
  const minY = ys.length ? Math.min(...ys) : 0
  const maxY = ys.length ? Math.max(...ys) : 1
  const pad = 0.06 * Math.max(maxX - minX, maxY - minY, 1)
  const innerW = width - M.left - M.right
  const innerH = height - M.top - M.bottom
  const scale = Math.min(innerW / (maxX - minX + 2 * pad), innerH / (maxY - minY + 2 * pad))
  const cx = (minX + maxX) / 2
  const cy = (minY + maxY) / 2
  const sx = (x: number) => M.left + innerW / 2 + (x - cx) * scale
  const sy = (y: number) => M.top + innerH / 2 - (y - cy) * scale
  const toScreen = (p: { x: number, y: number }): [number, number] => [sx(p.x), sy(p.y)]
  const p: string[] = []
  p.push(el('rect', { x: M.left, y: M.top, width: innerW, height: innerH, fill: '#fbfaf7', stroke: '#ada18b', 'stroke-width': 0.6 }))

  // Easting / northing ticks in the project's length unit.
  const lf = convert(1, 'length', 'SI', unitSystem)
  const xAxis = d3.scaleLinear().domain([cx - innerW / 2 / scale, cx + innerW / 2 / scale]).range([M.left, M.left + innerW])
  const yAxis = d3.scaleLinear().domain([cy - innerH / 2 / scale, cy + innerH / 2 / scale]).range([M.top + innerH, M.top])
  const xt: AxisTick[] = scaleTicks(xAxis, lf, 6)
  const yt: AxisTick[] = scaleTicks(yAxis, lf, 6)
  for (const t of xt) {
    p.push(el('line', { x1: t.at, x2: t.at, y1: M.top, y2: M.top + innerH, stroke: '#efede7', 'stroke-width': 0.6 }))
    p.push(text(t.at, M.top + innerH + 11, t.label, { 'text-anchor': 'middle', 'font-size': 8.5, fill: '#48423a' }))
  }
  for (const t of yt) {
    p.push(el('line', { x1: M.left, x2: M.left + innerW, y1: t.at, y2: t.at, stroke: '#efede7', 'stroke-width': 0.6 }))
    p.push(text(M.left - 4, t.at + 3, t.label, { 'text-anchor': 'end', 'font-size': 8.5, fill: '#48423a' }))
  }
  const u = unitLabel('length', unitSystem)
  p.push(text(M.left + innerW / 2, M.top + innerH + 23, `Easting (${u})`, { 'text-anchor': 'middle', 'font-size': 9, 'font-weight': 'bold', fill: '#48423a' }))
  p.push(text(0, 0, `Northing (${u})`, { transform: `translate(10,${M.top + innerH / 2}) rotate(-90)`, 'text-anchor': 'middle', 'font-size': 9, 'font-weight': 'bold', fill: '#48423a' }))

  const sF = settlementFactor(unitSystem)
  let legend: { colour: string, from: number, to: number }[] = []
  if (grid && grid.xs.length > 1 && grid.ys.length > 1) {
    const max = gridMaximum(grid)
    const thresholds = contourThresholds(max, sF, 8)
    const bands = settlementBands(grid, thresholds)
    legend = bandLegend(bands, thresholds, max)
    const toPlan = gridToPlan(grid)
    const gx0 = sx(grid.xs[0] ?? 0)
    const gx1 = sx(grid.xs[grid.xs.length - 1] ?? 0)
    const gy0 = sy(grid.ys[grid.ys.length - 1] ?? 0)
    const gy1 = sy(grid.ys[0] ?? 0)
    p.push(`<defs><clipPath id="plan-grid">${el('rect', { x: gx0, y: gy0, width: gx1 - gx0, height: gy1 - gy0 })}</clipPath></defs>`)
    p.push(el('g', { 'clip-path': 'url(#plan-grid)' }, bands.map(b => el('path', { d: bandPath(b, toPlan, toScreen), fill: b.colour, 'fill-opacity': 0.82, stroke: '#564e44', 'stroke-width': 0.5, 'stroke-opacity': 0.55 })).join('')))
    p.push(el('rect', { x: gx0, y: gy0, width: gx1 - gx0, height: gy1 - gy0, fill: 'none', stroke: '#7f7360', 'stroke-width': 0.8, 'stroke-dasharray': '2 3' }))
  }
  for (const l of loadPaths(input.loads, toScreen)) {
    if (!l.d) continue
    if (l.crest) p.push(el('path', { d: l.d, fill: 'none', stroke: '#ffffff', 'stroke-width': 3, 'stroke-opacity': 0.75 }))
    p.push(el('path', { d: l.d, fill: 'none', stroke: l.crest ? '#8a481a' : '#27231f', 'stroke-width': l.crest ? 1.2 : 1.6, 'stroke-dasharray': l.crest ? '5 3' : undefined }))
    // Inside the outline's top-left corner, clear of the named points' labels (which sit up and right).
    if (l.label && l.topLeft) {
      p.push(text(l.topLeft.x + 4, l.topLeft.y + 11, l.label, { 'font-size': 9, 'font-style': 'italic', fill: '#ffffff', stroke: '#ffffff', 'stroke-width': 2.6, 'stroke-linejoin': 'round' }))
      p.push(text(l.topLeft.x + 4, l.topLeft.y + 11, l.label, { 'font-size': 9, 'font-style': 'italic', fill: '#27231f' }))
    }
  }
  for (const pt of input.points) {
    const [x, y] = toScreen(pt)
    // A white halo under the mark and its label keeps both legible on the darkest band (drawn twice: PDF
    // renderers ignore paint-order).
    p.push(el('path', { d: `M${n(x - 5)},${n(y)}H${n(x + 5)}M${n(x)},${n(y - 5)}V${n(y + 5)}`, stroke: '#ffffff', 'stroke-width': 3.6, 'stroke-linecap': 'round' }))
    p.push(el('path', { d: `M${n(x - 5)},${n(y)}H${n(x + 5)}M${n(x)},${n(y - 5)}V${n(y + 5)}`, stroke: '#0c242b', 'stroke-width': 1.6 }))
    p.push(el('circle', { cx: x, cy: y, r: 2.8, fill: '#ffffff', stroke: '#0c242b', 'stroke-width': 1.2 }))
    // Label right of the point, or left of it near the plan's right edge (about 5 px a character at 9 px).
    const flip = x + 6 + 5 * pt.label.length > M.left + innerW
    const at = { 'font-size': 9, 'font-weight': 'bold', 'text-anchor': flip ? 'end' : undefined }
    p.push(text(flip ? x - 6 : x + 6, y - 5, pt.label, { ...at, fill: '#ffffff', stroke: '#ffffff', 'stroke-width': 2.6, 'stroke-linejoin': 'round' }))
    p.push(text(flip ? x - 6 : x + 6, y - 5, pt.label, { ...at, fill: '#0c242b' }))
  }
  if (input.maximum) {
    const [x, y] = toScreen(input.maximum)
    p.push(el('path', { d: `M${n(x)},${n(y - 7)}L${n(x + 6)},${n(y + 4)}H${n(x - 6)}Z`, fill: '#c0392b', stroke: '#ffffff', 'stroke-width': 1 }))
  }
  // Legend under the plan: the band ramp with its range, then the symbols.
  const ly = height - 16
  let lx = M.left
  if (legend.length) {
    p.push(text(lx, ly + 8, `Settlement (${settlementUnitLabel(unitSystem)})`, { 'font-size': 8.5, fill: '#27231f' }))
    lx += 82
    const digits = unitSystem === 'US' ? 1 : 0
    for (const b of legend) {
      p.push(el('rect', { x: lx, y: ly, width: 22, height: 10, fill: b.colour, stroke: '#ada18b', 'stroke-width': 0.4 }))
      p.push(text(lx, ly - 2, (b.from * sF).toFixed(digits), { 'text-anchor': 'middle', 'font-size': 7, fill: '#48423a' }))
      lx += 22
    }
    const top = legend[legend.length - 1]
    if (top) p.push(text(lx, ly - 2, (top.to * sF).toFixed(digits), { 'text-anchor': 'middle', 'font-size': 7, fill: '#48423a' }))
    lx += 14
  }
  p.push(el('rect', { x: lx, y: ly, width: 16, height: 9, fill: 'none', stroke: '#27231f', 'stroke-width': 1.4 }))
  p.push(text(lx + 20, ly + 8, 'load (toe)', { 'font-size': 8.5, fill: '#27231f' }))
  lx += 66
  p.push(el('circle', { cx: lx + 5, cy: ly + 5, r: 2.8, fill: '#ffffff', stroke: '#0c242b', 'stroke-width': 1.2 }))
  p.push(text(lx + 12, ly + 8, 'named point', { 'font-size': 8.5, fill: '#27231f' }))
  lx += 62
  if (input.maximum) {
    p.push(el('path', { d: `M${n(lx + 5)},${n(ly)}L${n(lx + 10)},${n(ly + 9)}H${n(lx)}Z`, fill: '#c0392b' }))
    p.push(text(lx + 14, ly + 8, 'largest settlement', { 'font-size': 8.5, fill: '#27231f' }))
  }
  return svgDocument(width, height, p.join(''))
}
