import * as XLSX from 'xlsx-republish'
import { RESULT_CAUTION } from '#shared/caution'
import { isTreated, scheduleRows } from '#shared/settlement-run/treatment'
import type { RunPointDetail, RunResults, ServerSettlementRun } from '#shared/types/settlement-runs'
import { FOOT_M } from '#shared/units'
import type { ProjectRow } from '../utils/guards'
import { contentDisposition } from './attachments'
import { exportUnits } from './exports/logs'
import { settlementRunForExport } from './settlement-runs'

/**
 * A finished settlement run as a workbook (sheets Inputs, Points, Sublayers, Time curves, Grid,
 * and Treatment when the run has a construction schedule, a removal or drains; in the project's
 * units, each heading labelled; the caution on the first sheet) or as JSON (the run as
 * `GET …/{runId}` answers it, SI as its `units` says, with the caution, every point's sublayer table
 * and `treatment`: the schedule rows and the drain design; a probabilistic run's blocks are in
 * `run.results`). A probabilistic run adds the sheet Probabilistic. A run not yet finished is 409.
 */

export interface RunExportFile {
  body: Buffer | string
  contentType: string
  disposition: string
}

/** A file name from the run's name: letters, digits, dot, dash and underscore only. */
export function runFileName(name: string, ext: string): string {
  const base = name.normalize('NFKD').replace(/[^A-Za-z0-9._-]+/g, '_').replace(/^[_.]+|_+$/g, '').slice(0, 80)
  return `${base || 'settlement-run'}.${ext}`
}

/** The workbook's numbers in the project's units (SI as stored; US converted and rounded), with their labels. */
export function runExportUnits(project: Pick<ProjectRow, 'unitSystem' | 'usStressUnit'>) {
  const u = exportUnits(project)
  const us = project.unitSystem === 'US'
  const num = (x: number | null | undefined, f: (v: number) => number) => (x === null || x === undefined ? null : f(x))
  return {
    ...u,
    /** Discharge capacity: m³/yr, or ft³/yr on a US project. */
    flow: (x: number | null | undefined) => num(x, v => (us ? Number((v / FOOT_M ** 3).toFixed(1)) : v)),
    flowLabel: us ? 'ft³/yr' : 'm³/yr',
    words: `${u.label('length')}, ${u.label('stress')}, ${u.label('unitWeight')}, years`,
  }
}
type RunUnits = ReturnType<typeof runExportUnits>

function describeLoad(l: ServerSettlementRun['loads'][number], u: RunUnits): string {
  const L = (x: number) => `${u.len(x)} ${u.label('length')}`
  const at = (x: number, y: number) => `(${u.len(x)}, ${u.len(y)}) ${u.label('length')}`
  const p = 'pressure' in l && l.pressure !== undefined ? `${u.stress(l.pressure)} ${u.label('stress')}` : 'fill' in l && l.fill ? `fill ${L(l.fill.thickness)} × ${u.gamma(l.fill.unitWeight)} ${u.label('unitWeight')}` : ''
  switch (l.type) {
    case 'uniform': return `uniform, ${p}`
    case 'rectangle': return `rectangle at ${at(l.x, l.y)}, ${L(l.width)} × ${L(l.length)}, rotated ${l.rotation}°, ${p}`
    case 'circle': return `circle at ${at(l.x, l.y)}, radius ${L(l.radius)}, ${p}`
    case 'embankment': return `embankment at ${at(l.x, l.y)}, crest ${L(l.crestWidth)} × ${L(l.crestLength)}, ${L(l.height)} high, side slope ${l.sideSlope}:1, γ ${u.gamma(l.unitWeight)} ${u.label('unitWeight')}, rotated ${l.rotation}°`
  }
}

/** The Treatment sheet: the construction schedule, the drain design and each point's figures. */
function treatmentSheet(run: ServerSettlementRun & { results: RunResults }, u: RunUnits): (string | number | null)[][] {
  const r = run.results
  const rows: (string | number | null)[][] = [
    ['Construction schedule (years from time zero; fraction of the load)'],
    ['Load', 'Stage', 'Start (years)', 'Duration (years)', 'Fraction', 'Removed at (years)'],
    ...scheduleRows(run.loads).map(s => [s.load, s.stage, s.start, s.duration, s.fraction, s.removeAt]),
    [],
  ]
  const d = run.options.drains
  const design = r.drains
  if (d && design) {
    rows.push(
      ['Vertical drains'],
      ['Strata', d.strata.join(', ')],
      ['Pattern', d.pattern],
      [u.head('Spacing', 'length'), u.len(d.spacing)],
      [u.head('Equivalent diameter dw', 'length'), u.len(d.diameter)],
      [u.head('Influence diameter De', 'length'), u.len(design.influenceDiameter)],
      ['Smear ratio ds/dw', d.smearRatio],
      ['Permeability ratio kh/ks', d.permeabilityRatio],
      ['ch/cv', d.chRatio],
      [`Discharge capacity qw (${u.flowLabel})`, u.flow(d.dischargeCapacity) ?? 'not given (no well resistance)'],
      ['μ (Hansbo)', design.mu],
      ['Stratum', u.head('cv', 'coefficientOfConsolidation'), u.head('ch', 'coefficientOfConsolidation'), u.head('Vertical drainage path', 'length')],
      ...design.strata.map(s => [s.name, u.cv(s.cv), u.cv(s.ch), u.len(s.drainagePath)]),
      [],
    )
  }
  rows.push(
    ['Point', 't50 (years)', 't90 (years)', 't50 without drains (years)', 't90 without drains (years)', 'Removed at (years)', u.head('Rebound', 'length'), u.head('Primary settlement after removal', 'length')],
    ...r.points.map(p => [p.label, p.t50, p.t90, p.t50WithoutDrains ?? null, p.t90WithoutDrains ?? null, p.removedAt ?? null, u.len(p.rebound), u.len(p.residualAfterRemoval)]),
  )
  return rows
}

const SOURCE_WORDS = { data: 'from the tests', default: 'assumed (default)', entered: 'entered' } as const
const QUANTILE_KEYS = ['p05', 'p10', 'p50', 'p90', 'p95'] as const
const QUANTILE_HEADS = ['P5', 'P10', 'P50', 'P90', 'P95']

/** The Probabilistic sheet: the set-up with each COV's source and n, each point's percentiles, exceedance and t90, the sensitivity, the grid's P50/P95. */
function probabilisticSheet(results: RunResults, u: RunUnits): (string | number | null)[][] {
  const setup = results.probabilistic
  if (!setup) return []
  const L = (h: string) => u.head(h, 'length')
  const rows: (string | number | null)[][] = [
    ['Monte Carlo settlement: the spread reflects the scatter of the data entered, not all uncertainty.'],
    ['Realisations', setup.realizations],
    ['Seed', setup.seed],
    ['Cc–e0 correlation', setup.ccE0Correlation],
    [L('Settlement limit'), setup.limit === null ? 'none' : u.len(setup.limit)],
    ['COVs from the data', setup.fromData ? 'yes' : 'no'],
    ['Worker threads', setup.threads],
    [],
    ['Stratum', 'Variable', 'COV', 'Source', 'Tests (n)', u.head('Correlation length', 'length'), 'Whole trend lines'],
    ...setup.strata.flatMap(s => s.variables.map(v => [`${s.code} (${s.name})`, v.variable === 'preconsolidation' ? 'σ\'p' : v.variable, v.trend ? null : v.cov, SOURCE_WORDS[v.source], v.n, v.correlationLength === undefined ? null : u.len(v.correlationLength), v.trend ? 'yes' : null])),
    [],
    ['Point', L('Deterministic'), L('Mean'), L('Standard deviation'), ...QUANTILE_HEADS.map(h => L(h)), 'P(exceeding the limit)', 't90 mean (years)', 't90 sd (years)', ...QUANTILE_HEADS.map(h => `t90 ${h} (years)`)],
    ...results.points.flatMap((p) => {
      const b = p.probabilistic
      if (!b) return []
      return [[p.label, u.len(b.deterministic), u.len(b.mean), u.len(b.sd), ...QUANTILE_KEYS.map(k => u.len(b.quantiles[k])), b.exceedance?.probability ?? null, b.t90?.mean ?? null, b.t90?.sd ?? null, ...QUANTILE_KEYS.map(k => b.t90?.quantiles[k] ?? null)]]
    }),
    [],
    ['Sensitivity: rank correlation of each variable with the settlement (largest first)'],
    ['Point', 'Stratum', 'Variable', 'Rank correlation'],
    ...results.points.flatMap(p => (p.probabilistic?.sensitivity ?? []).map(e => [p.label, e.stratum, e.variable === 'preconsolidation' ? 'σ\'p' : e.variable, e.rankCorrelation])),
  ]
  const g = results.grid
  if (g?.probabilistic) {
    for (const [name, values] of [['P50', g.probabilistic.p50], ['P95', g.probabilistic.p95]] as const) {
      rows.push([], [`${name} of settlement (${u.label('length')}) at each grid point from ${g.probabilistic.realizations} realisations: rows y, columns x (${u.label('length')})`], ['y \\ x', ...g.xs.map(x => u.len(x))], ...g.ys.map((y, j) => [u.len(y), ...(values[j] ?? []).map(v => u.len(v))]))
    }
  }
  if (setup.warnings.length) rows.push([], ['Warnings'], ...setup.warnings.map(w => [w]))
  return rows
}

export function runWorkbook(run: ServerSettlementRun & { results: RunResults }, details: RunPointDetail[], u: RunUnits = runExportUnits({ unitSystem: 'SI', usStressUnit: 'psf' })): Buffer {
  const results = run.results
  const wb = XLSX.utils.book_new()
  const m = run.model
  const inputs: (string | number | null)[][] = [
    ['Run', run.name],
    ['Model', `${m.modelName}, version ${m.version} (${m.status}${m.approvedBy ? `, approved by ${m.approvedBy}` : ''}${m.approvedAt ? ` on ${new Date(m.approvedAt).toISOString().slice(0, 10)}` : ''})`],
    ['Made', `${run.createdAt.toISOString()}${run.createdBy ? ` by ${run.createdBy.name}` : ''}`],
    ['Finished', run.finishedAt?.toISOString() ?? ''],
    ['Units', u.words],
    ['Caution', RESULT_CAUTION],
    [],
    [u.head('Sublayer thickness at most', 'length'), u.len(run.options.maxSublayerThickness)],
    ['Times (years)', run.options.years.join(', ')],
    ['Design life (years)', run.options.designLife],
    ['Angular distortion limit', run.options.angularDistortionLimit],
    ['Grid', run.grid ? `spacing ${u.len(run.grid.spacing)} ${u.label('length')}, margin ${u.len(run.grid.margin)} ${u.label('length')}` : 'none'],
    [],
    ['Load', 'Description'],
    ...run.loads.map((l, i) => [l.label || `Load ${i + 1}`, describeLoad(l, u)]),
    ...(results.warnings.length ? [[], ['Warnings'], ...results.warnings.map(w => [w])] : []),
  ]
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(inputs), 'Inputs')

  const years = run.options.years
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([
    ['Point', u.head('x', 'length'), u.head('y', 'length'), u.head('Settlement', 'length'), 't50 (years)', 't90 (years)', u.head('Secondary over design life', 'length'), u.head('Δσ at surface', 'stress'), ...years.map(y => u.head(`At ${y} years`, 'length')), 'Warnings'],
    ...results.points.map(p => [p.label, u.len(p.x), u.len(p.y), u.len(p.settlement), p.t50, p.t90, u.len(p.secondary), u.stress(p.surfaceStressIncrease), ...years.map(y => u.len(p.time.find(t => t.years === y)?.settlement)), p.warnings.join(' ')]),
    [],
    [u.head('Largest settlement', 'length'), u.len(results.maximum.settlement), 'at', results.maximum.label ?? `(${u.len(results.maximum.x)}, ${u.len(results.maximum.y)})`],
  ]), 'Points')

  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([
    ['Point', 'Layer', u.head('Top', 'length'), u.head('Bottom', 'length'), u.head('Mid-depth', 'length'), u.head('Thickness', 'length'), u.head("σ'v0", 'stress'), u.head('Δσ', 'stress'), u.head("σ'v final", 'stress'), u.head("σ'p", 'stress'), u.head("σ'p final", 'stress'), 'Case', 'Δe', 'Strain', u.head('Compression', 'length')],
    ...details.flatMap(d => d.sublayers.map(s => [d.label, s.layer, u.len(s.top), u.len(s.bottom), u.len(s.depth), u.len(s.thickness), u.stress(s.effectiveStress), u.stress(s.stressIncrease), u.stress(s.finalEffectiveStress), u.stress(s.preconsolidation), u.stress(s.finalPreconsolidation), s.case, s.voidRatioChange, s.strain, u.len(s.compression)])),
  ]), 'Sublayers')

  const treated = results.points.some(p => p.curve?.surfaceLoad)
  const curves: (string | number | null)[][] = [['Point', 'Time (years)', u.head('Primary', 'length'), u.head('Secondary', 'length'), u.head('Total', 'length'), ...(treated ? [u.head('Primary without drains', 'length'), u.head('Δσ at surface', 'stress')] : [])]]
  for (const p of results.points) {
    const c = p.curve
    if (c) c.years.forEach((t, i) => curves.push([p.label, t, u.len(c.primary[i]), u.len(c.secondary[i]), u.len(c.total[i]), ...(treated ? [u.len(c.withoutDrains?.[i]), u.stress(c.surfaceLoad?.[i])] : [])]))
    else p.time.forEach(t => curves.push([p.label, t.years, u.len(t.settlement), null, null]))
  }
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(curves), 'Time curves')

  const g = results.grid
  const grid: (string | number | null)[][] = g
    ? [
        [`Settlement (${u.label('length')}) at each grid point: rows y (${u.label('length')}), columns x (${u.label('length')})`],
        ['y \\ x', ...g.xs.map(x => u.len(x))],
        ...g.ys.map((y, j) => [u.len(y), ...(g.settlement[j] ?? []).map(v => u.len(v))]),
        [],
        [u.head('Largest differential settlement', 'length'), u.len(g.maxDifferential)],
        ['Largest angular distortion', g.maxAngularDistortion],
        ['Limit', g.angularDistortionLimit],
        ['Exceeds the limit', g.exceedsLimit ? 'yes' : 'no'],
      ]
    : [['No grid in this run.']]
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(grid), 'Grid')
  if (isTreated(run.loads, run.options.drains)) XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(treatmentSheet(run, u)), 'Treatment')
  if (results.probabilistic) XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(probabilisticSheet(results, u)), 'Probabilistic')
  return XLSX.write(wb, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer
}

export async function exportSettlementRun(project: Pick<ProjectRow, 'id' | 'unitSystem' | 'usStressUnit'>, runId: string, format: 'xlsx' | 'json'): Promise<RunExportFile> {
  const { run, details } = await settlementRunForExport(project.id, runId)
  const results = run.results
  if (run.status !== 'finished' || !results) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `The run is ${run.status}: it can be exported once it has finished.`, data: { status: run.status } })
  }
  if (format === 'json') {
    return {
      body: JSON.stringify({
        caution: RESULT_CAUTION,
        units: { length: 'm', stress: 'kPa', unitWeight: 'kN/m³', time: 'years' },
        run,
        points: details,
        ...(isTreated(run.loads, run.options.drains) ? { treatment: { schedule: scheduleRows(run.loads), drains: results.drains ?? null } } : {}),
      }, null, 2),
      contentType: 'application/json; charset=utf-8',
      disposition: contentDisposition('attachment', runFileName(run.name, 'json')),
    }
  }
  return {
    body: runWorkbook({ ...run, results }, details, runExportUnits(project)),
    contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    disposition: contentDisposition('attachment', runFileName(run.name, 'xlsx')),
  }
}
