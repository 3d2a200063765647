import * as d3 from 'd3'
import type { RunPointResult } from '../types/settlement-runs'
import { convert, unitLabel, type UnitSystem, type UsStressUnit } from '../units'
import { settlementFactor, settlementUnitLabel } from './settlement-units'
import { el, svgDocument, text, type AxisTick } from './svg'

/**
 * Settlement against time (log time, settlement down) at one or more named points: the total, the primary
 * consolidation of each stratum and the secondary compression after 95 % primary, with t50 and t90 marked.
 * With drains, the primary settlement without them beside it (and its t90); with a schedule or a load taken
 * off, the load at the surface over the same time axis in a band above, and the removal marked.
 * One scene serves the run page (`SettlementTimeCurve.vue` renders it) and the PDF report (`settlementTimeSvg`).
 */

export interface TimeSeries {
  name: string
  point: Pick<RunPointResult, 'label' | 'curve' | 'time' | 't50' | 't90'> & Partial<Pick<RunPointResult, 't90WithoutDrains' | 'removedAt' | 'rebound'>>
}
export interface TimeLine { key: string, label: string, colour: string, width: number, dash?: string, d: string }
export interface TimeMark {
  key: string
  at: number
  row: number
  label: string
  /** 'end': the label sits left of the line (it would run past the plot's right edge). */
  anchor?: 'start' | 'end'
}

/** The load at the ground surface against the same time axis, in a band above the settlement axes. */
export interface TimeLoadBand {
  /** Band top and bottom, px. */
  top: number
  bottom: number
  d: string
  colour: string
  ticks: AxisTick[]
  label: string
}

export interface TimePlotScene {
  width: number
  height: number
  margin: { left: number, right: number, top: number, bottom: number }
  /** Top of the settlement axes, px (below the load band when there is one, else margin.top). */
  plotTop: number
  load: TimeLoadBand | null
  lines: TimeLine[]
  xTicks: AxisTick[]
  yTicks: AxisTick[]
  marks: TimeMark[]
  xLabel: string
  yLabel: string
}

const LAYER_INK = ['#4d9aa8', '#c98024', '#7d5a4a', '#216641', '#8e6fb0', '#b86d2c']
const RUN_INK = ['#1c4450', '#b86d2c']
const MARGIN = { left: 52, right: 14, top: 18, bottom: 42 }
/** The load band's height and the gap under it, px. */
const LOAD_BAND = 62
const LOAD_GAP = 14
const LOAD_INK = '#8a481a'
const NO_DRAIN_INK = '#978a72'

interface RawLine { key: string, label: string, colour: string, width: number, dash?: string, pts: [number, number][] }

function rawLines(series: TimeSeries[]): RawLine[] {
  const single = series.length === 1
  const out: RawLine[] = []
  series.forEach((s, si) => {
    const c = s.point.curve
    const tag = single ? '' : `${s.name}: `
    const ink = RUN_INK[si % 2] ?? '#1c4450'
    if (c && c.years.length) {
      const zip = (ys: number[]) => c.years.map((t, i) => [t, ys[i] ?? 0] as [number, number])
      const drained = single && !!c.withoutDrains?.length
      out.push({ key: `${si}-total`, label: `${tag}total${drained ? ', with drains' : ''}`, colour: ink, width: 2.4, dash: si ? '7 4' : undefined, pts: zip(c.total) })
      if (drained) out.push({ key: `${si}-nodrains`, label: 'primary, without drains', colour: NO_DRAIN_INK, width: 2, dash: '8 3 2 3', pts: zip(c.withoutDrains ?? []) })
      if (single) {
        out.push({ key: `${si}-primary`, label: 'primary', colour: '#317d8c', width: 1.6, dash: '6 3', pts: zip(c.primary) })
        if (c.secondary.some(v => v > 0)) out.push({ key: `${si}-secondary`, label: 'secondary (after 95 % primary)', colour: '#7f7360', width: 1.4, dash: '2 3', pts: zip(c.secondary) })
        c.layers.forEach((l, li) => out.push({ key: `${si}-l${li}`, label: `${l.name}, primary`, colour: LAYER_INK[li % LAYER_INK.length] ?? '#4d9aa8', width: 1, pts: zip(l.settlement) }))
      }
    }
    else if (s.point.time.length) {
      out.push({ key: `${si}-times`, label: `${tag}at the times of interest`, colour: ink, width: 2, dash: si ? '7 4' : undefined, pts: s.point.time.map(t => [t.years, t.settlement] as [number, number]) })
    }
  })
  return out
}

const tickLabel = (t: number) => (t >= 1 ? String(t) : String(Number(t.toPrecision(1))))

/** Only a load that changes with time (stages, removal) gets the band; an instant load would be a flat line. */
function loadHistory(series: TimeSeries[]): { years: number[], load: number[] } | null {
  if (series.length !== 1) return null
  const c = series[0]?.point.curve
  const load = c?.surfaceLoad
  if (!c || !load?.length) return null
  const lo = Math.min(...load)
  const hi = Math.max(...load)
  return hi > 0 && (hi - lo > 1e-9 * hi || series[0]?.point.removedAt !== undefined) ? { years: c.years, load } : null
}

/**
 * Rows for the marks' labels so that neighbours do not overlap (about 5.5 px a character at 10 px); a
 * label that would run past `right` sits left of its line.
 */
function markRows<T extends { at: number, label: string }>(marks: T[], right: number): (T & { row: number, anchor: 'start' | 'end' })[] {
  const placed = marks.map((m) => {
    const w = 3 + m.label.length * 5.5
    const anchor: 'start' | 'end' = m.at + w > right ? 'end' : 'start'
    return { m, anchor, x0: anchor === 'start' ? m.at : m.at - w, x1: anchor === 'start' ? m.at + w : m.at }
  }).sort((a, b) => a.x0 - b.x0)
  const ends: number[] = []
  return placed.map(({ m, anchor, x0, x1 }) => {
    let row = ends.findIndex(end => x0 > end + 4)
    if (row < 0) row = ends.length
    ends[row] = x1
    return { ...m, row, anchor }
  }).sort((a, b) => a.at - b.at)
}

export function settlementTimeScene(input: { series: TimeSeries[], years: number[], unitSystem: UnitSystem, width: number, height?: number, usStress?: UsStressUnit }): TimePlotScene {
  const width = input.width
  const history = loadHistory(input.series)
  const band = history ? LOAD_BAND + LOAD_GAP : 0
  const height = (input.height ?? 320) + band
  const M = MARGIN
  const plotTop = M.top + band
  const single = input.series.length === 1
  const sF = settlementFactor(input.unitSystem)
  const raw = rawLines(input.series)

  const ts = raw.flatMap(l => l.pts.map(p => p[0])).filter(t => t > 0)
  let domainX: [number, number] = [0.01, 100]
  if (ts.length) {
    // Start where something happens: a thousandth of the earliest t50, or the first time of interest if earlier.
    const t50s = input.series.map(s => s.point.t50).filter((t): t is number => t !== null && t > 0)
    const early = Math.min(...input.years.filter(y => y > 0), ...(t50s.length ? [Math.min(...t50s) / 1000] : []))
    const lo = Math.max(Math.min(...ts), Number.isFinite(early) ? early : 0)
    const hi = Math.max(...ts)
    domainX = [Math.min(lo, hi / 10), hi]
  }
  const x = d3.scaleLog().domain(domainX).range([M.left, width - M.right]).clamp(true)
  const max = Math.max(1e-6, ...raw.flatMap(l => l.pts.map(p => p[1]))) * sF
  const y = d3.scaleLinear().domain([0, max]).nice().range([plotTop, height - M.bottom])

  const lines = raw.map(l => ({
    key: l.key,
    label: l.label,
    colour: l.colour,
    width: l.width,
    dash: l.dash,
    d: d3.line<[number, number]>().defined(p => p[0] > 0 && p[0] >= domainX[0] * 0.999).x(p => x(p[0])).y(p => y(p[1] * sF))(l.pts) ?? '',
  }))
  const xTicks: AxisTick[] = []
  for (let e = Math.floor(Math.log10(domainX[0])); e <= Math.ceil(Math.log10(domainX[1])); e++) {
    const t = 10 ** e
    if (t >= domainX[0] * 0.999 && t <= domainX[1] * 1.001) xTicks.push({ at: x(t), label: tickLabel(t) })
  }
  const yTicks = y.ticks(6).map(t => ({ at: y(t), label: String(t) }))
  const drained = single && !!input.series[0]?.point.curve?.withoutDrains?.length
  const marked = input.series.flatMap((s, si) => [
    ...(s.point.t50 !== null ? [{ key: `${si}-t50`, t: s.point.t50, row: si, label: single ? 't50' : `t50 ${s.name}` }] : []),
    ...(s.point.t90 !== null ? [{ key: `${si}-t90`, t: s.point.t90, row: si, label: single ? 't90' : `t90 ${s.name}` }] : []),
    ...(drained && s.point.t90WithoutDrains != null ? [{ key: `${si}-t90n`, t: s.point.t90WithoutDrains, row: si, label: 't90 no drains' }] : []),
    ...(single && s.point.removedAt !== undefined ? [{ key: `${si}-off`, t: s.point.removedAt, row: si, label: 'taken off' }] : []),
  ]).filter(m => m.t >= domainX[0] && m.t <= domainX[1]).map(m => ({ key: m.key, at: x(m.t), row: m.row, label: m.label }))
  // One series: rows so that close marks (t90 just after a removal, say) do not overlap; several: a row per series.
  const marks: TimeMark[] = single ? markRows(marked, width - M.right) : marked

  let load: TimeLoadBand | null = null
  if (history) {
    const opts = { usStress: input.usStress ?? 'psf' }
    const f = convert(1, 'stress', 'SI', input.unitSystem, opts)
    const ly = d3.scaleLinear().domain([0, Math.max(...history.load) * f]).nice(3).range([M.top + LOAD_BAND, M.top])
    load = {
      top: M.top,
      bottom: M.top + LOAD_BAND,
      d: d3.line<[number, number]>().defined(p => p[0] > 0 && p[0] >= domainX[0] * 0.999).x(p => x(p[0])).y(p => ly(p[1] * f))(history.years.map((t, i) => [t, history.load[i] ?? 0])) ?? '',
      colour: LOAD_INK,
      ticks: ly.ticks(3).map(t => ({ at: ly(t), label: String(t) })),
      label: `Load (${unitLabel('stress', input.unitSystem, opts)})`,
    }
  }
  return {
    width,
    height,
    margin: M,
    plotTop,
    load,
    lines: ts.length ? lines : [],
    xTicks,
    yTicks,
    marks,
    xLabel: 'Time (years, log scale)',
    yLabel: `Settlement (${settlementUnitLabel(input.unitSystem)})`,
  }
}

/** The scene as an SVG string, with its legend drawn below the plot when `legend` is set. */
export function settlementTimeSvg(s: TimePlotScene, opts: { legend?: boolean } = {}): string {
  const M = s.margin
  const top = s.plotTop
  const parts: string[] = []
  if (s.load) {
    const L = s.load
    for (const t of s.xTicks) parts.push(el('line', { x1: t.at, x2: t.at, y1: L.top, y2: L.bottom, stroke: '#efede7' }))
    for (const t of L.ticks) {
      parts.push(el('line', { x1: M.left, x2: s.width - M.right, y1: t.at, y2: t.at, stroke: '#efede7' }))
      parts.push(text(M.left - 6, t.at + 3.5, t.label, { 'text-anchor': 'end', 'font-size': 10, 'fill': '#48423a' }))
    }
    parts.push(el('line', { x1: M.left, x2: s.width - M.right, y1: L.bottom, y2: L.bottom, stroke: '#7f7360' }))
    parts.push(el('line', { x1: M.left, x2: M.left, y1: L.top, y2: L.bottom, stroke: '#7f7360' }))
    parts.push(text(0, 0, L.label, { 'transform': `translate(12,${(L.top + L.bottom) / 2}) rotate(-90)`, 'text-anchor': 'middle', 'font-size': 10, 'font-weight': 'bold', 'fill': '#48423a' }))
    parts.push(el('path', { 'd': L.d, 'fill': 'none', 'stroke': L.colour, 'stroke-width': 2 }))
  }
  for (const t of s.yTicks) {
    parts.push(el('line', { x1: M.left, x2: s.width - M.right, y1: t.at, y2: t.at, stroke: '#efede7' }))
    parts.push(text(M.left - 6, t.at + 3.5, t.label, { 'text-anchor': 'end', 'font-size': 10, 'fill': '#48423a' }))
  }
  for (const t of s.xTicks) {
    parts.push(el('line', { x1: t.at, x2: t.at, y1: top, y2: s.height - M.bottom, stroke: '#efede7' }))
    parts.push(text(t.at, s.height - M.bottom + 14, t.label, { 'text-anchor': 'middle', 'font-size': 10, 'fill': '#48423a' }))
  }
  parts.push(el('line', { x1: M.left, x2: s.width - M.right, y1: s.height - M.bottom, y2: s.height - M.bottom, stroke: '#7f7360' }))
  parts.push(el('line', { x1: M.left, x2: M.left, y1: top, y2: s.height - M.bottom, stroke: '#7f7360' }))
  parts.push(text((M.left + s.width - M.right) / 2, s.height - 6, s.xLabel, { 'text-anchor': 'middle', 'font-size': 11, 'font-weight': 'bold', 'fill': '#48423a' }))
  parts.push(text(0, 0, s.yLabel, { 'transform': `translate(12,${(top + s.height - M.bottom) / 2}) rotate(-90)`, 'text-anchor': 'middle', 'font-size': 11, 'font-weight': 'bold', 'fill': '#48423a' }))
  for (const m of s.marks) {
    parts.push(el('line', { x1: m.at, x2: m.at, y1: M.top, y2: s.height - M.bottom, 'stroke': '#dc9c38', 'stroke-dasharray': '3 3' }))
    const end = m.anchor === 'end'
    parts.push(text(end ? m.at - 3 : m.at + 3, top + 10 + m.row * 12, m.label, { 'font-size': 10, 'font-weight': 'bold', 'fill': '#8a481a', 'text-anchor': end ? 'end' : undefined }))
  }
  for (const l of s.lines) parts.push(el('path', { 'd': l.d, 'fill': 'none', 'stroke': l.colour, 'stroke-width': l.width, 'stroke-dasharray': l.dash }))
  let height = s.height
  if (opts.legend && s.lines.length) {
    const cols = s.width < 440 ? 2 : 3
    const colW = (s.width - M.left - M.right) / cols
    s.lines.forEach((l, i) => {
      const lx = M.left + (i % cols) * colW
      const ly = s.height + 6 + Math.floor(i / cols) * 14
      parts.push(el('line', { 'x1': lx, 'x2': lx + 20, 'y1': ly, 'y2': ly, 'stroke': l.colour, 'stroke-width': l.width, 'stroke-dasharray': l.dash }))
      parts.push(text(lx + 24, ly + 3.5, l.label, { 'font-size': 10, 'fill': '#27231f' }))
    })
    height += 10 + Math.ceil(s.lines.length / cols) * 14
  }
  return svgDocument(s.width, height, parts.join(''))
}
