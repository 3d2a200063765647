import type { Content, TDocumentDefinitions } from 'pdfmake/interfaces'
import type { GroundwaterKind, PointKind, SampleType } from '../investigation/types'
import {
  LOG_INK, logGlyphMarkup, SAMPLE_MARK_WIDTH, SAMPLE_WORDS, sampleGlyph, SIGMA_P_WORDS, sigmaPGlyph, sigmaPMarkOf, type SigmaPMark, sptGlyph, waterGlyph, WATER_WORDS,
} from '../plots/log-glyphs'
import {
  escapeXml, intervalLook, lengthText, LOG_FOOT, LOG_HEAD, LOG_WIDTH, pointLogPageSvg, type PointLogData, stratumKey, stressAxes,
} from '../plots/point-log'
import { stratumColour, stratumPattern, FALLBACK_APPEARANCE } from '../strata/appearance'
import { unitLabel } from '../units'
import { type LogPage, type LogScale, paginateLog, wrapText } from './point-log-layout'
import { REPORT_INK, REPORT_MARGINS, reportDocument, type ReportHeader } from './sheet'

/**
 * The point log report: Pastload's stress-history log of one borehole, CPT or test pit, paginated by depth
 * at 1:50, 1:100 or 1:200. Each page: the sheet's header strip, the point's facts band, the drawing of its
 * depth range (`shared/plots/point-log.ts`); after the last drawing the key of every mark used, the stress
 * model the strip comes from, and the remarks. Pure: data in, pdfmake document out.
 */

export const POINT_LOG_TITLE = 'Stress-history log'

export const POINT_KIND_WORDS: Record<PointKind, string> = {
  'borehole': 'borehole',
  'cpt': 'CPT sounding',
  'test-pit': 'test pit',
  'piezometer': 'piezometer',
}

/** A4 portrait body height in pt (the header strip and footer live in the margins). */
const BODY_HEIGHT = 841.89 - REPORT_MARGINS[1] - REPORT_MARGINS[3]
/** The facts band over each page's drawing, pt (with its gap). */
export const FACTS_HEIGHT = 38
/** Height left for depth on each page, pt. */
export const LOG_DRAW_HEIGHT = Math.floor(BODY_HEIGHT - FACTS_HEIGHT - LOG_HEAD - LOG_FOOT - 14)

export function pointLogPages(finalDepth: number, scale: LogScale): LogPage[] {
  return paginateLog(finalDepth, scale, LOG_DRAW_HEIGHT)
}

export interface KeyEntry {
  /** The `data-key` the drawing gives the mark. */
  key: string
  label: string
  /** A small SVG of the mark. */
  svg: string
  width: number
  height: number
}

/** The markup inside a swatch's `<svg>` (to place it in the key's one drawing). */
function swatchInner(svg: string): string {
  return svg.replace(/^<svg[^>]*>/, '').replace(/<\/svg>$/, '')
}

const KEY_COLUMNS = 3
const KEY_ROW = 19
const KEY_FONT = 7

/**
 * The key as one SVG (the PDF embeds one drawing rather than one per mark): three columns of a swatch and
 * its words, wrapped to two lines.
 */
export function pointLogKeySvg(entries: readonly KeyEntry[], width: number): { svg: string, height: number } {
  const colW = width / KEY_COLUMNS
  const rows = Math.ceil(entries.length / KEY_COLUMNS)
  const height = rows * KEY_ROW + 2
  const parts = entries.map((e, i) => {
    const x = (i % KEY_COLUMNS) * colW
    const y = Math.floor(i / KEY_COLUMNS) * KEY_ROW + 1
    const sx = x + (26 - e.width) / 2
    const sy = y + (KEY_ROW - 2 - e.height) / 2
    const lines = wrapText(e.label, colW - 34, KEY_FONT).slice(0, 2)
    const ty = lines.length === 1 ? y + 10.5 : y + 6.5
    const words = lines.map((ln, k) => `<text x="${(x + 30).toFixed(2)}" y="${(ty + k * 8).toFixed(2)}" font-family="SourceSans3" font-size="${KEY_FONT}" fill="${LOG_INK.text}">${escapeXml(ln)}</text>`).join('')
    return `<g data-key="${e.key}" transform="translate(${sx.toFixed(2)},${sy.toFixed(2)})">${swatchInner(e.svg)}</g>${words}`
  })
  return { svg: `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">${parts.join('')}</svg>`, height }
}

function swatchSvg(inner: string, w: number, h: number): string {
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}" viewBox="0 0 ${w} ${h}">${inner}</svg>`
}

function fillSwatch(look: { colour: string, pattern: string }, id: string): string {
  const colour = stratumColour(look.colour) ?? stratumColour(FALLBACK_APPEARANCE.colour)!
  const pattern = stratumPattern(look.pattern) ?? stratumPattern(FALLBACK_APPEARANCE.pattern)!
  const s = pattern.size * 0.75
  const defs = `<defs><pattern id="${id}" width="${s}" height="${s}" patternUnits="userSpaceOnUse"><rect width="${s}" height="${s}" fill="${colour.hex}"/><g transform="scale(0.75)">${pattern.svg.replace(/currentColor/g, colour.ink)}</g></pattern></defs>`
  return swatchSvg(`${defs}<rect x="0.5" y="0.5" width="23" height="11" fill="url(#${id})" stroke="${LOG_INK.text}" stroke-width="0.6"/>`, 24, 12)
}

/** Every mark the log draws, each once, in the order of the columns: the key is complete by construction and checked by test. */
export function pointLogKey(data: PointLogData, idPrefix = 'plkey'): KeyEntry[] {
  const out: KeyEntry[] = []
  const seen = new Set<string>()
  const add = (e: KeyEntry) => {
    if (seen.has(e.key)) return
    seen.add(e.key)
    out.push(e)
  }
  data.intervals.forEach((iv, i) => {
    const key = stratumKey(iv)
    const label = iv.stratum ? `${iv.stratum.code} ${iv.stratum.name}` : `${iv.uscs ?? 'No symbol'}: no stratum assigned (look from the USCS symbol)`
    add({ key, label, svg: fillSwatch(intervalLook(iv), `${idPrefix}f${i}`), width: 24, height: 12 })
  })
  if (data.gaps.length) add({ key: 'gap', label: 'Not logged', svg: swatchSvg(`<rect x="0.5" y="0.5" width="23" height="11" fill="#fff" stroke="${LOG_INK.silt}" stroke-width="0.6" stroke-dasharray="2 1.5"/><path d="M0,12L12,0M8,12L20,0M16,12L24,4" stroke="${LOG_INK.silt}" stroke-width="0.5"/>`, 24, 12), width: 24, height: 12 })
  const types = new Set<SampleType>(data.samples.map(s => s.type))
  for (const t of Object.keys(SAMPLE_WORDS) as SampleType[]) {
    if (!types.has(t)) continue
    add({ key: `sample:${t}`, label: `${SAMPLE_WORDS[t]} sample (over its length), with its reference`, svg: swatchSvg(logGlyphMarkup(sampleGlyph(t, SAMPLE_MARK_WIDTH, 14), 3, 1), 14, 16), width: 14, height: 16 })
  }
  if (data.spt.some(s => s.penetration === null)) add({ key: 'spt:full', label: 'SPT: N, blows for the 300 mm test drive', svg: swatchSvg(logGlyphMarkup(sptGlyph(false), 7, 6), 14, 12), width: 14, height: 12 })
  if (data.spt.some(s => s.penetration !== null)) add({ key: 'spt:refusal', label: 'SPT stopped short: blows / penetration, as written', svg: swatchSvg(logGlyphMarkup(sptGlyph(true), 7, 6), 14, 12), width: 14, height: 12 })
  const kinds = new Set<GroundwaterKind>(data.groundwater.filter(w => w.depth !== null).map(w => w.kind))
  for (const k of Object.keys(WATER_WORDS) as GroundwaterKind[]) {
    if (kinds.has(k)) add({ key: `water:${k}`, label: `${WATER_WORDS[k]}, with date and depth`, svg: swatchSvg(logGlyphMarkup(waterGlyph(k), 2, 11), 14, 13), width: 14, height: 13 })
  }
  if (data.stress.available) {
    if (data.stress.profile.length >= 2) add({ key: 'line:sv0', label: "σ'v0 from the stress model", svg: swatchSvg(`<path d="M1,6H23" stroke="${LOG_INK.tideDark}" stroke-width="1.1"/>`, 24, 12), width: 24, height: 12 })
    if (data.stress.trend.some(r => r.length >= 2)) add({ key: 'line:trend', label: "Adopted σ'p trend (and its OCR)", svg: swatchSvg(`<path d="M1,6H23" stroke="${LOG_INK.ochre}" stroke-width="1.3"/>`, 24, 12), width: 24, height: 12 })
    const marks = new Set<SigmaPMark>(data.stress.points.map(p => sigmaPMarkOf(p.source, p.qualityClass)))
    for (const m of Object.keys(SIGMA_P_WORDS) as SigmaPMark[]) {
      if (marks.has(m)) add({ key: `sigmap:${m}`, label: `${SIGMA_P_WORDS[m]} (and its OCR)`, svg: swatchSvg(logGlyphMarkup(sigmaPGlyph(m), 7, 6), 14, 12), width: 14, height: 12 })
    }
  }
  return out
}

/** The `data-key` marks in an SVG string (what the drawing really used). */
export function keysDrawn(svg: string): Set<string> {
  return new Set([...svg.matchAll(/data-key="([^"]*)"/g)].map(m => m[1]!))
}

function fmtDate(d: string | null): string {
  return d ? d.slice(0, 10) : '—'
}

function factsBand(data: PointLogData, page: LogPage, pages: number, scale: LogScale): Content {
  const p = data.point
  const u = data.units
  const lu = unitLabel('length', u)
  const runs = (label: string, value: string, last = false) => [{ text: `${label} `, color: REPORT_INK.silt, fontSize: 6.5 }, { text: last ? value : `${value}     `, fontSize: 8 }]
  const base = p.groundElevation - p.finalDepth
  return {
    margin: [0, 0, 0, 6],
    table: {
      widths: [86, '*', 92],
      body: [[
        {
          fillColor: REPORT_INK.tide,
          margin: [6, 3, 4, 3],
          stack: [
            { text: p.identifier, bold: true, fontSize: 13, color: '#ffffff' },
            { text: POINT_KIND_WORDS[p.kind], fontSize: 7, color: REPORT_INK.tideLight },
          ],
        },
        {
          fillColor: REPORT_INK.siltLight,
          margin: [6, 3, 4, 2],
          stack: [
            { text: [
              ...runs('E', `${lengthText(p.easting, u)} ${lu}`), ...runs('N', `${lengthText(p.northing, u)} ${lu}`),
              ...runs('ground', `${lengthText(p.groundElevation, u)} ${lu}`), ...runs('depth', `${lengthText(p.finalDepth, u)} ${lu}`),
              ...runs('base', `${lengthText(base, u)} ${lu}`, true),
            ] },
            { text: [...runs('dates', `${fmtDate(p.startedOn)} → ${fmtDate(p.endedOn)}`), ...runs('logged by', p.loggedBy || '—', true)] },
            { text: runs('method', p.method || '—', true) },
          ],
        },
        {
          fillColor: REPORT_INK.ochreLight,
          margin: [6, 3, 4, 2],
          stack: [
            { text: [{ text: 'scale ', fontSize: 6.5, color: REPORT_INK.silt }, { text: `1:${scale}`, bold: true, fontSize: 10 }] },
            { text: `${lengthText(page.from, u)}–${lengthText(page.to, u)} ${lu} · part ${page.index + 1}/${pages}`, fontSize: 7 },
          ],
        },
      ]],
    },
    layout: 'noBorders',
  }
}

function keyContent(data: PointLogData): Content[] {
  const entries = pointLogKey(data)
  const out: Content[] = [{ text: 'Key', style: 'subsection', margin: [0, 4, 0, 2] }]
  if (entries.length) out.push({ svg: pointLogKeySvg(entries, LOG_WIDTH).svg, width: LOG_WIDTH })
  out.push({ text: `Stresses: ${data.stress.model}`, fontSize: 7, color: REPORT_INK.silt, margin: [0, 3, 0, 0] })
  out.push({ text: `Depths below ground level; elevations on the site datum; local grid coordinates. OCR = σ'p / σ'v0 at the same depth.`, fontSize: 7, color: REPORT_INK.silt })
  if (data.point.remarks.trim()) {
    out.push({ text: 'Remarks', style: 'subsection', margin: [0, 4, 0, 1] })
    out.push({ text: data.point.remarks, fontSize: 8 })
  }
  return out
}

export interface PointLogSheetOptions {
  scale: LogScale
  revision: string | null
  prepared?: ReportHeader['prepared']
  approvedRecord?: boolean
}

/** The whole report. */
export function pointLogDocument(data: PointLogData, o: PointLogSheetOptions): { doc: TDocumentDefinitions, pages: LogPage[] } {
  const pages = pointLogPages(data.point.finalDepth, o.scale)
  const axes = stressAxes(data)
  const content: Content[] = []
  pages.forEach((pg, i) => {
    const { svg } = pointLogPageSvg(data, { scale: o.scale, from: pg.from, to: pg.to, axes, idPrefix: `p${i}-` })
    content.push({ stack: [factsBand(data, pg, pages.length, o.scale), { svg, width: LOG_WIDTH }], ...(i ? { pageBreak: 'before' as const } : {}) })
  })
  content.push(...keyContent(data))
  const header: ReportHeader = {
    project: data.project,
    title: POINT_LOG_TITLE,
    subject: `${data.point.identifier} · ${POINT_KIND_WORDS[data.point.kind]}`,
    revision: o.revision,
    prepared: o.prepared ?? null,
    units: data.units,
    usStress: data.usStress,
    // A log is a record of what was found, not a design version: no band.
    approvedRecord: o.approvedRecord ?? true,
  }
  return { doc: reportDocument(header, content), pages }
}

/** The download name: job, point, log, scale. */
export function pointLogFilename(jobNumber: string, identifier: string, scale: LogScale): string {
  return `${jobNumber}_${identifier}_log_1-${scale}.pdf`
}

export { escapeXml }
