import type { GroundwaterKind, PointRecord, ProjectRecord, SampleType } from '../investigation/types'
import { placeLabels, wrapText, type LogScale, ptPerMetre } from '../reports/point-log-layout'
import type { PreconsolidationSource } from '../schemas/lab'
import { stratumColour, stratumPattern, FALLBACK_APPEARANCE, defaultAppearanceFor } from '../strata/appearance'
import { convert, unitLabel, type UnitSystem, type UsStressUnit } from '../units'
import {
  LOG_INK, logGlyphMarkup, round2, SAMPLE_MARK_WIDTH, sampleGlyph, sigmaPGlyph, sigmaPMarkOf, sptGlyph, waterGlyph,
} from './log-glyphs'

/**
 * The stress-history log of one point, one page's depth range at a time, as an SVG string: Pastload's
 * column order — depth and elevation ruler, strata, description, samples and tests, water, then the
 * stress-history strip (σ'v0, σ'p by source and quality, the adopted trend) and the OCR — all on one depth
 * scale. The PDF embeds it (pdfmake `svg`) and the HTML sheet inlines it: one drawing, two outputs.
 * Input in SI (m, kPa); labels in the project's units.
 */

export interface LogStratum { code: string, name: string, colour: string, pattern: string }
export interface LogInterval {
  top: number
  bottom: number
  description: string
  uscs: string | null
  consistency: string | null
  moisture: string | null
  stratum: LogStratum | null
}
export interface LogSample { identifier: string, type: SampleType, top: number, bottom: number, recovery: number | null }
export interface LogSpt { depth: number, blows: number[], n: number, penetration: number | null }
export interface LogWater { kind: GroundwaterKind, depth: number | null, observedAt: string, remarks: string }
export interface LogSigmaP { depth: number, preconsolidation: number, effectiveStress: number | null, source: PreconsolidationSource, qualityClass: string | null }

export interface LogStress {
  /** False when no version of the design model is saved: the strip says σ'v0 is unavailable. */
  available: boolean
  /** What the stresses come from, e.g. "Yard model version 1, approved", or why there are none. */
  model: string
  /** σ'v0 down the point, kPa, by depth. */
  profile: { depth: number, effectiveStress: number }[]
  /** The adopted σ'p trend per stratum band (one run each), kPa, with σ'v0 there for the OCR. */
  trend: { depth: number, preconsolidation: number, effectiveStress: number }[][]
  points: LogSigmaP[]
}

export interface PointLogData {
  project: ProjectRecord
  units: UnitSystem
  /** US stresses in psf (default) or tsf, as the project chose. */
  usStress?: UsStressUnit
  /** The point's own fields, as the investigation model has them (its log and readings are below). */
  point: Omit<PointRecord, 'intervals' | 'samples' | 'spt' | 'groundwater' | 'cpt' | 'vane'>
  intervals: LogInterval[]
  gaps: { top: number, bottom: number }[]
  samples: LogSample[]
  spt: LogSpt[]
  groundwater: LogWater[]
  stress: LogStress
}

/** Columns in pt from the drawing's left edge (the whole width fits A4 portrait inside the sheet margins). */
export const LOG_COLUMNS = {
  ruler: { x0: 0, x1: 40 },
  strata: { x0: 42, x1: 84 },
  description: { x0: 89, x1: 256 },
  samples: { x0: 261, x1: 344 },
  water: { x0: 348, x1: 418 },
  stress: { x0: 423, x1: 488 },
  ocr: { x0: 495, x1: 523 },
} as const
export const LOG_WIDTH = 523
/** Column heads above the drawing, and room below its last depth. */
export const LOG_HEAD = 30
export const LOG_FOOT = 12

const FONT = 'SourceSans3'
const DESC_SIZE = 7
const DESC_LINE = 8.4
const LABEL_SIZE = 6.5
const LABEL_LINE = 8

export function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;')
}

function text(x: number, y: number, s: string, attrs: string = ''): string {
  return `<text x="${round2(x)}" y="${round2(y)}" font-family="${FONT}"${attrs ? ` ${attrs}` : ''}>${escapeXml(s)}</text>`
}

/** "50/100 mm" for a test drive stopped short (as written on site); "N 23" otherwise. */
export function sptLabel(s: LogSpt): string {
  return s.penetration !== null ? `${s.n}/${s.penetration} mm` : `N ${s.n}`
}

/** A fixed-decimals number in the project's length unit. */
export function lengthText(metres: number, units: UnitSystem, digits = 2): string {
  return convert(metres, 'length', 'SI', units).toFixed(digits)
}

/** "2026-03-12" from an ISO timestamp (UTC date). */
export function isoDate(iso: string): string {
  return iso.slice(0, 10)
}

/** Nice upper end of a stress axis, kPa in, in display units out (value and step). */
export function niceAxis(max: number): { max: number, step: number } {
  const m = Math.max(max, 1)
  const raw = m / 3
  const mag = 10 ** Math.floor(Math.log10(raw))
  const step = [1, 2, 2.5, 5, 10].map(f => f * mag).find(s => s >= raw) ?? 10 * mag
  return { max: Math.ceil(m / step) * step, step }
}

/** The stress axes for the whole log (every page uses the same), in display units. */
export function stressAxes(data: PointLogData): { stress: { max: number, step: number }, ocr: { max: number, step: number } } {
  const s = data.stress
  const toU = (kPa: number) => convert(kPa, 'stress', 'SI', data.units, { usStress: data.usStress })
  const depthOk = (d: number) => d <= data.point.finalDepth + 1e-9
  const values = [
    ...s.profile.filter(p => depthOk(p.depth)).map(p => p.effectiveStress),
    ...s.trend.flat().filter(p => depthOk(p.depth)).map(p => p.preconsolidation),
    ...s.points.map(p => p.preconsolidation),
  ].filter(Number.isFinite)
  const ocrs = [
    ...s.points.filter(p => p.effectiveStress && p.effectiveStress > 0).map(p => p.preconsolidation / p.effectiveStress!),
    ...s.trend.flat().filter(p => p.effectiveStress > 0 && depthOk(p.depth)).map(p => p.preconsolidation / p.effectiveStress),
  ].filter(Number.isFinite)
  // OCR near the surface runs to large values; the axis stops at 8 and marks beyond it sit on the edge.
  const ocrMax = Math.min(8, Math.max(2, ...ocrs))
  return { stress: niceAxis(toU(Math.max(0, ...values))), ocr: { max: Math.ceil(ocrMax), step: ocrMax > 4 ? 2 : 1 } }
}

function patternDefs(prefix: string, looks: Map<string, { colour: string, pattern: string }>): string {
  let out = ''
  for (const [id, keys] of looks) {
    const colour = stratumColour(keys.colour) ?? stratumColour(FALLBACK_APPEARANCE.colour)!
    const pattern = stratumPattern(keys.pattern) ?? stratumPattern(FALLBACK_APPEARANCE.pattern)!
    const size = pattern.size * 0.75
    out += `<pattern id="${prefix}${id}" width="${size}" height="${size}" patternUnits="userSpaceOnUse">`
      + `<rect width="${size}" height="${size}" fill="${colour.hex}"/>`
      + `<g transform="scale(0.75)">${pattern.svg.replace(/currentColor/g, colour.ink)}</g></pattern>`
  }
  return out
}

/** The key entry of an interval's fill: its stratum code, else its USCS symbol (or "unknown"). */
export function stratumKey(iv: Pick<LogInterval, 'stratum' | 'uscs'>): string {
  return iv.stratum ? `stratum:${iv.stratum.code}` : `uscs:${iv.uscs ?? ''}`
}

/** The look of an interval: its stratum's, else a suggestion from the USCS symbol. */
export function intervalLook(iv: Pick<LogInterval, 'stratum' | 'uscs'>): { colour: string, pattern: string } {
  return iv.stratum ? { colour: iv.stratum.colour, pattern: iv.stratum.pattern } : defaultAppearanceFor(iv.uscs ?? '')
}

export interface LogPageSvg { svg: string, width: number, height: number }

export interface LogPageOptions {
  scale: LogScale
  from: number
  to: number
  /** Unique per document (pattern ids of several pages inlined in one HTML page must not clash). */
  idPrefix?: string
  axes?: ReturnType<typeof stressAxes>
}

/** One page's drawing: the columns from depth `from` to `to` (m) at 1:scale. */
export function pointLogPageSvg(data: PointLogData, o: LogPageOptions): LogPageSvg {
  const ppm = ptPerMetre(o.scale)
  const units = data.units
  const lenU = unitLabel('length', units)
  const stressU = unitLabel('stress', units, { usStress: data.usStress })
  const axes = o.axes ?? stressAxes(data)
  const prefix = o.idPrefix ?? 'plog'
  const drawH = (o.to - o.from) * ppm
  const H = LOG_HEAD + drawH + LOG_FOOT
  const y = (d: number) => LOG_HEAD + (d - o.from) * ppm
  const within = (d: number) => d >= o.from - 1e-9 && d <= o.to + 1e-9
  const C = LOG_COLUMNS
  const parts: string[] = []
  const gl = data.point.groundElevation

  // Column heads: a tide rule under short names; units on a second line.
  const heads: [number, number, string, string][] = [
    [C.ruler.x0, C.ruler.x1, 'Depth  Elev.', lenU],
    [C.strata.x0, C.strata.x1, 'Strata', 'USCS'],
    [C.description.x0, C.description.x1, 'Description', ''],
    [C.samples.x0, C.samples.x1, 'Samples · tests', 'ref · SPT'],
    [C.water.x0, C.water.x1, 'Water', 'date'],
    [C.stress.x0, C.stress.x1, "σ'v0 · σ'p", stressU],
    [C.ocr.x0, C.ocr.x1, 'OCR', ''],
  ]
  for (const [x0, x1, h, sub] of heads) {
    const left = x0 === C.description.x0
    const ax = left ? x0 : (x0 + x1) / 2
    const anchor = left ? 'start' : 'middle'
    parts.push(text(ax, 9, h, `font-size="7.5" font-weight="bold" fill="${LOG_INK.tideDark}" text-anchor="${anchor}"`))
    if (sub && x0 !== C.stress.x0 && x0 !== C.ocr.x0) parts.push(text(ax, 17, sub, `font-size="6.5" fill="${LOG_INK.silt}" text-anchor="${anchor}"`))
  }
  parts.push(`<path d="M0,${LOG_HEAD - 1}H${LOG_WIDTH}" stroke="${LOG_INK.tide}" stroke-width="1"/>`)
  // Light lane separators.
  const lanes = [C.strata.x1 + 2.5, C.description.x1 + 2.5, C.samples.x1 + 2, C.water.x1 + 4]
  for (const x of lanes) parts.push(`<path d="M${x},${LOG_HEAD}V${LOG_HEAD + drawH}" stroke="${LOG_INK.siltLight}" stroke-width="0.8"/>`)

  // Ruler: depth (bold) and elevation (silt) at each tick, in the project's length unit.
  const f = convert(1, 'length', 'SI', units)
  const step = [0.5, 1, 2, 5, 10, 20, 50].find(s => (s / f) * ppm >= 18) ?? 100
  parts.push(`<path d="M${C.ruler.x1},${LOG_HEAD}V${LOG_HEAD + drawH}" stroke="${LOG_INK.text}" stroke-width="0.8"/>`)
  for (let dU = Math.ceil((o.from * f) / step - 1e-9) * step; dU <= o.to * f + 1e-9; dU += step) {
    const yy = y(dU / f)
    const digits = step < 1 ? 1 : 0
    parts.push(`<path d="M${C.ruler.x1 - 4},${round2(yy)}H${C.ruler.x1}" stroke="${LOG_INK.text}" stroke-width="0.8"/>`)
    // The top tick's labels sit under the head rule, the bottom one's above the foot.
    const ty = yy - LOG_HEAD < 4 ? yy + 6 : yy + 2.5
    parts.push(text(16, ty, dU.toFixed(digits), `font-size="7.5" font-weight="bold" fill="${LOG_INK.text}" text-anchor="end"`))
    parts.push(text(C.ruler.x1 - 5, ty, (gl * f - dU).toFixed(1), `font-size="6" fill="${LOG_INK.silt}" text-anchor="end"`))
  }

  // Strata: fill and pattern per interval, the USCS symbol on a white chip, unlogged depths hatched.
  const looks = new Map<string, { colour: string, pattern: string }>()
  const clip = (a: number, b: number) => [Math.max(a, o.from), Math.min(b, o.to)] as const
  for (const iv of data.intervals) {
    const [a, b] = clip(iv.top, iv.bottom)
    if (b <= a) continue
    const look = intervalLook(iv)
    const id = `${look.colour}-${look.pattern}`
    looks.set(id, look)
    parts.push(`<rect x="${C.strata.x0}" y="${round2(y(a))}" width="${C.strata.x1 - C.strata.x0}" height="${round2(Math.max(0.5, (b - a) * ppm))}" data-key="${stratumKey(iv)}" fill="url(#${prefix}${id})" stroke="${LOG_INK.text}" stroke-width="0.6"/>`)
    const label = [iv.uscs, iv.stratum?.code].filter(Boolean).join(' ')
    if (label && (b - a) * ppm >= 11) {
      const cy = (y(a) + y(b)) / 2
      const w = Math.min(C.strata.x1 - C.strata.x0 - 4, label.length * 3.6 + 6)
      const cx = (C.strata.x0 + C.strata.x1) / 2
      parts.push(`<rect x="${round2(cx - w / 2)}" y="${round2(cy - 5)}" width="${round2(w)}" height="10" rx="5" fill="${LOG_INK.white}" fill-opacity="0.9"/>`)
      parts.push(text(cx, cy + 2.5, label, `font-size="6.5" font-weight="bold" fill="${LOG_INK.text}" text-anchor="middle"`))
    }
  }
  for (const g of data.gaps) {
    const [a, b] = clip(g.top, g.bottom)
    if (b <= a) continue
    let hatch = ''
    for (let yy = y(a); yy < y(b); yy += 4) hatch += `M${C.strata.x0},${round2(Math.min(yy + 4, y(b)))}L${C.strata.x1},${round2(yy)}`
    parts.push(`<rect data-key="gap" x="${C.strata.x0}" y="${round2(y(a))}" width="${C.strata.x1 - C.strata.x0}" height="${round2((b - a) * ppm)}" fill="${LOG_INK.white}" stroke="${LOG_INK.silt}" stroke-width="0.6" stroke-dasharray="2 1.5"/>`)
    parts.push(`<path d="${hatch}" stroke="${LOG_INK.silt}" stroke-width="0.5"/>`)
  }

  // Descriptions: each starts at its interval's top (or the page top when it continues), pushed down clear of the one above.
  const descWidth = C.description.x1 - C.description.x0
  const blocks: { id: string, want: number, lines: string[], top: number }[] = []
  data.intervals.forEach((iv, i) => {
    const [a, b] = clip(iv.top, iv.bottom)
    if (b <= a) return
    const continued = iv.top < o.from - 1e-9
    const extra = [iv.consistency, iv.moisture].filter(Boolean).join(', ')
    const body = `${iv.description}${extra ? ` (${extra})` : ''}`.trim() || '(no description)'
    const head = `${lengthText(iv.top, units)}–${lengthText(iv.bottom, units)}`
    const lines = wrapText(continued ? `(continued) ${body}` : `${head}  ${body}`, descWidth, DESC_SIZE)
    blocks.push({ id: `d${i}`, want: y(a) + 1.5, lines, top: y(a) })
  })
  for (const g of data.gaps) {
    const [a, b] = clip(g.top, g.bottom)
    if (b > a) blocks.push({ id: `g${g.top}`, want: y(a) + 1.5, lines: [`${lengthText(g.top, units)}–${lengthText(g.bottom, units)}  Not logged`], top: y(a) })
  }
  const placedDesc = placeLabels(blocks.map(bl => ({ id: bl.id, want: bl.want, height: bl.lines.length * DESC_LINE })), LOG_HEAD + 1, LOG_HEAD + drawH, 1.5)
  const blockById = new Map(blocks.map(b => [b.id, b]))
  for (const p of placedDesc) {
    const bl = blockById.get(p.id)
    if (!bl) continue
    // The boundary across the description lane, and a leader when the text had to move down.
    parts.push(`<path d="M${C.strata.x1},${round2(bl.top)}H${C.description.x0 + 10}" stroke="${LOG_INK.silt}" stroke-width="0.5"/>`)
    if (p.y - bl.want > 3) parts.push(`<path d="M${C.description.x0 + 10},${round2(bl.top)}L${C.description.x0 + 16},${round2(p.y)}" stroke="${LOG_INK.silt}" stroke-width="0.4"/>`)
    bl.lines.forEach((ln, k) => {
      const isHead = k === 0 && !p.id.startsWith('g') && !ln.startsWith('(continued)')
      const italic = p.id.startsWith('g') || ln.startsWith('(continued)')
      parts.push(text(C.description.x0, p.y + 6 + k * DESC_LINE, ln, `font-size="${DESC_SIZE}" fill="${LOG_INK.text}"${italic ? ' font-style="italic"' : ''}${isHead ? '' : ''}`))
    })
  }

  // Samples over their length with their references; SPT at its depth with its count or refusal.
  const sx = C.samples.x0 + 1
  const sampleLabels: { id: string, want: number, anchor: number, text: string }[] = []
  data.samples.forEach((s, i) => {
    if (!(s.bottom >= o.from && s.top <= o.to)) return
    const [a, b] = clip(s.top, s.bottom)
    parts.push(logGlyphMarkup(sampleGlyph(s.type, SAMPLE_MARK_WIDTH, Math.max(4, (b - a) * ppm)), sx, y(a), `sample:${s.type}`))
    const mid = (y(a) + y(b)) / 2
    sampleLabels.push({ id: `s${i}`, want: mid - LABEL_LINE / 2, anchor: mid, text: `${s.identifier}  ${lengthText(s.top, units)}–${lengthText(s.bottom, units)}` })
  })
  data.spt.forEach((t, i) => {
    if (!within(t.depth)) return
    const yy = y(t.depth)
    parts.push(logGlyphMarkup(sptGlyph(t.penetration !== null), sx + 18, yy, t.penetration !== null ? 'spt:refusal' : 'spt:full'))
    sampleLabels.push({ id: `t${i}`, want: yy - LABEL_LINE / 2, anchor: yy, text: sptLabel(t) })
  })
  const placedSamples = placeLabels(sampleLabels.map(l => ({ id: l.id, want: l.want, height: LABEL_LINE })), LOG_HEAD + 1, LOG_HEAD + drawH + LOG_FOOT - 2, 0.5)
  const labelById = new Map(sampleLabels.map(l => [l.id, l]))
  for (const p of placedSamples) {
    const l = labelById.get(p.id)
    if (!l) continue
    const isSpt = p.id.startsWith('t')
    const lx = sx + (isSpt ? 25 : 11)
    if (Math.abs(p.y + LABEL_LINE / 2 - l.anchor) > 2) parts.push(`<path d="M${lx - 3},${round2(l.anchor)}L${lx - 1},${round2(p.y + LABEL_LINE / 2)}" stroke="${LOG_INK.silt}" stroke-width="0.4"/>`)
    parts.push(text(lx, p.y + 6, l.text, `font-size="${LABEL_SIZE}" fill="${isSpt ? LOG_INK.ochreDark : LOG_INK.tideDark}"${isSpt ? ' font-weight="bold"' : ''}`))
  }

  // Water levels with their dates; labels never overlap.
  const levels = data.groundwater.map((w, i) => ({ w, i })).filter((e): e is { w: LogWater & { depth: number }, i: number } => e.w.depth !== null && within(e.w.depth))
  const waterWishes = levels.map(({ w, i }) => ({ id: `w${i}`, want: y(w.depth) - LABEL_LINE / 2 - 2.5, height: LABEL_LINE + 1.5 }))
  const placedWater = placeLabels(waterWishes, LOG_HEAD + 1, LOG_HEAD + drawH + LOG_FOOT - 2, 0.5)
  for (const { w, i } of levels) {
    // A short level tick at the true depth; the mark and its date where the label could go, joined by a leader.
    const p = placedWater.find(q => q.id === `w${i}`)
    if (!p) continue
    const ly = p.y + LABEL_LINE / 2 + 2.5
    parts.push(`<path d="M${C.water.x0},${round2(y(w.depth))}H${C.water.x0 + 4}" stroke="${LOG_INK.water}" stroke-width="1.3"/>`)
    if (Math.abs(ly - y(w.depth)) > 1) parts.push(`<path d="M${C.water.x0 + 4},${round2(y(w.depth))}L${C.water.x0 + 6},${round2(ly)}" stroke="${LOG_INK.water}" stroke-width="0.5"/>`)
    parts.push(logGlyphMarkup(waterGlyph(w.kind), C.water.x0 + 6, ly, `water:${w.kind}`))
    parts.push(text(C.water.x0 + 18, ly - 1, `${isoDate(w.observedAt)} ${lengthText(w.depth, units)}`, `font-size="6" fill="${LOG_INK.water}"`))
  }

  // Stress-history strip: σ'v0, the adopted trend, σ'p points; then the OCR strip.
  const sx0 = C.stress.x0
  const sw = C.stress.x1 - C.stress.x0
  const ox0 = C.ocr.x0
  const ow = C.ocr.x1 - C.ocr.x0
  parts.push(`<rect x="${sx0}" y="${LOG_HEAD}" width="${sw}" height="${round2(drawH)}" fill="${LOG_INK.siltLight}" fill-opacity="0.45"/>`)
  parts.push(`<rect x="${ox0}" y="${LOG_HEAD}" width="${ow}" height="${round2(drawH)}" fill="${LOG_INK.siltLight}" fill-opacity="0.45"/>`)
  const toU = (kPa: number) => convert(kPa, 'stress', 'SI', units, { usStress: data.usStress })
  const xs = (kPa: number) => sx0 + Math.min(1, Math.max(0, toU(kPa) / axes.stress.max)) * sw
  const xo = (ocr: number) => ox0 + Math.min(1, Math.max(0, ocr / axes.ocr.max)) * ow
  const s = data.stress
  if (s.available) {
    // Axis ticks in the head row (stress) and faint grid lines.
    for (let v = 0; v <= axes.stress.max + 1e-9; v += axes.stress.step) {
      const x = sx0 + (v / axes.stress.max) * sw
      parts.push(`<path d="M${round2(x)},${LOG_HEAD - 4}V${round2(LOG_HEAD + drawH)}" stroke="${LOG_INK.white}" stroke-width="0.8"/>`)
      const last = v + axes.stress.step > axes.stress.max + 1e-9
      if (v === 0 || last || axes.stress.max / axes.stress.step <= 4) parts.push(text(x, LOG_HEAD - 5, String(round2(v)), `font-size="5.5" fill="${LOG_INK.silt}" text-anchor="${v === 0 ? 'start' : last ? 'end' : 'middle'}"`))
    }
    parts.push(text(sx0 + sw / 2, 17, stressU, `font-size="6.5" fill="${LOG_INK.silt}" text-anchor="middle"`))
    for (let v = 0; v <= axes.ocr.max + 1e-9; v += axes.ocr.step) {
      const x = ox0 + (v / axes.ocr.max) * ow
      parts.push(`<path d="M${round2(x)},${LOG_HEAD - 4}V${round2(LOG_HEAD + drawH)}" stroke="${LOG_INK.white}" stroke-width="0.8"/>`)
      if (v === 0 || v + axes.ocr.step > axes.ocr.max + 1e-9) parts.push(text(x, LOG_HEAD - 5, String(v), `font-size="5.5" fill="${LOG_INK.silt}" text-anchor="${v === 0 ? 'start' : 'end'}"`))
    }
    if (axes.ocr.max >= 1) {
      const x1 = xo(1)
      parts.push(`<path d="M${round2(x1)},${LOG_HEAD}V${round2(LOG_HEAD + drawH)}" stroke="${LOG_INK.silt}" stroke-width="0.5" stroke-dasharray="1.5 1.5"/>`)
    }
  }
  if (!s.available) {
    // The reason in full is under the key; the strip says what is missing.
    const lines = wrapText(`σ'v0 unavailable. ${s.model}`, sw + ow, 6.5).slice(0, 8)
    lines.forEach((ln, k) => parts.push(text(sx0 + 2, LOG_HEAD + 10 + k * 7.5, ln, `font-size="6.5" font-style="italic" fill="${LOG_INK.silt}"`)))
  }
  else {
    const line = (pts: { depth: number, v: number }[], x: (v: number) => number, stroke: string, width: number, key: string) => {
      const inPage = pts.filter(p => within(p.depth))
      if (inPage.length < 2) return
      const d = inPage.map((p, k) => `${k ? 'L' : 'M'}${round2(x(p.v))},${round2(y(p.depth))}`).join('')
      parts.push(`<path data-key="${key}" d="${d}" fill="none" stroke="${stroke}" stroke-width="${width}"/>`)
    }
    line(s.profile.map(p => ({ depth: p.depth, v: p.effectiveStress })), xs, LOG_INK.tideDark, 1.1, 'line:sv0')
    for (const run of s.trend) {
      line(run.map(p => ({ depth: p.depth, v: p.preconsolidation })), xs, LOG_INK.ochre, 1.3, 'line:trend')
      line(run.filter(p => p.effectiveStress > 0).map(p => ({ depth: p.depth, v: p.preconsolidation / p.effectiveStress })), xo, LOG_INK.ochre, 1.1, 'line:trend')
    }
    for (const p of s.points) {
      if (!within(p.depth)) continue
      const kind = sigmaPMarkOf(p.source, p.qualityClass)
      const mark = sigmaPGlyph(kind)
      parts.push(logGlyphMarkup(mark, xs(p.preconsolidation), y(p.depth), `sigmap:${kind}`))
      if (p.effectiveStress && p.effectiveStress > 0) parts.push(logGlyphMarkup(mark, xo(p.preconsolidation / p.effectiveStress), y(p.depth), `sigmap:${kind}`))
    }
  }

  // End of the log, when on this page.
  const fd = data.point.finalDepth
  if (within(fd)) {
    parts.push(`<path d="M${C.strata.x0 - 3},${round2(y(fd))}H${C.strata.x1 + 3}" stroke="${LOG_INK.text}" stroke-width="1.8"/>`)
    parts.push(text(C.strata.x0, y(fd) + 9, `End ${lengthText(fd, units)} ${lenU}`, `font-size="6.5" font-weight="bold" fill="${LOG_INK.text}"`))
  }
  else {
    parts.push(text(C.strata.x0, LOG_HEAD + drawH + 9, `continued on the next page`, `font-size="6" font-style="italic" fill="${LOG_INK.silt}"`))
  }

  const defs = `<defs>${patternDefs(prefix, looks)}</defs>`
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${LOG_WIDTH}" height="${round2(H)}" viewBox="0 0 ${LOG_WIDTH} ${round2(H)}">${defs}${parts.join('')}</svg>`
  return { svg, width: LOG_WIDTH, height: H }
}
