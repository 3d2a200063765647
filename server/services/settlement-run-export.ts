import * as XLSX from 'xlsx-republish'
import { RESULT_CAUTION } from '#shared/caution'
import { isTreated, scheduleRows } from '#shared/settlement-run/treatment'
import type { RunPointDetail, RunResults, ServerSettlementRun } from '#shared/types/settlement-runs'
import { contentDisposition } from './attachments'
import { settlementRunForExport } from './settlement-runs'

/**
 * A finished settlement run as a workbook (sheets Inputs, Points, Sublayers, Time curves, Grid,
 * and Treatment when the run has a construction schedule, a removal or drains; SI units, the
 * caution on the first sheet) or as JSON (the run as `GET …/{runId}` answers it, with the caution,
 * every point's sublayer table and `treatment`: the schedule rows and the drain design). A run
 * not yet finished is 409.
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

function describeLoad(l: ServerSettlementRun['loads'][number]): string {
  const p = 'pressure' in l && l.pressure !== undefined ? `${l.pressure} kPa` : 'fill' in l && l.fill ? `fill ${l.fill.thickness} m × ${l.fill.unitWeight} kN/m³` : ''
  switch (l.type) {
    case 'uniform': return `uniform, ${p}`
    case 'rectangle': return `rectangle at (${l.x}, ${l.y}) m, ${l.width} m × ${l.length} m, rotated ${l.rotation}°, ${p}`
    case 'circle': return `circle at (${l.x}, ${l.y}) m, radius ${l.radius} m, ${p}`
    case 'embankment': return `embankment at (${l.x}, ${l.y}) m, crest ${l.crestWidth} m × ${l.crestLength} m, ${l.height} m high, side slope ${l.sideSlope}:1, γ ${l.unitWeight} kN/m³, rotated ${l.rotation}°`
  }
}

/** The Treatment sheet: the construction schedule, the drain design and each point's figures. */
function treatmentSheet(run: ServerSettlementRun & { results: RunResults }): (string | number | null)[][] {
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
      ['Spacing (m)', d.spacing],
      ['Equivalent diameter dw (m)', d.diameter],
      ['Influence diameter De (m)', design.influenceDiameter],
      ['Smear ratio ds/dw', d.smearRatio],
      ['Permeability ratio kh/ks', d.permeabilityRatio],
      ['ch/cv', d.chRatio],
      ['Discharge capacity qw (m³/yr)', d.dischargeCapacity ?? 'not given (no well resistance)'],
      ['μ (Hansbo)', design.mu],
      ['Stratum', 'cv (m²/yr)', 'ch (m²/yr)', 'Vertical drainage path (m)'],
      ...design.strata.map(s => [s.name, s.cv, s.ch, s.drainagePath]),
      [],
    )
  }
  rows.push(
    ['Point', 't50 (years)', 't90 (years)', 't50 without drains (years)', 't90 without drains (years)', 'Removed at (years)', 'Rebound (m)', 'Primary settlement after removal (m)'],
    ...r.points.map(p => [p.label, p.t50, p.t90, p.t50WithoutDrains ?? null, p.t90WithoutDrains ?? null, p.removedAt ?? null, p.rebound ?? null, p.residualAfterRemoval ?? null]),
  )
  return rows
}

export function runWorkbook(run: ServerSettlementRun & { results: RunResults }, details: RunPointDetail[]): Buffer {
  const results = run.results
  const wb = XLSX.utils.book_new()
  const m = run.model
  const inputs: (string | number | null)[][] = [
    ['Run', run.name],
    ['Model', `${m.modelName}, version ${m.version} (${m.status}${m.approvedBy ? `, approved by ${m.approvedBy}` : ''}${m.approvedAt ? ` on ${new Date(m.approvedAt).toISOString().slice(0, 10)}` : ''})`],
    ['Made', `${run.createdAt.toISOString()}${run.createdBy ? ` by ${run.createdBy.name}` : ''}`],
    ['Finished', run.finishedAt?.toISOString() ?? ''],
    ['Units', 'm, kPa, kN/m³, years'],
    ['Caution', RESULT_CAUTION],
    [],
    ['Sublayer thickness at most (m)', run.options.maxSublayerThickness],
    ['Times (years)', run.options.years.join(', ')],
    ['Design life (years)', run.options.designLife],
    ['Angular distortion limit', run.options.angularDistortionLimit],
    ['Grid', run.grid ? `spacing ${run.grid.spacing} m, margin ${run.grid.margin} m` : 'none'],
    [],
    ['Load', 'Description'],
    ...run.loads.map((l, i) => [l.label || `Load ${i + 1}`, describeLoad(l)]),
    ...(results.warnings.length ? [[], ['Warnings'], ...results.warnings.map(w => [w])] : []),
  ]
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(inputs), 'Inputs')

  const years = run.options.years
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([
    ['Point', 'x (m)', 'y (m)', 'Settlement (m)', 't50 (years)', 't90 (years)', 'Secondary over design life (m)', 'Δσ at surface (kPa)', ...years.map(y => `At ${y} years (m)`), 'Warnings'],
    ...results.points.map(p => [p.label, p.x, p.y, p.settlement, p.t50, p.t90, p.secondary, p.surfaceStressIncrease, ...years.map(y => p.time.find(t => t.years === y)?.settlement ?? null), p.warnings.join(' ')]),
    [],
    ['Largest settlement (m)', results.maximum.settlement, 'at', results.maximum.label ?? `(${results.maximum.x}, ${results.maximum.y})`],
  ]), 'Points')

  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet([
    ['Point', 'Layer', 'Top (m)', 'Bottom (m)', 'Mid-depth (m)', 'Thickness (m)', "σ'v0 (kPa)", 'Δσ (kPa)', "σ'v final (kPa)", "σ'p (kPa)", "σ'p final (kPa)", 'Case', 'Δe', 'Strain', 'Compression (m)'],
    ...details.flatMap(d => d.sublayers.map(s => [d.label, s.layer, s.top, s.bottom, s.depth, s.thickness, s.effectiveStress, s.stressIncrease, s.finalEffectiveStress, s.preconsolidation, s.finalPreconsolidation, s.case, s.voidRatioChange, s.strain, s.compression])),
  ]), 'Sublayers')

  const treated = results.points.some(p => p.curve?.surfaceLoad)
  const curves: (string | number | null)[][] = [['Point', 'Time (years)', 'Primary (m)', 'Secondary (m)', 'Total (m)', ...(treated ? ['Primary without drains (m)', 'Δσ at surface (kPa)'] : [])]]
  for (const p of results.points) {
    const c = p.curve
    if (c) c.years.forEach((t, i) => curves.push([p.label, t, c.primary[i] ?? null, c.secondary[i] ?? null, c.total[i] ?? null, ...(treated ? [c.withoutDrains?.[i] ?? null, c.surfaceLoad?.[i] ?? null] : [])]))
    else p.time.forEach(t => curves.push([p.label, t.years, t.settlement, null, null]))
  }
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(curves), 'Time curves')

  const g = results.grid
  const grid: (string | number | null)[][] = g
    ? [
        ['Settlement (m) at each grid point: rows y (m), columns x (m)'],
        ['y \\ x', ...g.xs],
        ...g.ys.map((y, j) => [y, ...(g.settlement[j] ?? [])]),
        [],
        ['Largest differential settlement (m)', g.maxDifferential],
        ['Largest angular distortion', g.maxAngularDistortion],
        ['Limit', g.angularDistortionLimit],
        ['Exceeds the limit', g.exceedsLimit ? 'yes' : 'no'],
      ]
    : [['No grid in this run.']]
  XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(grid), 'Grid')
  if (isTreated(run.loads, run.options.drains)) XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(treatmentSheet(run)), 'Treatment')
  return XLSX.write(wb, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer
}

export async function exportSettlementRun(projectId: string, runId: string, format: 'xlsx' | 'json'): Promise<RunExportFile> {
  const { run, details } = await settlementRunForExport(projectId, runId)
  const results = run.results
  if (run.status !== 'finished' || !results) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `The run is ${run.status}: it can be exported once it has finished.`, data: { status: run.status } })
  }
  if (format === 'json') {
    return {
      body: JSON.stringify({
        caution: RESULT_CAUTION,
        run,
        points: details,
        ...(isTreated(run.loads, run.options.drains) ? { treatment: { schedule: scheduleRows(run.loads), drains: results.drains ?? null } } : {}),
      }, null, 2),
      contentType: 'application/json; charset=utf-8',
      disposition: contentDisposition('attachment', runFileName(run.name, 'json')),
    }
  }
  return {
    body: runWorkbook({ ...run, results }, details),
    contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    disposition: contentDisposition('attachment', runFileName(run.name, 'xlsx')),
  }
}
