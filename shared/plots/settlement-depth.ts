import * as d3 from 'd3'
import type { RunSublayerRow } from '../types/settlement-runs'
import { convert, unitLabel, type UnitSystem, type UsStressUnit } from '../units'
import { el, svgDocument, text, scaleTicks, type AxisTick } from './svg'

/**
 * A named point's stresses with depth (down): σ'v0 before loading, σ'vf after, σ'p before and after
 * (σ'p final = max(σ'p, σ'vf)) and Δσ, at each sublayer's mid-depth, with the strata named at their middle.
 * The run page (`SettlementDepthPlot.vue`, which adds zoom by giving `depthDomain`) and the PDF report
 * (`settlementDepthSvg`) draw the same scene.
 */

export interface DepthLine { key: string, label: string, colour: string, dash?: string, width: number, d: string }
export interface DepthStratum { name: string, yTop: number, yBottom: number }
export interface DepthPlotScene {
  width: number
  height: number
  margin: { left: number, right: number, top: number, bottom: number }
  lines: DepthLine[]
  strata: DepthStratum[]
  xTicks: AxisTick[]
  yTicks: AxisTick[]
  xLabel: string
  yLabel: string
  legendCols: number
}

type Row = Pick<RunSublayerRow, 'layer' | 'top' | 'bottom' | 'depth' | 'effectiveStress' | 'finalEffectiveStress' | 'preconsolidation' | 'finalPreconsolidation' | 'stressIncrease'>

const SERIES: { key: string, label: string, colour: string, dash?: string, width: number, value: (r: Row) => number }[] = [
  { key: 'v0', label: 'σ\'v0 before loading', colour: '#1f5261', width: 2, value: r => r.effectiveStress },
  { key: 'vf', label: 'σ\'vf after loading', colour: '#317d8c', dash: '6 3', width: 2, value: r => r.finalEffectiveStress },
  { key: 'p0', label: 'σ\'p initial', colour: '#c98024', width: 2, value: r => r.preconsolidation },
  { key: 'pf', label: 'σ\'p final', colour: '#8a481a', dash: '2 3', width: 2.2, value: r => r.finalPreconsolidation },
  { key: 'ds', label: 'Δσ from the loads', colour: '#7f7360', dash: '1 3', width: 1.6, value: r => r.stressIncrease },
]

export const DEPTH_PLOT_MARGIN = { left: 52, right: 12, top: 40, bottom: 66 }

/** The full depth shown before any zoom, m. */
export function depthPlotExtent(rows: Row[]): [number, number] {
  return [0, Math.max(1, ...rows.map(r => r.bottom))]
}

export function settlementDepthScene(input: { sublayers: Row[], unitSystem: UnitSystem, usStress?: UsStressUnit, width: number, height?: number, depthDomain?: [number, number] }): DepthPlotScene {
  const { width, unitSystem } = input
  const height = input.height ?? 440
  const M = DEPTH_PLOT_MARGIN
  const rows = input.sublayers
  const y = d3.scaleLinear().domain(input.depthDomain ?? depthPlotExtent(rows)).range([M.top, height - M.bottom])
  const stressMax = Math.max(1, ...rows.flatMap(r => [r.finalEffectiveStress, r.finalPreconsolidation, r.preconsolidation]))
  const x = d3.scaleLinear().domain([0, stressMax * 1.05]).range([M.left, width - M.right])
  const lines = SERIES.map(s => ({
    key: s.key,
    label: s.label,
    colour: s.colour,
    dash: s.dash,
    width: s.width,
    d: d3.line<Row>().x(r => x(s.value(r))).y(r => y(r.depth))(rows) ?? '',
  }))
  const strata: DepthStratum[] = []
  let last: { name: string, top: number, bottom: number } | null = null
  const spans: { name: string, top: number, bottom: number }[] = []
  for (const r of rows) {
    if (last && last.name === r.layer) last.bottom = r.bottom
    else {
      last = { name: r.layer, top: r.top, bottom: r.bottom }
      spans.push(last)
    }
  }
  for (const s of spans) strata.push({ name: s.name, yTop: y(s.top), yBottom: y(s.bottom) })
  return {
    width,
    height,
    margin: M,
    lines,
    strata,
    xTicks: scaleTicks(x, convert(1, 'stress', 'SI', unitSystem, { usStress: input.usStress }), Math.max(3, Math.round(width / 90))),
    yTicks: scaleTicks(y, convert(1, 'length', 'SI', unitSystem), 10).filter(t => t.at >= M.top - 0.5 && t.at <= height - M.bottom + 0.5),
    xLabel: `Stress (${unitLabel('stress', unitSystem, { usStress: input.usStress })})`,
    yLabel: `Depth (${unitLabel('length', unitSystem)})`,
    legendCols: width < 440 ? 2 : 3,
  }
}

/** The scene as an SVG string (clip, axes, strata, lines and the legend under the plot). */
export function settlementDepthSvg(s: DepthPlotScene, clipId = 'depth-clip'): string {
  const M = s.margin
  const p: string[] = []
  p.push(`<defs><clipPath id="${clipId}">${el('rect', { x: M.left, y: M.top, width: s.width - M.left - M.right, height: s.height - M.top - M.bottom })}</clipPath></defs>`)
  p.push(text(s.width - M.right, 12, s.xLabel, { 'text-anchor': 'end', 'font-size': 11, 'font-weight': 'bold', 'fill': '#48423a' }))
  for (const t of s.xTicks) {
    p.push(el('line', { x1: t.at, x2: t.at, y1: M.top, y2: s.height - M.bottom, stroke: '#efede7' }))
    p.push(text(t.at, M.top - 6, t.label, { 'text-anchor': 'middle', 'font-size': 10, 'fill': '#48423a' }))
  }
  p.push(text(4, 12, s.yLabel, { 'font-size': 11, 'font-weight': 'bold', 'fill': '#48423a' }))
  for (const t of s.yTicks) {
    p.push(el('line', { x1: M.left - 4, x2: M.left, y1: t.at, y2: t.at, stroke: '#7f7360' }))
    p.push(text(M.left - 6, t.at + 3.5, t.label, { 'text-anchor': 'end', 'font-size': 10, 'fill': '#48423a' }))
  }
  p.push(el('line', { x1: M.left, x2: M.left, y1: M.top, y2: s.height - M.bottom, stroke: '#7f7360' }))
  p.push(el('line', { x1: M.left, x2: s.width - M.right, y1: M.top, y2: M.top, stroke: '#7f7360' }))
  const inner: string[] = []
  for (const st of s.strata) {
    inner.push(el('line', { 'x1': M.left, 'x2': s.width - M.right, 'y1': st.yBottom, 'y2': st.yBottom, 'stroke': '#c9c1b0', 'stroke-dasharray': '3 3' }))
    inner.push(text(s.width - M.right - 4, (st.yTop + st.yBottom) / 2 + 4, st.name, { 'text-anchor': 'end', 'font-size': 10, 'fill': '#7f7360' }))
  }
  for (const l of s.lines) inner.push(el('path', { 'd': l.d, 'fill': 'none', 'stroke': l.colour, 'stroke-width': l.width, 'stroke-dasharray': l.dash }))
  p.push(el('g', { 'clip-path': `url(#${clipId})` }, inner.join('')))
  const colW = (s.width - M.left - M.right) / s.legendCols
  s.lines.forEach((l, i) => {
    const lx = M.left + (i % s.legendCols) * colW
    const ly = s.height - M.bottom + 14 + Math.floor(i / s.legendCols) * 16
    p.push(el('line', { 'x1': lx, 'x2': lx + 20, 'y1': ly, 'y2': ly, 'stroke': l.colour, 'stroke-width': l.width, 'stroke-dasharray': l.dash }))
    p.push(text(lx + 24, ly + 3.5, l.label, { 'font-size': 10, 'fill': '#27231f' }))
  })
  return svgDocument(s.width, s.height, p.join(''))
}
