import type { Content, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces'
import type { TrendBandPoint } from '../geotech/trend-model'
import { modelDrawing, type DrawingPoint } from '../plots/model-drawing'
import { groundDrawing } from '../plots/model-ground'
import { VERDICT_LABELS, type FlagVerdict } from '../review/flags'
import type { DefinitionChange } from '../site-model/diff'
import { COMPRESSIBILITY_KEYS, COMPRESSIBILITY_LABELS, type SiteModelDefinition, stratumBounds } from '../site-model/definition'
import type { ProfilePoint } from '../types/calc'
import { convert, unitLabel, type ConvertOptions, type Quantity, type UnitSystem, type UsStressUnit } from '../units'
import { REPORT_INK, reportDocument, type ReportSignOff } from './sheet'
import { TREND_MODEL_LABELS, TREND_PARAMETERS, trendParameterLabel } from '../site-model/trend-words'

/**
 * The site-model version report: cover with the approval record and content hash, strata and unit
 * weights, groundwater and the pore-pressure profile (tables, then drawn: strata, γ / γsat and u against
 * depth beside the hydrostatic line, `model-ground.ts`), the whole-depth drawing and one per stratum (the
 * model canvas's tracks: σv, u, σ'v0, σ'p points included and left out, the trend and its band, OCR,
 * POP), the trend parameters, compressibility, the reviewer flags in force and what changed since the
 * previous approved version. Pure: plain data in, a pdfmake document definition out.
 */

export const MODEL_VERSION_REPORT_TITLE = 'Site-model version'

export interface ModelVersionReportFlag {
  verdict: FlagVerdict
  /** What the flag is on, in words ("BH-03 oedometer σ'p at 6.20 m"). */
  target: string
  comment: string
  /** The flag's standing now (it was open when the version was saved). */
  statusNow: string
}

export interface ModelVersionReportData {
  project: { name: string, jobNumber: string, client: string, units: UnitSystem, usStress?: UsStressUnit }
  model: { name: string }
  version: { number: number, status: string, message: string, savedBy: string | null, savedAt: string, savedFrom: number | null, superseded: boolean, supersededBy: number | null }
  approval: { by: string | null, at: string, hash: string, override: string | null, overFlags: number } | null
  submitted: { by: string | null, at: string } | null
  definition: SiteModelDefinition
  profile: ProfilePoint[]
  points: (DrawingPoint & { band: number })[]
  fitBands: (TrendBandPoint[] | null)[]
  flags: ModelVersionReportFlag[]
  previousApproved: { version: number, changes: DefinitionChange[], flagsChanged: boolean } | null
  issue: { revision: string, issuedBy: ReportSignOff } | null
}

const DIGITS: Record<Quantity, number> = { length: 2, stress: 1, unitWeight: 1, coefficientOfConsolidation: 2 }

/** A value in the project's units with its unit. */
export function shown(v: number | null | undefined, q: Quantity, units: UnitSystem, digits?: number, opts: ConvertOptions = {}): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—'
  const d = digits ?? (units === 'US' && q === 'stress' && opts.usStress === 'tsf' ? 2 : DIGITS[q])
  return `${convert(v, q, 'SI', units, opts).toFixed(d)} ${unitLabel(q, units, opts)}`
}
const fixed = (v: number | null | undefined, d: number) => (v === null || v === undefined || !Number.isFinite(v) ? '—' : v.toFixed(d))

export function trendParameterText(key: string, v: number, units: UnitSystem, opts: ConvertOptions = {}): string {
  const m = TREND_PARAMETERS[key]
  if (!m || !m.quantity) return v.toFixed(3)
  if (m.perDepth) return `${(convert(v, 'stress', 'SI', units, opts) / convert(1, 'length', 'SI', units)).toFixed(opts.usStress === 'tsf' && units === 'US' ? 3 : 2)} ${unitLabel('stress', units, opts)}/${unitLabel('length', units)}`
  return shown(v, m.quantity, units, undefined, opts)
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']
/** A date as the report prints it: "21 Nov 2026" (UTC). */
export function reportDate(iso: string): string {
  const t = new Date(iso)
  return Number.isNaN(t.getTime()) ? iso : `${t.getUTCDate()} ${MONTHS[t.getUTCMonth()]} ${t.getUTCFullYear()}`
}

const head = (...cells: string[]): TableCell[] => cells.map(text => ({ text, style: 'tableHead' }))
const cell = (text: string, extra: Record<string, unknown> = {}): TableCell => ({ text, style: 'tableCell', ...extra })
const table = (widths: (number | string)[], body: TableCell[][]): Content => ({
  table: { headerRows: 1, widths, body },
  layout: { hLineWidth: () => 0.5, vLineWidth: () => 0, hLineColor: () => REPORT_INK.rule, paddingTop: () => 2, paddingBottom: () => 2 },
  margin: [0, 0, 0, 6],
})

/** Counts of a stratum's points by state. */
function counts(points: ModelVersionReportData['points'], band: number) {
  const c = { included: 0, excluded: 0, flaggedOut: 0 }
  for (const p of points) {
    if (p.band !== band) continue
    if (p.state === 'included') c.included++
    else if (p.state === 'excluded') c.excluded++
    else if (p.state === 'flagged-out') c.flaggedOut++
  }
  return c
}

/** The change list's value in words. */
function changeValue(v: unknown): string {
  if (v === null || v === undefined) return '—'
  if (typeof v === 'number') return String(Math.round(v * 10000) / 10000)
  if (typeof v === 'string' || typeof v === 'boolean') return String(v)
  const s = JSON.stringify(v)
  return s.length > 80 ? `${s.slice(0, 77)}…` : s
}

export function modelVersionDocument(d: ModelVersionReportData): TDocumentDefinitions {
  const u = d.project.units
  // US stresses in psf or tsf as the project chose.
  const uo: ConvertOptions = { usStress: d.project.usStress }
  const def = d.definition
  const bounds = stratumBounds(def)
  const approved = d.version.status === 'approved' && !!d.approval
  const subject = `${d.model.name}, version ${d.version.number}`
  const content: Content[] = []

  // --- cover: the version and its approval record ----------------------------------------------
  content.push({ text: subject, fontSize: 18, bold: true, color: REPORT_INK.tideDark, margin: [0, 6, 0, 2] })
  content.push({ text: `“${d.version.message}” · saved by ${d.version.savedBy ?? 'unknown'}, ${reportDate(d.version.savedAt)}${d.version.savedFrom ? ` · saved from version ${d.version.savedFrom}` : ''}`, fontSize: 9, color: REPORT_INK.silt, margin: [0, 0, 0, 8] })
  const record: Content[] = approved && d.approval
    ? [
        { text: [{ text: 'Approved ', bold: true, color: REPORT_INK.tideDark }, `by ${d.approval.by ?? 'unknown'}, ${reportDate(d.approval.at)}`, d.version.superseded ? ` · superseded by version ${d.version.supersededBy}` : ''], fontSize: 10 },
        { text: 'Content hash (SHA-256 of the definition)', fontSize: 7.5, color: REPORT_INK.silt, margin: [0, 4, 0, 0] },
        { text: d.approval.hash, fontSize: 8.5, characterSpacing: 0.2, color: REPORT_INK.text },
        ...(d.approval.override ? [{ text: `Approved over ${d.approval.overFlags} open flag${d.approval.overFlags === 1 ? '' : 's'}: “${d.approval.override}”`, fontSize: 8.5, margin: [0, 4, 0, 0] } as Content] : []),
      ]
    : [
        { text: [{ text: 'Not approved. ', bold: true, color: REPORT_INK.alert }, `This version is ${d.version.status}${d.submitted ? ` (sent for review by ${d.submitted.by ?? 'unknown'}, ${reportDate(d.submitted.at)})` : ''}. Its values are for discussion, not for design.`], fontSize: 10 },
      ]
  content.push({
    table: { widths: ['*'], body: [[{ stack: record, margin: [8, 6, 8, 6], fillColor: approved ? REPORT_INK.tideLight : REPORT_INK.ochreLight }]] },
    layout: { hLineWidth: () => 0, vLineWidth: (i: number) => (i === 0 ? 3 : 0), vLineColor: () => (approved ? REPORT_INK.tide : REPORT_INK.alert) },
    margin: [0, 0, 0, 8],
  })

  // Strata and unit weights.
  content.push({ text: 'Strata and unit weights', style: 'section' })
  content.push(table([38, '*', 54, 54, 54, 58, 58, 60], [
    head('Code', 'Stratum', `Top (${unitLabel('length', u, uo)})`, `Base (${unitLabel('length', u, uo)})`, `Thick. (${unitLabel('length', u, uo)})`, `γ (${unitLabel('unitWeight', u, uo)})`, `γsat (${unitLabel('unitWeight', u, uo)})`, 'Compressible'),
    ...def.strata.map((s, i) => [
      cell(s.code, { bold: true }), cell(s.name),
      cell(fixed(convert(bounds[i]!.top, 'length', 'SI', u, uo), 2)), cell(fixed(convert(bounds[i]!.bottom, 'length', 'SI', u, uo), 2)), cell(fixed(convert(s.thickness, 'length', 'SI', u, uo), 2)),
      cell(fixed(convert(s.unitWeight, 'unitWeight', 'SI', u, uo), 1)), cell(fixed(convert(s.unitWeightSaturated, 'unitWeight', 'SI', u, uo), 1)), cell(s.compressible ? 'yes' : 'no'),
    ]),
  ]))

  // Groundwater and the pore-pressure profile.
  content.push({ text: 'Groundwater and pore pressure', style: 'section' })
  const gw = def.groundwater
  content.push({ text: `Water table at ${shown(gw.waterTableDepth, 'length', u, undefined, uo)} below ground; γw ${shown(def.gammaW, 'unitWeight', u, 2, uo)}; surcharge ${shown(def.surcharge, 'stress', u, undefined, uo)}. ${gw.piezometers.length ? `${gw.piezometers.length} piezometric control point${gw.piezometers.length === 1 ? '' : 's'} below it (u given; linear between them).` : 'Hydrostatic below the water table.'}`, margin: [0, 0, 0, 4] })
  if (gw.piezometers.length) {
    content.push(table([80, 100], [head(`Depth (${unitLabel('length', u, uo)})`, `u (${unitLabel('stress', u, uo)})`), ...gw.piezometers.map(p => [cell(fixed(convert(p.depth, 'length', 'SI', u, uo), 2)), cell(fixed(convert(p.porePressure, 'stress', 'SI', u, uo), 1))])]))
  }
  content.push({ text: 'Stresses at the profile\'s breakpoints', style: 'subsection' })
  content.push(table([70, '*', 70, 70, 70], [
    head(`Depth (${unitLabel('length', u, uo)})`, 'Stratum', `σv (${unitLabel('stress', u, uo)})`, `u (${unitLabel('stress', u, uo)})`, `σ'v0 (${unitLabel('stress', u, uo)})`),
    ...d.profile.map(p => [cell(fixed(convert(p.depth, 'length', 'SI', u, uo), 2)), cell(p.layer), cell(fixed(convert(p.totalStress, 'stress', 'SI', u, uo), 1)), cell(fixed(convert(p.porePressure, 'stress', 'SI', u, uo), 1)), cell(fixed(convert(p.effectiveStress, 'stress', 'SI', u, uo), 1))]),
  ]))

  // --- drawings: the ground (strata, unit weights, pore pressure), the whole depth, then each stratum ---
  const inner = 595.28 - 72
  const ground = groundDrawing({ definition: def, profile: d.profile, units: u, usStress: d.project.usStress, width: 720, height: 800 })
  content.push({ text: 'Strata, unit weights and pore pressure', style: 'section', pageBreak: 'before' })
  content.push({ text: 'γ applies above the water table and γsat below it (drawn strong where each applies). u is the model\'s water profile — hydrostatic from the water table, linear between the piezometric control points — beside the hydrostatic line.', fontSize: 8.5, color: REPORT_INK.silt, margin: [0, 0, 0, 4] })
  content.push({ svg: ground.svg, width: inner })
  const whole = modelDrawing({ definition: def, profile: d.profile, points: d.points, fitBands: d.fitBands, units: u, usStress: d.project.usStress, width: 720, height: 880 })
  content.push({ text: 'Stress history, whole depth', style: 'section', pageBreak: 'before' })
  content.push({ svg: whole.svg, width: inner })

  def.strata.forEach((s, i) => {
    const b = bounds[i]!
    const c = counts(d.points, i)
    const t = s.trend
    content.push({ text: `${s.code} — ${s.name}`, style: 'section', pageBreak: 'before' })
    content.push({ text: `${shown(b.top, 'length', u, undefined, uo)} to ${shown(b.bottom, 'length', u, undefined, uo)} · σ'p points: ${c.included} fitted, ${c.excluded} left out by the engineer, ${c.flaggedOut} excluded by reviewer flags`, fontSize: 8.5, color: REPORT_INK.silt, margin: [0, 0, 0, 4] })
    const pad = Math.max(0.2, (b.bottom - b.top) * 0.04)
    const drawing = modelDrawing({ definition: def, profile: d.profile, points: d.points, fitBands: d.fitBands, units: u, usStress: d.project.usStress, range: { top: Math.max(0, b.top - pad), bottom: b.bottom + pad }, width: 720, height: 700, legend: false })
    content.push({ svg: drawing.svg, width: inner })
    content.push({ text: trendWords(t, u, uo), fontSize: 8.5, margin: [0, 4, 0, 0] })
    content.push({ text: 'Symbols and lines as in the key under the whole-depth drawing.', style: 'note', margin: [0, 2, 0, 0] })
  })

  // --- tables: trends, compressibility, flags, changes ---------------------------------------------
  content.push({ text: 'σ\'p trends', style: 'section', pageBreak: 'before' })
  content.push(table([38, 92, '*', 24, 34, 52, 40], [
    head('Stratum', 'Trend', 'Parameters', 'n', 'R²', 'RMSE', 'AICc'),
    ...def.strata.map((s) => {
      const t = s.trend
      if (!t) return [cell(s.code, { bold: true }), cell('none'), cell(''), cell(''), cell(''), cell(''), cell('')]
      if (t.manual) return [cell(s.code, { bold: true }), cell('Hand-drawn'), cell(`${t.manual.knots.length} knots: “${t.manual.reason}”`), cell(''), cell(''), cell(''), cell('')]
      return [
        cell(s.code, { bold: true }), cell(`${TREND_MODEL_LABELS[t.model] ?? t.model}${t.logSpace ? ' (ln σ\'p)' : ''}`),
        cell(Object.entries(t.parameters).map(([k, v]) => `${trendParameterLabel(k, unitLabel('length', u))} ${trendParameterText(k, v, u, uo)}`).join('; ')),
        cell(String(t.n)), cell(fixed(t.r2, 3)), cell(t.logSpace ? `${fixed(t.rmse, 3)} (ln)` : shown(t.rmse, 'stress', u, undefined, uo)), cell(fixed(t.aicc, 1)),
      ]
    }),
  ]))
  content.push({ text: 'The band on the drawings is the 95 % confidence band of the fitted trend (mean response) over the fitted points\' depths.', style: 'note' })

  content.push({ text: 'Compressibility', style: 'section' })
  const comp = def.strata.filter(s => s.compressible)
  if (!comp.length) content.push({ text: 'No stratum is compressible in this version.', style: 'small' })
  else {
    content.push(table([38, '*', 40, 40, 40, 56, 40, 48, 60], [
      head('Stratum', 'Adopted from', 'Cc', 'Cr', 'e0', 'cv (m²/yr)', 'Cα', 'Drainage', 'Depth trends'),
      ...comp.map((s) => {
        const k = s.compressibility
        if (!k) return [cell(s.code, { bold: true }), cell('missing', { color: REPORT_INK.alert }), cell(''), cell(''), cell(''), cell(''), cell(''), cell(''), cell('')]
        const trends = COMPRESSIBILITY_KEYS.filter(key => k.trends?.[key]).map(key => COMPRESSIBILITY_LABELS[key])
        return [
          cell(s.code, { bold: true }), cell(k.source === 'mean' ? `mean of ${k.n ?? '?'} tests` : 'typed'),
          cell(fixed(k.cc, 3)), cell(fixed(k.cr, 3)), cell(fixed(k.e0, 3)), cell(fixed(k.cv ?? null, 2)), cell(fixed(k.calpha ?? null, 4)), cell(k.drainage), cell(trends.join(', ') || '—'),
        ]
      }),
    ]))
  }

  content.push({ text: 'Reviewer flags in force', style: 'section' })
  content.push({ text: 'Open flags when the version was saved; an exclude flag keeps its point out of every fit.', style: 'note', margin: [0, 0, 0, 3] })
  if (!d.flags.length) content.push({ text: 'None.', style: 'small' })
  else {
    content.push(table([70, 150, '*', 54], [
      head('Verdict', 'On', 'Comment', 'Now'),
      ...d.flags.map(f => [cell(VERDICT_LABELS[f.verdict] ?? f.verdict, { bold: true, color: f.verdict === 'exclude' ? REPORT_INK.alert : REPORT_INK.text }), cell(f.target), cell(f.comment || '—'), cell(f.statusNow)]),
    ]))
  }

  content.push({ text: 'Changes since the previous approved version', style: 'section' })
  const prev = d.previousApproved
  if (!prev) content.push({ text: 'No earlier version of this model was approved.', style: 'small' })
  else if (!prev.changes.length) content.push({ text: `Same definition as version ${prev.version}${prev.flagsChanged ? ' (the reviewer flags in force differ)' : ''}.`, style: 'small' })
  else {
    content.push({ text: `Against version ${prev.version}: ${prev.changes.length} change${prev.changes.length === 1 ? '' : 's'}${prev.flagsChanged ? '; the reviewer flags in force differ too' : ''}. Values in SI as stored.`, style: 'small', margin: [0, 0, 0, 3] })
    content.push(table(['*', 130, 130], [head('Field', `Version ${prev.version}`, `Version ${d.version.number}`), ...prev.changes.slice(0, 200).map(c => [cell(c.path), cell(changeValue(c.a)), cell(changeValue(c.b))])]))
    if (prev.changes.length > 200) content.push({ text: `… and ${prev.changes.length - 200} more.`, style: 'note' })
  }

  return reportDocument({
    project: { name: d.project.name, jobNumber: d.project.jobNumber, client: d.project.client },
    title: MODEL_VERSION_REPORT_TITLE,
    subject,
    revision: d.issue?.revision ?? null,
    prepared: d.issue?.issuedBy ?? null,
    checked: null,
    approved: approved && d.approval ? { name: d.approval.by ?? 'unknown', date: reportDate(d.approval.at) } : null,
    units: u,
    usStress: d.project.usStress,
    approvedRecord: approved,
  }, content)
}

function trendWords(t: SiteModelDefinition['strata'][number]['trend'], u: UnitSystem, uo: ConvertOptions = {}): string {
  if (!t) return 'No σ\'p trend in this stratum.'
  if (t.manual) return `Hand-drawn trend (${t.manual.knots.length} knots): “${t.manual.reason}”`
  const params = Object.entries(t.parameters).map(([k, v]) => `${trendParameterLabel(k, unitLabel('length', u))} ${trendParameterText(k, v, u, uo)}`).join(', ')
  return `${TREND_MODEL_LABELS[t.model] ?? t.model}${t.logSpace ? ' on ln σ\'p' : ''}: ${params} · n ${t.n} · R² ${fixed(t.r2, 3)} · RMSE ${t.logSpace ? `${fixed(t.rmse, 3)} (ln)` : shown(t.rmse, 'stress', u, undefined, uo)} · AICc ${fixed(t.aicc, 1)}`
}
