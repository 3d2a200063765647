import * as d3 from 'd3'
import type { RunPointProbabilistic } from '../types/settlement-runs'
import type { UnitSystem } from '../units'
import { fittedTicks, type AxisTick } from './axes'
import { settlementFactor, settlementUnitLabel } from './settlement-units'

/**
 * The probabilistic result of one named point drawn as scenes (px geometry from SI data): the
 * histogram of final primary settlement with its P5, P50, P95 and the deterministic figure marked,
 * the exceedance curve P(S > s) with a limit read off it, and the tornado of the parameters ranked by
 * their rank correlation with settlement. Vue components render the scenes (`SettlementSpread*`);
 * a report can serialise the same geometry.
 */

export interface SpreadMargin { left: number, right: number, top: number, bottom: number }
export interface SpreadMark {
  key: string
  at: number
  label: string
  colour: string
  dash?: string
  /** Label row above the plot (0 the top), so that no two labels overlap. */
  row: number
  anchor: 'start' | 'middle' | 'end'
}

/** Pastload's spread inks: the bars in tide, the marks in ochre and silt. */
export const SPREAD_INK = {
  bar: '#4d9aa8',
  barEdge: '#1c4450',
  curve: '#1c4450',
  median: '#8a481a',
  tail: '#c98024',
  deterministic: '#48423a',
  limit: '#b3261e',
  positive: '#b86d2c',
  negative: '#317d8c',
  grid: '#efede7',
  axis: '#7f7360',
  text: '#48423a',
} as const

export interface HistogramBar { key: string, x: number, y: number, width: number, height: number, count: number, from: number, to: number }
export interface HistogramScene {
  width: number
  height: number
  margin: SpreadMargin
  bars: HistogramBar[]
  xTicks: AxisTick[]
  yTicks: AxisTick[]
  marks: SpreadMark[]
  xLabel: string
  yLabel: string
  total: number
}

const HIST_MARGIN: SpreadMargin = { left: 48, right: 12, top: 40, bottom: 40 }
/** Height of a label row above the histogram, px (10 px labels). */
export const SPREAD_LABEL_ROW = 11

/**
 * Label rows for the marks: each label centred on its line (or kept inside [left, right]), put in the
 * first row where it clears the labels already there (about 5.6 px a character at 10 px, bold).
 */
function placeMarks(marks: Omit<SpreadMark, 'row' | 'anchor'>[], left: number, right: number): SpreadMark[] {
  const ends: number[] = []
  const placed = [...marks].sort((a, b) => a.at - b.at).map((m): SpreadMark => {
    const w = m.label.length * 5.6 + 4
    const anchor: SpreadMark['anchor'] = m.at - w / 2 < left ? 'start' : m.at + w / 2 > right ? 'end' : 'middle'
    const x0 = anchor === 'start' ? m.at : anchor === 'end' ? m.at - w : m.at - w / 2
    let row = ends.findIndex(end => x0 > end + 4)
    if (row < 0) row = ends.length
    ends[row] = x0 + w
    return { ...m, row, anchor }
  })
  const byKey = new Map(placed.map(p => [p.key, p]))
  return marks.map(m => byKey.get(m.key) ?? { ...m, row: 0, anchor: 'middle' })
}

/**
 * Bars of the share of realisations in each bin (%), settlement along x in mm or in, P5, P50, P95
 * and the deterministic settlement as vertical marks.
 */
export function histogramScene(input: { result: Pick<RunPointProbabilistic, 'histogram' | 'quantiles' | 'deterministic'>, unitSystem: UnitSystem, width: number, height?: number }): HistogramScene {
  const { histogram, quantiles, deterministic } = input.result
  const width = input.width
  const height = input.height ?? 260
  const M = HIST_MARGIN
  const f = settlementFactor(input.unitSystem)
  const total = histogram.counts.reduce((a, c) => a + c, 0)
  const edges = histogram.edges
  const lo = Math.min(edges[0] ?? 0, deterministic, quantiles.p05)
  const hi = Math.max(edges[edges.length - 1] ?? 0, deterministic, quantiles.p95)
  const pad = hi > lo ? 0 : Math.max(1e-3, Math.abs(hi) * 0.05)
  const x = d3.scaleLinear().domain([lo - pad, hi + pad]).range([M.left, width - M.right])
  const shares = histogram.counts.map(c => (total > 0 ? c / total : 0))
  const y = d3.scaleLinear().domain([0, Math.max(1e-9, ...shares)]).nice().range([height - M.bottom, M.top])
  const bars = histogram.counts.map((count, i): HistogramBar => {
    const from = edges[i] ?? 0
    const to = edges[i + 1] ?? from
    const x0 = x(from)
    const x1 = edges.length > 2 || to > from ? x(to) : x0 + 8
    const share = shares[i] ?? 0
    return { key: `b${i}`, x: x0, y: y(share), width: Math.max(1, x1 - x0 - 1), height: y(0) - y(share), count, from, to }
  })
  const u = settlementUnitLabel(input.unitSystem)
  const fmt = (v: number) => (v * f).toFixed(input.unitSystem === 'US' ? 2 : 0)
  const marks = placeMarks([
    { key: 'p05', at: x(quantiles.p05), label: `P5 ${fmt(quantiles.p05)}`, colour: SPREAD_INK.tail, dash: '4 3' },
    { key: 'p50', at: x(quantiles.p50), label: `P50 ${fmt(quantiles.p50)}`, colour: SPREAD_INK.median },
    { key: 'p95', at: x(quantiles.p95), label: `P95 ${fmt(quantiles.p95)}`, colour: SPREAD_INK.tail, dash: '4 3' },
    { key: 'deterministic', at: x(deterministic), label: `adopted ${fmt(deterministic)}`, colour: SPREAD_INK.deterministic, dash: '1 3' },
  ], M.left, width - M.right)
  return {
    width,
    height,
    margin: M,
    bars,
    xTicks: fittedTicks(x, { factor: f }),
    yTicks: fittedTicks(y, { factor: 100, orientation: 'vertical', max: 6 }),
    marks,
    xLabel: `Final primary settlement (${u})`,
    yLabel: 'Share of realisations (%)',
    total,
  }
}

export interface ExceedanceScene {
  width: number
  height: number
  margin: SpreadMargin
  d: string
  xTicks: AxisTick[]
  yTicks: AxisTick[]
  /** The typed limit and the probability read at it, when both are inside the axes. */
  limit: { x: number, y: number, label: string } | null
  xLabel: string
  yLabel: string
}

const EXC_MARGIN: SpreadMargin = { left: 48, right: 12, top: 16, bottom: 40 }

/** P(S > s) (%) against settlement s, a step-free line through the curve's points; the limit marked. */
export function exceedanceScene(input: { curve: RunPointProbabilistic['exceedanceCurve'], limit?: { settlement: number, probability: number } | null, unitSystem: UnitSystem, width: number, height?: number }): ExceedanceScene {
  const { settlement, probability } = input.curve
  const width = input.width
  const height = input.height ?? 260
  const M = EXC_MARGIN
  const f = settlementFactor(input.unitSystem)
  const n = Math.min(settlement.length, probability.length)
  const lo = n ? at(settlement, 0) : 0
  const hi = n ? at(settlement, n - 1) : 1
  const pad = hi > lo ? 0 : Math.max(1e-3, Math.abs(hi) * 0.05)
  const x = d3.scaleLinear().domain([lo - pad, hi + pad]).range([M.left, width - M.right])
  const y = d3.scaleLinear().domain([0, 1]).range([height - M.bottom, M.top])
  const line = d3.line<number>().x(i => x(at(settlement, i))).y(i => y(at(probability, i)))
  const d = n ? line(d3.range(n)) ?? '' : ''
  const l = input.limit
  const inside = l && l.settlement >= lo - pad && l.settlement <= hi + pad
  const u = settlementUnitLabel(input.unitSystem)
  return {
    width,
    height,
    margin: M,
    d,
    xTicks: fittedTicks(x, { factor: f }),
    yTicks: fittedTicks(y, { factor: 100, orientation: 'vertical', max: 6 }),
    limit: inside && l ? { x: x(l.settlement), y: y(l.probability), label: `${(l.settlement * f).toFixed(input.unitSystem === 'US' ? 2 : 0)} ${u}` } : null,
    xLabel: `Settlement s (${u})`,
    yLabel: 'Chance of more than s (%)',
  }
}

export interface TornadoRow {
  key: string
  label: string
  value: number
  /** Where the ρ figure goes: inside the bar's far end (long bars, white) or just beyond it. */
  valueInside: boolean
  valueX: number
  valueAnchor: 'start' | 'end'
  y: number
  barHeight: number
  x: number
  width: number
  colour: string
}
export interface TornadoScene {
  width: number
  height: number
  margin: SpreadMargin
  rows: TornadoRow[]
  centre: number
  xTicks: AxisTick[]
  xLabel: string
}

const TORNADO_MARGIN: SpreadMargin = { left: 150, right: 40, top: 8, bottom: 40 }
const TORNADO_ROW = 26

/**
 * One bar per scattered parameter from the centre line (ρ = 0) to its Spearman rank correlation with
 * settlement, largest |ρ| at the top; warm bars raise settlement, cool ones lower it. `names` gives a
 * stratum's name by code.
 */
export function tornadoScene(input: { sensitivity: RunPointProbabilistic['sensitivity'], names?: Record<string, string>, labels: Record<string, string>, width: number, maxRows?: number }): TornadoScene {
  const rowsIn = [...input.sensitivity]
    .filter(s => Number.isFinite(s.rankCorrelation))
    .sort((a, b) => Math.abs(b.rankCorrelation) - Math.abs(a.rankCorrelation))
    .slice(0, input.maxRows ?? 12)
  const labelOf = (s: { stratum: string, variable: string }) => `${input.names?.[s.stratum] ?? s.stratum} · ${input.labels[s.variable] ?? s.variable}`
  // Room for the longest label (about 6 px a character at 11 px), at most 45 % of the width.
  const widest = Math.max(0, ...rowsIn.map(s => labelOf(s).length * 6 + 12))
  const M = { ...TORNADO_MARGIN, left: Math.round(Math.min(input.width * 0.45, Math.max(60, widest))) }
  const height = M.top + M.bottom + Math.max(1, rowsIn.length) * TORNADO_ROW
  const x = d3.scaleLinear().domain([-1, 1]).range([M.left, input.width - M.right])
  const band = d3.scaleBand<number>().domain(d3.range(rowsIn.length)).range([M.top, height - M.bottom]).paddingInner(0.25).paddingOuter(0.15)
  const rows = rowsIn.map((s, i): TornadoRow => {
    const v = s.rankCorrelation
    const x0 = x(Math.min(0, v))
    const x1 = x(Math.max(0, v))
    return {
      key: `${s.stratum}:${s.variable}`,
      label: labelOf(s),
      value: v,
      valueInside: x1 - x0 > 44,
      ...(x1 - x0 > 44
        ? (v >= 0 ? { valueX: x1 - 4, valueAnchor: 'end' as const } : { valueX: x0 + 4, valueAnchor: 'start' as const })
        : (v >= 0 ? { valueX: x1 + 4, valueAnchor: 'start' as const } : { valueX: x0 - 4, valueAnchor: 'end' as const })),
      y: band(i) ?? 0,
      barHeight: band.bandwidth(),
      x: x0,
      width: Math.max(1, x1 - x0),
      colour: v >= 0 ? SPREAD_INK.positive : SPREAD_INK.negative,
    }
  })
  const ticks = [-1, -0.5, 0, 0.5, 1].map(t => ({ at: x(t), label: t === 0 ? '0' : t.toFixed(1) }))
  return { width: input.width, height, margin: M, rows, centre: x(0), xTicks: ticks, xLabel: 'Rank correlation with settlement' }
}

/** The value at `i` of an array already known to hold it (0 otherwise). */
function at(a: readonly number[], i: number): number {
  return a[i] ?? 0
}
