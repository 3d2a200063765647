import * as d3 from 'd3'
import type { TrendBandPoint } from '../geotech/trend-model'
import type { PreconsolidationSource } from '../schemas/lab'
import type { FlagVerdict } from '../review/flags'
import { stratumBounds } from '../site-model/definition-plain'
import type { SiteModelDefinition } from '../site-model/definition'
import type { ProfilePoint } from '../types/calc'
import { displayTicks, px, svgEscape, type AxisTick } from './axes'
import { INK, MARK_SIZES, markStyle, ringPathAt, slashPathAt, symbolPath } from './palette'
import type { TrendSample } from './stress-history'

/**
 * The geometry of the stress-history tracks, one implementation for the model canvas (Vue components
 * draw these scenes and layer their handles over them) and the reports (the same scenes written as SVG
 * strings): the value axes, a track's frame, the stress track (σv, u, σ'v0, each stratum's σ'p trend
 * with its band), the OCR and POP tracks, and the σ'p point symbols. Pure, SI values in, display units
 * only in tick labels (`factor`).
 */

export type PointState = 'included' | 'excluded' | 'flagged-out' | 'unassigned'
export type Scale = d3.ScaleLinear<number, number>

/** The vertical band every track of one drawing shares, px. */
export interface PlotBand { top: number, bottom: number }

/** The size of a drawing of a model and its strata: 720 px wide unless given, the depth band 44 px below the top and `keyHeight` + 14 px above the bottom. */
export function drawingSheet(input: { width?: number, height?: number, definition: Pick<SiteModelDefinition, 'strata'> }, defaults: { height: number, keyHeight: number }) {
  const width = input.width ?? 720
  const height = input.height ?? defaults.height
  const bounds = stratumBounds(input.definition)
  const base = bounds.at(-1)?.bottom ?? 0
  const band: PlotBand = { top: 44, bottom: height - defaults.keyHeight - 14 }
  return { width, height, bounds, base, band }
}

// --- value axes ------------------------------------------------------------------

/** Stress axis: automatic from σv at the base and the bulk (80 %) of the σ'p points above it, or a chosen maximum. */
export function stressAxis(args: { profile: readonly ProfilePoint[], preconsolidation: readonly { depth: number, preconsolidation: number }[], base: number, width: number, max?: number | null }): Scale {
  let hi = args.max ?? null
  if (hi === null) {
    const sv = args.profile.reduce((m, p) => Math.max(m, p.totalStress), 0)
    const inModel = args.preconsolidation.filter(p => p.depth <= args.base).map(p => p.preconsolidation).sort((a, b) => a - b)
    const q = inModel.length ? d3.quantileSorted(inModel, 0.8) ?? 0 : 0
    hi = Math.max(100, sv * 1.1, q * 1.15)
  }
  return d3.scaleLinear().domain([0, hi]).nice(5).range([0, args.width])
}

/** OCR axis from the trends' values (3 to 12). */
export function ocrAxis(lines: readonly { samples: readonly TrendSample[] }[], width: number): Scale {
  const values = lines.flatMap(l => l.samples.map(s => s.ocr))
  const hi = Math.min(12, Math.max(3, ...values) * 1.1)
  return d3.scaleLinear().domain([0, hi]).nice(3).range([4, width - 4])
}

/** POP axis from the trends' values (at least 0 to 50 kPa). */
export function popAxis(lines: readonly { samples: readonly TrendSample[] }[], width: number): Scale {
  const values = lines.flatMap(l => l.samples.map(s => s.pop))
  return d3.scaleLinear().domain([Math.min(0, ...values), Math.max(50, ...values) * 1.1]).nice(3).range([4, width - 4])
}

// --- a track's frame -------------------------------------------------------------

export interface FrameScene { xTicks: AxisTick[], depthGrid: AxisTick[] }

/** Ticks along a track's top (round display values) and the depth grid lines inside the band. */
export function frameScene(args: { width: number, band: PlotBand, y: Scale, lengthFactor: number, scale?: Scale | null, factor?: number, ticks?: number, depthTicks?: number }): FrameScene {
  const { band } = args
  const depthGrid = displayTicks(args.y, args.lengthFactor, args.depthTicks ?? 10).filter(t => t.at >= band.top && t.at <= band.bottom)
  const xTicks = args.scale ? displayTicks(args.scale, args.factor ?? 1, args.ticks ?? 4).filter(t => t.at >= -0.5 && t.at <= args.width + 0.5) : []
  return { xTicks, depthGrid }
}

/** A whole track as SVG: title, ticks, depth grid, the clipped content and the frame, at `x`. */
export function frameSvg(args: { x: number, width: number, band: PlotBand, title: string, unit?: string, scene: FrameScene, content: string }): string {
  const { x, width, band, scene } = args
  const h = Math.max(0, band.bottom - band.top)
  const out: string[] = [`<g transform="translate(${px(x)},0)">`]
  out.push(`<text x="${px(width / 2)}" y="${px(band.top - 31)}" text-anchor="middle" font-size="12" font-weight="600" fill="${INK.axis}">${svgEscape(args.title)}${args.unit ? `<tspan font-weight="400"> (${svgEscape(args.unit)})</tspan>` : ''}</text>`)
  for (const t of scene.xTicks) {
    out.push(`<line x1="${px(t.at)}" x2="${px(t.at)}" y1="${px(band.top - 4)}" y2="${px(band.bottom)}" stroke="${INK.grid}" stroke-width="1"/>`)
    out.push(`<line x1="${px(t.at)}" x2="${px(t.at)}" y1="${px(band.top - 4)}" y2="${px(band.top)}" stroke="${INK.muted}" stroke-width="1"/>`)
    out.push(`<text x="${px(t.at)}" y="${px(band.top - 7)}" text-anchor="middle" font-size="10" fill="${INK.axis}">${svgEscape(t.label)}</text>`)
  }
  for (const t of scene.depthGrid) out.push(`<line x1="0" x2="${px(width)}" y1="${px(t.at)}" y2="${px(t.at)}" stroke="${INK.grid}" stroke-width="1"/>`)
  out.push(`<svg x="0" y="${px(band.top)}" width="${px(width)}" height="${px(h)}" overflow="hidden"><g transform="translate(0,${px(-band.top)})">${args.content}</g></svg>`)
  out.push(`<rect x="0" y="${px(band.top)}" width="${px(width)}" height="${px(h)}" fill="none" stroke="${INK.frame}" stroke-width="1"/>`)
  out.push('</g>')
  return out.join('')
}

/** The depth axis at the left of the tracks. */
export function depthAxisSvg(args: { x: number, band: PlotBand, y: Scale, lengthFactor: number, unit: string, ticks?: number }): string {
  const ticks = displayTicks(args.y, args.lengthFactor, args.ticks ?? 10).filter(t => t.at >= args.band.top - 0.5 && t.at <= args.band.bottom + 0.5)
  return `<g transform="translate(${px(args.x)},0)"><text x="-36" y="${px(args.band.top - 31)}" font-size="11" font-weight="600" fill="${INK.axis}">Depth (${svgEscape(args.unit)})</text>`
    + `<line x1="0" x2="0" y1="${px(args.band.top)}" y2="${px(args.band.bottom)}" stroke="${INK.muted}" stroke-width="1"/>`
    + ticks.map(t => `<line x1="-4" x2="0" y1="${px(t.at)}" y2="${px(t.at)}" stroke="${INK.muted}" stroke-width="1"/><text x="-6" y="${px(t.at + 3.5)}" text-anchor="end" font-size="10" fill="${INK.axis}">${svgEscape(t.label)}</text>`).join('')
    + '</g>'
}

// --- the stress track --------------------------------------------------------------

/** One stratum's trend for the stress track: its samples, and for a fitted trend the confidence band. */
export interface TrendLineInput {
  band: number
  samples: readonly TrendSample[]
  /** The fit's band (mean response), null for a hand-drawn trend or before the fit is known. */
  fitBand: readonly TrendBandPoint[] | null
  bounds: { top: number, bottom: number }
  manual: boolean
}

export interface StressTrackScene {
  total: string
  pore: string
  effective: string
  trends: { band: number, line: string, area: string, manual: boolean }[]
  /** y of each stratum's bottom (dashed break lines). */
  breaks: number[]
  /** Where the "σ'v0" label of the curve's end goes. */
  baseLabel: { x: number, y: number } | null
}

/** σv, u and σ'v0 of the profile and each stratum's trend line and band, drawn only within its stratum. */
export function stressTrackScene(args: { width: number, band: PlotBand, y: Scale, scale: Scale, profile: readonly ProfilePoint[], trends: readonly TrendLineInput[], bounds: readonly { top: number, bottom: number }[] }): StressTrackScene {
  const { y, scale: x } = args
  const line = (key: 'totalStress' | 'porePressure' | 'effectiveStress') => d3.line<ProfilePoint>().x(p => x(p[key])).y(p => y(p.depth))(args.profile as ProfilePoint[]) ?? ''
  const trends = args.trends.map((t) => {
    const l = d3.line<TrendSample>().x(p => x(p.preconsolidation)).y(p => y(p.depth))(t.samples as TrendSample[]) ?? ''
    let area = ''
    if (!t.manual && t.fitBand) {
      const band = t.fitBand.filter(p => p.depth >= t.bounds.top && p.depth <= t.bounds.bottom)
      area = d3.area<TrendBandPoint>().y(p => y(p.depth)).x0(p => x(Math.max(0, p.lower))).x1(p => x(p.upper))(band) ?? ''
    }
    return { band: t.band, line: l, area, manual: t.manual }
  })
  const last = args.profile[args.profile.length - 1]
  return {
    total: line('totalStress'),
    pore: line('porePressure'),
    effective: line('effectiveStress'),
    trends,
    breaks: args.bounds.map(b => y(b.bottom)),
    baseLabel: last ? { x: Math.min(args.width - 4, x(last.effectiveStress) + 4), y: args.band.bottom - 4 } : null,
  }
}

/** The stress track's static drawing as SVG (the track's own x). Points go on top with `pointMarksSvg`. */
export function stressTrackSvg(scene: StressTrackScene, args: { width: number, points?: string }): string {
  const out: string[] = []
  for (const b of scene.breaks) out.push(`<line x1="0" x2="${px(args.width)}" y1="${px(b)}" y2="${px(b)}" stroke="#dfdacf" stroke-width="1" stroke-dasharray="3 3"/>`)
  for (const t of scene.trends) if (t.area) out.push(`<path d="${t.area}" fill="${INK.trendBand}" opacity="0.55"/>`)
  out.push(`<path d="${scene.total}" fill="none" stroke="${INK.totalStress}" stroke-width="1.2"/>`)
  out.push(`<path d="${scene.pore}" fill="none" stroke="${INK.porePressure}" stroke-width="1.3" stroke-dasharray="5 3"/>`)
  out.push(`<path d="${scene.effective}" fill="none" stroke="${INK.effectiveStress}" stroke-width="2.4"/>`)
  if (args.points) out.push(args.points)
  for (const t of scene.trends) out.push(`<path d="${t.line}" fill="none" stroke="#ffffff" stroke-width="4.6" opacity="0.8"/>`)
  for (const t of scene.trends) out.push(`<path d="${t.line}" fill="none" stroke="${INK.trend}" stroke-width="2.4"${t.manual ? ' stroke-dasharray="7 3"' : ''}/>`)
  if (scene.baseLabel) out.push(`<text x="${px(scene.baseLabel.x)}" y="${px(scene.baseLabel.y)}" font-size="10" fill="${INK.effectiveStress}" text-anchor="end">σ'v0</text>`)
  return out.join('')
}

// --- σ'p points ------------------------------------------------------------------

/** A σ'p point where a track draws it (x in the track's own px). */
export interface PointMarkInput { x: number, y: number, source: PreconsolidationSource, qualityClass: string | null, state: PointState, verdict: FlagVerdict | null }

/**
 * The σ'p symbols as SVG: left-out points first so fitted ones sit on top. Marks of one look share one
 * path (a few elements instead of one per point: hundreds of CPT points stay light in a PDF).
 */
export function pointMarksSvg(marks: readonly PointMarkInput[], dx = 0): string {
  const list = [...marks].sort((a, b) => Number(a.state === 'included') - Number(b.state === 'included'))
  const shapes = new Map<string, string[]>()
  const rings = new Map<string, string[]>()
  const slashes: string[] = []
  const add = (m: Map<string, string[]>, key: string, d: string) => {
    const l = m.get(key)
    if (l) l.push(d)
    else m.set(key, [d])
  }
  for (const m of list) {
    const st = markStyle(m.source, m.qualityClass, m.state, m.verdict)
    const x = dx + m.x
    add(shapes, `fill="${st.fill}" stroke="${st.stroke}" stroke-width="${st.width}"${st.dash ? ` stroke-dasharray="${st.dash}"` : ''}${st.opacity < 1 ? ` opacity="${st.opacity}"` : ''}`, symbolPath(m.source, MARK_SIZES[m.source], x, m.y))
    if (st.ring) add(rings, `fill="none" stroke="${st.ring.stroke}" stroke-width="${st.ring.width}"${st.ring.dash ? ` stroke-dasharray="${st.ring.dash}"` : ''}${st.opacity < 1 ? ` opacity="${st.opacity}"` : ''}`, ringPathAt(x, m.y))
    if (st.slash) slashes.push(slashPathAt(x, m.y))
  }
  const out: string[] = []
  for (const [attrs, ds] of shapes) out.push(`<path d="${ds.join('')}" ${attrs}/>`)
  for (const [attrs, ds] of rings) out.push(`<path d="${ds.join('')}" ${attrs}/>`)
  if (slashes.length) out.push(`<path d="${slashes.join('')}" stroke="#c0392b" stroke-width="1.4"/>`)
  return out.join('')
}

/** Colour of the points' own OCR or POP dots in the ratio tracks. */
export const RATIO_DOT = 'rgba(201,128,36,0.28)'

/** The points' OCR or POP as small dots (x in the track's own px). */
export function ratioDotsSvg(dots: readonly { x: number, y: number }[], dx = 0): string {
  if (!dots.length) return ''
  return `<path fill="${RATIO_DOT}" d="${dots.map(d => `M${px(dx + d.x - 1.6)},${px(d.y)}a1.6,1.6 0 1,0 3.2,0a1.6,1.6 0 1,0 -3.2,0Z`).join('')}"/>`
}

// --- the OCR and POP tracks -----------------------------------------------------

export interface RatioTrackScene { reference: number, paths: { band: number, d: string }[] }

/** OCR = σ'p/σ'v0 or POP = σ'p − σ'v0 of each stratum's trend with depth, and the reference line (OCR 1, POP 0). */
export function ratioTrackScene(args: { kind: 'ocr' | 'pop', y: Scale, scale: Scale, lines: readonly { band: number, samples: readonly TrendSample[] }[] }): RatioTrackScene {
  const { y, scale: x, kind } = args
  return {
    reference: x(kind === 'ocr' ? 1 : 0),
    paths: args.lines.map(l => ({ band: l.band, d: d3.line<TrendSample>().x(s => x(s[kind])).y(s => y(s.depth))(l.samples as TrendSample[]) ?? '' })),
  }
}

export function ratioTrackSvg(scene: RatioTrackScene, args: { band: PlotBand, dots?: string }): string {
  return `<line x1="${px(scene.reference)}" x2="${px(scene.reference)}" y1="${px(args.band.top)}" y2="${px(args.band.bottom)}" stroke="${INK.muted}" stroke-width="1" stroke-dasharray="2 2"/>`
    + (args.dots ?? '')
    + scene.paths.map(p => `<path d="${p.d}" fill="none" stroke="${INK.trend}" stroke-width="2.2"/>`).join('')
}
