import type { Content, ContentStack, TableCell, TDocumentDefinitions } from 'pdfmake/interfaces'
import { RESULT_CAUTION } from '../caution'
import { settlementPlanSvg } from '../plots/settlement-contours'
import { settlementDepthScene, settlementDepthSvg } from '../plots/settlement-depth'
import { settlementTimeScene, settlementTimeSvg } from '../plots/settlement-time'
import { formatDistortion, formatSettlement, formatYears, settlementUnitLabel } from '../plots/settlement-units'
import type { RunLoad } from '../schemas/settlement-runs'
import { isTreated, scheduleRows } from '../settlement-run/treatment'
import type { RunPointDetail, RunResults, ServerSettlementRun } from '../types/settlement-runs'
import { groupThousands } from '../text/count'
import { convert, displayDigits, unitLabel, type ConvertOptions, type Quantity, type UnitSystem, type UsStressUnit } from '../units'
import { REPORT_INK, reportDocument, type ReportSignOff } from './sheet'

/**
 * The settlement-run report's content: the inputs (the model version and its approval, the loads drawn on the
 * plan, the options), the contour map, the per-point summary, the convergence check, the warnings, then for
 * each named point its sublayer table, stresses with depth and time curve, and the approval block. Pure: the
 * run's stored data in, a pdfmake document out. Values are SI in the data and shown in the project's units.
 */

export interface SettlementRunReportInput {
  project: { name: string, jobNumber: string, client: string, unitSystem: UnitSystem, usStressUnit?: UsStressUnit }
  run: ServerSettlementRun & { results: RunResults }
  /** Each named point's sublayer table (`settlement_run_points`), in the run's point order. */
  details: RunPointDetail[]
  issue: { revision: string, issuedBy: ReportSignOff } | null
}

/** The printable width of an A4 portrait page between the sheet's margins, pt. */
const PAGE_INNER = 595.28 - 72
/** Plots beside each other are drawn this wide (px) and scaled to half the page, so their text prints at about 7 pt. */
const PLOT_W = 380

const dateText = (d: Date | string | null | undefined) => (d ? new Date(d).toISOString().slice(0, 10) : '—')

function fmt(units: UnitSystem, v: number | null | undefined, q: Quantity, digits = 1, opts: ConvertOptions = {}): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return '—'
  return convert(v, q, 'SI', units, opts).toFixed(digits)
}

/** A stress in the project's unit (kPa, psf or tsf), without the unit. */
function stress(units: UnitSystem, v: number | null | undefined, opts: ConvertOptions): string {
  return fmt(units, v, 'stress', displayDigits('stress', units, opts), opts)
}

/** The model version line: its approval as the run stored it. */
export function runModelLine(run: Pick<ServerSettlementRun, 'model'>): string {
  const m = run.model
  if (m.status === 'approved') return `${m.modelName}, version ${m.version} — approved${m.approvedBy ? ` by ${m.approvedBy}` : ''}${m.approvedAt ? ` on ${dateText(m.approvedAt)}` : ''}`
  return `${m.modelName}, version ${m.version} — ${m.status}, not approved`
}

function loadRow(l: RunLoad, i: number, u: UnitSystem, so: ConvertOptions = {}): TableCell[] {
  const L = unitLabel('length', u)
  const P = unitLabel('stress', u, so)
  const len = (v: number) => fmt(u, v, 'length', 1)
  const pressure = 'pressure' in l && l.pressure !== undefined
    ? `${stress(u, l.pressure, so)} ${P}`
    : 'fill' in l && l.fill ? `fill ${len(l.fill.thickness)} ${L} × ${fmt(u, l.fill.unitWeight, 'unitWeight', 1)} ${unitLabel('unitWeight', u)}` : '—'
  let where = '—'
  let size = 'whole site'
  switch (l.type) {
    case 'rectangle': where = `E ${len(l.x)}, N ${len(l.y)}`; size = `${len(l.width)} × ${len(l.length)} ${L}${l.rotation ? `, rotated ${l.rotation}°` : ''}`; break
    case 'circle': where = `E ${len(l.x)}, N ${len(l.y)}`; size = `radius ${len(l.radius)} ${L}`; break
    case 'embankment': where = `E ${len(l.x)}, N ${len(l.y)}`; size = `crest ${len(l.crestWidth)} × ${len(l.crestLength)} ${L}, ${len(l.height)} ${L} high, side slope ${l.sideSlope}:1${l.rotation ? `, rotated ${l.rotation}°` : ''}`; break
    case 'uniform': break
  }
  const load = l.type === 'embankment' ? `${len(l.height)} ${L} × ${fmt(u, l.unitWeight, 'unitWeight', 1)} ${unitLabel('unitWeight', u)}` : pressure
  return [l.label || `Load ${i + 1}`, l.type, where, size, load].map(t => ({ text: t, style: 'tableCell' }))
}

const head = (cells: string[]): TableCell[] => cells.map(t => ({ text: t, style: 'tableHead' }))
const cell = (t: string, align: 'left' | 'right' = 'right'): TableCell => ({ text: t, style: 'tableCell', alignment: align })
const TABLE_LAYOUT = {
  hLineWidth: (i: number) => (i <= 1 ? 0.8 : 0.3),
  vLineWidth: () => 0,
  hLineColor: (i: number) => (i <= 1 ? REPORT_INK.tide : REPORT_INK.rule),
  paddingTop: () => 2,
  paddingBottom: () => 2,
  paddingLeft: () => 3,
  paddingRight: () => 3,
}

function keyValues(rows: [string, string][]): Content {
  return {
    table: { widths: [150, '*'], body: rows.map(([k, v]) => [{ text: k, style: 'tableCell', color: REPORT_INK.silt }, { text: v, style: 'tableCell' }]) },
    layout: 'noBorders',
  }
}

/** Settlement (m) in mm or in without the unit. */
const s = (v: number | null | undefined, u: UnitSystem) => formatSettlement(v, u, false)

function inputs(inp: SettlementRunReportInput): Content[] {
  const { run, project } = inp
  const u = project.unitSystem
  const L = unitLabel('length', u)
  const o = run.options
  return [
    { text: 'Inputs', style: 'section' },
    keyValues([
      ['Run', run.name],
      ['Site model', runModelLine(run)],
      ['Made', `${dateText(run.createdAt)}${run.createdBy ? ` by ${run.createdBy.name}` : ''}; finished ${dateText(run.finishedAt)}`],
      ['Sublayers at most', `${fmt(u, o.maxSublayerThickness, 'length', 2)} ${L} thick`],
      ['Times of interest', o.years.map(y => formatYears(y)).join(', ')],
      ['Design life', formatYears(o.designLife)],
      ['Angular distortion limit', formatDistortion(o.angularDistortionLimit)],
      ['Grid', run.grid ? `every ${fmt(u, run.grid.spacing, 'length', 1)} ${L}, reaching ${fmt(u, run.grid.margin, 'length', 1)} ${L} beyond the loads` : 'none: named points only'],
    ]),
    { text: 'Loads', style: 'subsection' },
    {
      table: { headerRows: 1, widths: [70, 58, 100, '*', 110], body: [head(['Load', 'Shape', 'Centre', 'Size', 'Pressure or fill']), ...run.loads.map((l, i) => loadRow(l, i, u, { usStress: project.usStressUnit }))] },
      layout: TABLE_LAYOUT,
    },
  ]
}

/** The construction schedule, the drain design and each point's treatment figures (only for a treated run). */
function treatment(inp: SettlementRunReportInput): Content[] {
  const { run, project } = inp
  if (!isTreated(run.loads, run.options.drains)) return []
  const u = project.unitSystem
  const L = unitLabel('length', u)
  const unit = settlementUnitLabel(u)
  const out: Content[] = [
    { text: 'Construction schedule', style: 'subsection' },
    {
      table: {
        headerRows: 1,
        widths: ['*', 'auto', 'auto', 'auto', 'auto', 'auto'],
        body: [
          head(['Load', 'Stage', 'Starts', 'Lasts', 'Share of the load', 'Taken off']),
          ...scheduleRows(run.loads).map(r => [cell(r.load, 'left'), cell(String(r.stage)), cell(formatYears(r.start)), cell(r.duration > 0 ? formatYears(r.duration) : 'at once'), cell(`${Number((r.fraction * 100).toFixed(1))} %`), cell(r.removeAt !== null ? formatYears(r.removeAt) : '—')] as TableCell[]),
        ],
      },
      layout: TABLE_LAYOUT,
    },
  ]
  const d = run.options.drains
  const design = run.results.drains
  if (d && design) {
    out.push({ text: 'Vertical drains', style: 'subsection' })
    out.push(keyValues([
      ['Through', design.strata.map(x => x.name).join(', ') || d.strata.join(', ')],
      ['Pattern and spacing', `${d.pattern}, ${fmt(u, d.spacing, 'length', 2)} ${L}; influence diameter ${fmt(u, design.influenceDiameter, 'length', 2)} ${L}`],
      ['Drain', `equivalent diameter ${fmt(u, d.diameter, 'length', 3)} ${L}${d.dischargeCapacity !== undefined ? `, discharge capacity ${d.dischargeCapacity} m³/yr` : ', no well resistance'}`],
      ['Smear and flow', `ds/dw ${d.smearRatio}, kh/ks ${d.permeabilityRatio}, ch/cv ${d.chRatio}; μ = ${design.mu.toFixed(2)} (Hansbo 1981), combined with vertical drainage (Carrillo 1942)`],
    ]))
  }
  const pts = run.results.points.filter(p => p.t90WithoutDrains !== undefined || p.removedAt !== undefined)
  if (pts.length) {
    out.push({
      margin: [0, 4, 0, 0],
      table: {
        headerRows: 1,
        widths: ['*', 'auto', 'auto', 'auto', 'auto', 'auto'],
        body: [
          head(['Point', 't90', 't90 without drains', 'Taken off', `Rebound (${unit})`, `Still to come (${unit})`]),
          ...pts.map(p => [cell(p.label, 'left'), cell(formatYears(p.t90)), cell(p.t90WithoutDrains !== undefined ? formatYears(p.t90WithoutDrains) : '—'), cell(p.removedAt !== undefined ? formatYears(p.removedAt) : '—'), cell(p.rebound !== undefined ? s(p.rebound, u) : '—'), cell(p.residualAfterRemoval !== undefined ? s(p.residualAfterRemoval, u) : '—')] as TableCell[]),
        ],
      },
      layout: TABLE_LAYOUT,
    })
    out.push({ text: 'Still to come: the primary settlement under the loads left in place after the surcharge is taken off.', style: 'note', margin: [0, 2, 0, 0] })
  }
  return out
}

function headline(inp: SettlementRunReportInput): Content {
  const r = inp.run.results
  const u = inp.project.unitSystem
  const unit = settlementUnitLabel(u)
  const t90s = r.points.map(p => p.t90).filter((t): t is number => t !== null)
  const at = r.maximum.label ?? `E ${fmt(u, r.maximum.x, 'length', 1)}, N ${fmt(u, r.maximum.y, 'length', 1)} ${unitLabel('length', u)}`
  const cards: [string, string, string][] = [
    ['Largest settlement', `${s(r.maximum.settlement, u)} ${unit}`, `at ${at}`],
    ['Longest t90', t90s.length ? formatYears(Math.max(...t90s)) : '—', 'over the named points'],
    ['Angular distortion', r.grid ? formatDistortion(r.grid.maxAngularDistortion) : '—', r.grid ? `limit ${formatDistortion(r.grid.angularDistortionLimit)}${r.grid.exceedsLimit ? ' — EXCEEDED' : ''}` : 'no grid'],
  ]
  return {
    margin: [0, 6, 0, 2],
    table: {
      widths: ['*', '*', '*'],
      body: [cards.map(([k, v, sub]) => ({
        stack: [
          { text: k.toUpperCase(), fontSize: 6.5, color: REPORT_INK.silt, characterSpacing: 0.4 },
          { text: v, fontSize: 14, bold: true, color: REPORT_INK.tideDark },
          { text: sub, fontSize: 7.5, color: sub.includes('EXCEEDED') ? REPORT_INK.alert : REPORT_INK.silt },
        ],
        fillColor: REPORT_INK.ochreLight,
        margin: [6, 4, 6, 4],
      }))],
    },
    layout: { hLineWidth: () => 0, vLineWidth: (i: number) => (i > 0 && i < 3 ? 4 : 0), vLineColor: () => '#ffffff' },
  }
}

function summary(inp: SettlementRunReportInput): Content[] {
  const r = inp.run.results
  const u = inp.project.unitSystem
  const years = inp.run.options.years
  const unit = settlementUnitLabel(u)
  const L = unitLabel('length', u)
  const body: TableCell[][] = [
    head(['Point', `E (${L})`, `N (${L})`, `Settlement (${unit})`, 't50', 't90', ...years.map(y => `At ${formatYears(y)} (${unit})`), `Secondary (${unit})`]),
    ...r.points.map(p => [
      cell(p.label, 'left'),
      cell(fmt(u, p.x, 'length', 1)),
      cell(fmt(u, p.y, 'length', 1)),
      { text: s(p.settlement, u), style: 'tableCell', alignment: 'right', bold: true },
      cell(formatYears(p.t50)),
      cell(formatYears(p.t90)),
      ...years.map(y => cell(s(p.time.find(t => t.years === y)?.settlement, u))),
      cell(s(p.secondary, u)),
    ] as TableCell[]),
  ]
  return [
    { text: 'Settlement at the named points', style: 'section' },
    { table: { headerRows: 1, widths: ['auto', 'auto', 'auto', 'auto', 'auto', 'auto', ...years.map(() => '*' as const), 'auto'], body }, layout: TABLE_LAYOUT },
    { text: `Secondary compression over the design life of ${formatYears(inp.run.options.designLife)}, from the end of primary consolidation.`, style: 'note', margin: [0, 2, 0, 0] },
  ]
}

function convergence(inp: SettlementRunReportInput): Content[] {
  const r = inp.run.results
  const u = inp.project.unitSystem
  const unit = settlementUnitLabel(u)
  const rows = r.points.filter(p => p.convergence)
  const worst = Math.max(0, ...rows.map(p => Math.abs(p.convergence?.relativeChange ?? 0)))
  return [
    { text: 'Convergence', style: 'section' },
    { text: `Each named point was computed again with every sublayer halved. The largest change is ${(worst * 100).toFixed(2)} %.`, style: 'small', margin: [0, 0, 0, 3] },
    rows.length
      ? { table: { headerRows: 1, widths: ['auto', 'auto', 'auto', 'auto'], body: [head(['Point', `Settlement (${unit})`, `Sublayers halved (${unit})`, 'Change']), ...rows.map(p => [cell(p.label, 'left'), cell(s(p.settlement, u)), cell(s(p.convergence?.halved, u)), cell(`${((p.convergence?.relativeChange ?? 0) * 100).toFixed(2)} %`)])] }, layout: TABLE_LAYOUT }
      : { text: 'No named point has a convergence check.', style: 'note' },
    { text: `${groupThousands(r.stats.sublayers, ',')} sublayers computed.`, style: 'note', margin: [0, 2, 0, 0] },
  ]
}

function warnings(inp: SettlementRunReportInput): Content[] {
  const r = inp.run.results
  const all = [...r.warnings, ...r.points.flatMap(p => p.warnings.map(w => `${p.label}: ${w}`))]
  return [
    { text: 'Warnings', style: 'section' },
    all.length ? { ul: all.map(w => ({ text: w, style: 'small' })), color: REPORT_INK.text } : { text: 'The run raised no warnings.', style: 'small' },
  ]
}

const QUANTILES = [['p05', 'P5'], ['p10', 'P10'], ['p50', 'P50'], ['p90', 'P90'], ['p95', 'P95']] as const
const SCATTER_WORDS: Record<string, string> = { cc: 'Cc', cr: 'Cr', e0: 'e0', cv: 'cv', ch: 'ch', preconsolidation: 'σ\'p' }
const SOURCE_WORDS: Record<string, string> = { data: 'from the tests', default: 'assumed', entered: 'entered' }

/**
 * The probabilistic section of a run with `options.probabilistic`: what P50 and P95 mean in plain
 * words, the percentiles of settlement and t90 per point, the exceedance of the limit, the
 * sensitivity ranking and the set-up with each COV's source, and the caution that the spread
 * reflects the data entered only.
 */
function probabilistic(inp: SettlementRunReportInput): Content[] {
  const r = inp.run.results
  const setup = r.probabilistic
  if (!setup) return []
  const u = inp.project.unitSystem
  const unit = settlementUnitLabel(u)
  const rows = r.points.filter(p => p.probabilistic)
  const limit = setup.limit
  const out: Content[] = [
    { text: 'How sure is the settlement?', style: 'section', pageBreak: 'before' },
    {
      text: `The soil parameters were varied ${groupThousands(setup.realizations, ',')} times within their scatter and the settlement computed each time (seed ${setup.seed}). `
        + 'P50 is the settlement that half of these outcomes stay below; P95 the settlement exceeded in only 5 % of them, P5 the one exceeded in 95 %. '
        + 'The deterministic settlement uses the adopted values.',
      style: 'small',
      margin: [0, 0, 0, 4],
    },
    {
      table: {
        headerRows: 1,
        widths: ['auto', 'auto', 'auto', 'auto', ...QUANTILES.map(() => '*' as const), ...(limit !== null ? ['auto' as const] : [])],
        body: [
          head(['Point', `Deterministic (${unit})`, `Mean (${unit})`, `SD (${unit})`, ...QUANTILES.map(([, h]) => `${h} (${unit})`), ...(limit !== null ? [`P(> ${s(limit, u)} ${unit})`] : [])]),
          ...rows.map((p) => {
            const b = p.probabilistic!
            return [cell(p.label, 'left'), cell(s(b.deterministic, u)), cell(s(b.mean, u)), cell(s(b.sd, u)), ...QUANTILES.map(([k]) => cell(s(b.quantiles[k], u))), ...(limit !== null ? [cell(b.exceedance ? `${(b.exceedance.probability * 100).toFixed(1)} %` : '—')] : [])] as TableCell[]
          }),
        ],
      },
      layout: TABLE_LAYOUT,
    },
  ]
  if (rows.some(p => p.probabilistic!.t90)) {
    out.push(
      { text: 'Time to 90 % of primary settlement', style: 'small', bold: true, margin: [0, 8, 0, 2] },
      {
        table: {
          headerRows: 1,
          widths: ['auto', ...QUANTILES.map(() => '*' as const)],
          body: [head(['Point', ...QUANTILES.map(([, h]) => `t90 ${h}`)]), ...rows.filter(p => p.probabilistic!.t90).map(p => [cell(p.label, 'left'), ...QUANTILES.map(([k]) => cell(formatYears(p.probabilistic!.t90!.quantiles[k])))] as TableCell[])],
        },
        layout: TABLE_LAYOUT,
      },
    )
  }
  const first = rows[0]?.probabilistic
  if (first && first.sensitivity.length > 0) {
    out.push(
      { text: `What drives the spread at ${rows[0]!.label}`, style: 'small', bold: true, margin: [0, 8, 0, 2] },
      { text: 'Rank correlation of each varied parameter with the settlement: the nearer to ±1, the more the settlement follows it.', style: 'note', margin: [0, 0, 0, 2] },
      {
        table: {
          headerRows: 1,
          widths: ['auto', 'auto', 'auto'],
          body: [head(['Stratum', 'Parameter', 'Rank correlation']), ...first.sensitivity.slice(0, 8).map(e => [cell(e.stratum, 'left'), cell(SCATTER_WORDS[e.variable] ?? e.variable, 'left'), cell(e.rankCorrelation.toFixed(2))] as TableCell[])],
        },
        layout: TABLE_LAYOUT,
      },
    )
  }
  out.push(
    { text: 'Scatter used', style: 'small', bold: true, margin: [0, 8, 0, 2] },
    {
      table: {
        headerRows: 1,
        widths: ['auto', 'auto', 'auto', 'auto', 'auto'],
        body: [
          head(['Stratum', 'Parameter', 'COV', 'Source', 'Tests']),
          ...setup.strata.flatMap(st => st.variables.map(v => [cell(st.code, 'left'), cell(SCATTER_WORDS[v.variable] ?? v.variable, 'left'), cell(v.trend ? 'fitted band' : v.cov.toFixed(2)), cell(SOURCE_WORDS[v.source] ?? v.source, 'left'), cell(v.n > 0 ? String(v.n) : '—')] as TableCell[])),
        ],
      },
      layout: TABLE_LAYOUT,
    },
    { text: `Cc and e0 correlated at ${setup.ccE0Correlation}; strata independent of each other.${setup.warnings.length ? ` ${setup.warnings.join(' ')}` : ''}`, style: 'note', margin: [0, 2, 0, 0] },
    { text: 'The spread reflects the scatter of the data and values entered, not all uncertainty: the ground model, the stratum boundaries, the loads and the method itself are taken as given.', style: 'small', bold: true, color: REPORT_INK.alert, margin: [0, 6, 0, 0] },
    { text: RESULT_CAUTION, style: 'note', margin: [0, 4, 0, 0] },
  )
  return out
}

const CASE_WORDS: Record<string, string> = { 'NC': 'NC', 'OC': 'OC', 'OC-NC': 'OC→NC' }

function pointPages(inp: SettlementRunReportInput): Content[] {
  const u = inp.project.unitSystem
  const so: ConvertOptions = { usStress: inp.project.usStressUnit }
  const L = unitLabel('length', u)
  const P = unitLabel('stress', u, so)
  const unit = settlementUnitLabel(u)
  const out: Content[] = []
  inp.run.results.points.forEach((p, i) => {
    const d = inp.details.find(x => x.index === i) ?? inp.details[i]
    out.push({ text: `Named point ${p.label}`, style: 'section', pageBreak: 'before' })
    out.push({ text: `E ${fmt(u, p.x, 'length', 1)}, N ${fmt(u, p.y, 'length', 1)} ${L} · settlement ${formatSettlement(p.settlement, u)} · Δσ at the surface ${stress(u, p.surfaceStressIncrease, so)} ${P} · t90 ${formatYears(p.t90)}`, style: 'small', margin: [0, 0, 0, 4] })
    const halfW = (PAGE_INNER - 12) / 2
    if (d) {
      out.push({
        columns: [
          { width: halfW, svg: settlementDepthSvg(settlementDepthScene({ sublayers: d.sublayers, unitSystem: u, usStress: inp.project.usStressUnit, width: PLOT_W, height: 460 }), `depth-${i}`) },
          { width: halfW, svg: settlementTimeSvg(settlementTimeScene({ series: [{ name: inp.run.name, point: p }], years: inp.run.options.years, unitSystem: u, width: PLOT_W, height: 330 }), { legend: true }) },
        ],
        columnGap: 12,
        margin: [0, 0, 0, 6],
      })
      out.push({ text: `Sublayers at ${p.label}`, style: 'subsection' })
      out.push({
        table: {
          headerRows: 1,
          widths: ['*', 'auto', 'auto', 'auto', 'auto', 'auto', 'auto', 'auto', 'auto', 'auto', 'auto', 'auto'],
          body: [
            head(['Stratum', `Top (${L})`, `Bottom (${L})`, `σ'v0 (${P})`, `Δσ (${P})`, `σ'vf (${P})`, `σ'p (${P})`, `σ'p final (${P})`, 'Case', 'Δe', 'Strain (%)', `Compr. (${unit})`]),
            ...d.sublayers.map(r => [
              cell(r.layer, 'left'), cell(fmt(u, r.top, 'length', 2)), cell(fmt(u, r.bottom, 'length', 2)),
              cell(stress(u, r.effectiveStress, so)), cell(stress(u, r.stressIncrease, so)),
              cell(stress(u, r.finalEffectiveStress, so)), cell(stress(u, r.preconsolidation, so)),
              cell(stress(u, r.finalPreconsolidation, so)), cell(CASE_WORDS[r.case] ?? r.case, 'left'),
              cell(r.voidRatioChange.toFixed(4)), cell((r.strain * 100).toFixed(2)), cell(s(r.compression, u)),
            ] as TableCell[]),
            [{ text: 'Total', style: 'tableCell', bold: true, colSpan: 11 }, ...Array.from({ length: 10 }, () => ({ text: '' })), { text: s(d.sublayers.reduce((a, r) => a + r.compression, 0), u), style: 'tableCell', bold: true, alignment: 'right' }] as TableCell[],
          ],
        },
        layout: TABLE_LAYOUT,
      })
    }
    else {
      out.push({ text: 'The sublayer table of this point is missing from the stored run.', style: 'note' })
    }
    if (p.time.length) {
      out.push({ text: 'At the times of interest', style: 'subsection' })
      out.push({ table: { headerRows: 1, widths: ['auto', 'auto', 'auto'], body: [head(['Time', 'Degree of consolidation', `Settlement (${unit})`]), ...p.time.map(t => [cell(formatYears(t.years), 'left'), cell(`${(t.degree * 100).toFixed(0)} %`), cell(s(t.settlement, u))])] }, layout: TABLE_LAYOUT })
    }
    if (p.warnings.length) out.push({ ul: p.warnings.map(w => ({ text: w, style: 'small' })), margin: [0, 4, 0, 0] })
  })
  return out
}

function approvalBlock(inp: SettlementRunReportInput): Content[] {
  const m = inp.run.model
  const box = (role: string, who: string): ContentStack => ({
    stack: [
      { text: role.toUpperCase(), fontSize: 6.5, color: REPORT_INK.silt, characterSpacing: 0.4 },
      { text: who || ' ', fontSize: 9, bold: true, margin: [0, 2, 0, 14] },
      { canvas: [{ type: 'line', x1: 0, y1: 0, x2: 150, y2: 0, lineWidth: 0.5, lineColor: REPORT_INK.rule }] },
      { text: 'signature and date', fontSize: 6.5, color: REPORT_INK.silt },
    ],
  })
  return [
    { text: 'Approval', style: 'section', pageBreak: 'before' },
    {
      text: m.status === 'approved'
        ? `The run used ${m.modelName}, version ${m.version}, approved${m.approvedBy ? ` by ${m.approvedBy}` : ''}${m.approvedAt ? ` on ${dateText(m.approvedAt)}` : ''}.`
        : `The run used ${m.modelName}, version ${m.version}, which was ${m.status} and not approved when the run was made: this report is for discussion only.`,
      style: 'small',
      color: m.status === 'approved' ? REPORT_INK.text : REPORT_INK.alert,
      margin: [0, 0, 0, 10],
    },
    { columns: [box('Prepared', inp.issue?.issuedBy.name ?? ''), box('Checked', ''), box('Approved', '')], columnGap: 18 },
    { text: RESULT_CAUTION, style: 'note', margin: [0, 16, 0, 0] },
  ]
}

/** The report's title and subject as its header shows them. */
export function settlementRunReportTitle(run: Pick<ServerSettlementRun, 'name'>): { title: string, subject: string } {
  return { title: 'Settlement run', subject: run.name }
}

export function settlementRunReport(inp: SettlementRunReportInput): TDocumentDefinitions {
  const { run, project } = inp
  const u = project.unitSystem
  const r = run.results
  const { title, subject } = settlementRunReportTitle(run)
  const mapHeight = 380
  const content: Content[] = [
    ...inputs(inp),
    ...treatment(inp),
    { text: 'Settlement on the plan', style: 'section' },
    headline(inp),
    { svg: settlementPlanSvg({ grid: r.grid ?? null, loads: run.loads, points: r.points, maximum: r.maximum.label === null ? { x: r.maximum.x, y: r.maximum.y } : null, unitSystem: u, width: PAGE_INNER, height: mapHeight }), width: PAGE_INNER, margin: [0, 6, 0, 0] },
    ...summary(inp),
    ...convergence(inp),
    ...warnings(inp),
    ...probabilistic(inp),
    ...pointPages(inp),
    ...approvalBlock(inp),
  ]
  return reportDocument({
    project: { name: project.name, jobNumber: project.jobNumber, client: project.client },
    title,
    subject,
    revision: inp.issue?.revision ?? null,
    prepared: inp.issue?.issuedBy ?? null,
    checked: null,
    approved: null,
    units: u,
    usStress: project.usStressUnit,
    approvedRecord: run.model.status === 'approved',
  }, content, { author: inp.issue?.issuedBy.name })
}
