import { asc, eq } from 'drizzle-orm'
import * as XLSX from 'xlsx-republish'
import { RESULT_CAUTION } from '#shared/caution'
import { useDb } from '~~/server/db/client'
import { anyOf } from '~~/server/db/any'
import type { InvestigationRecord, PointRecord } from '#shared/investigation/types'
import { pointHeader } from '#shared/investigation/point-header'
import { cptSoundings, groundwaterObservations, indexTests, investigationPoints, logIntervals, oedometerTests, samples, sptResults, strata, vaneReadings } from '~~/server/db/schema'
import type { ProjectRow } from '~~/server/utils/guards'
import { sptBlowsText, sptFromStored, sptResultText, sptStored } from '#shared/investigation/spt-blows'
import { convert, unitLabel, type Quantity } from '#shared/units'

/** Everything logged in a project, one row per record, for the exports. */
export async function loadProjectLogs(projectId: string) {
  const db = useDb()
  const points = await db.select().from(investigationPoints).where(eq(investigationPoints.projectId, projectId)).orderBy(asc(investigationPoints.identifier))
  const ids = points.map(p => p.id)
  const none = ids.length === 0
  const byId = new Map(points.map(p => [p.id, p.identifier]))
  const [strataRows, intervals, sampleRows, spt, groundwater, vane, cpt] = await Promise.all([
    db.select().from(strata).where(eq(strata.projectId, projectId)).orderBy(asc(strata.displayOrder)),
    none ? [] : db.select().from(logIntervals).where(anyOf(logIntervals.pointId, ids)).orderBy(asc(logIntervals.pointId), asc(logIntervals.top)),
    none ? [] : db.select({ sample: samples, index: indexTests }).from(samples).leftJoin(indexTests, eq(indexTests.sampleId, samples.id)).where(anyOf(samples.pointId, ids)).orderBy(asc(samples.pointId), asc(samples.top)),
    none ? [] : db.select().from(sptResults).where(anyOf(sptResults.pointId, ids)).orderBy(asc(sptResults.pointId), asc(sptResults.depth)),
    none ? [] : db.select().from(groundwaterObservations).where(anyOf(groundwaterObservations.pointId, ids)).orderBy(asc(groundwaterObservations.pointId), asc(groundwaterObservations.observedAt)),
    none ? [] : db.select().from(vaneReadings).where(anyOf(vaneReadings.pointId, ids)).orderBy(asc(vaneReadings.pointId), asc(vaneReadings.depth)),
    none ? [] : db.select().from(cptSoundings).where(anyOf(cptSoundings.pointId, ids)),
  ])
  return { points, byId, strata: strataRows, intervals, samples: sampleRows, spt, groundwater, vane, cpt }
}

/** Values and column labels in the project's units (SI or US, psf or tsf); SI values as stored, converted ones rounded to what a file needs. */
export function exportUnits(project: Pick<ProjectRow, 'unitSystem' | 'usStressUnit'>) {
  const opts = { usStress: project.usStressUnit }
  const DIGITS: Record<Quantity, number> = { length: 4, stress: 3, unitWeight: 3, coefficientOfConsolidation: 4 }
  const v = (x: number | null | undefined, q: Quantity) => (x === null || x === undefined ? null : project.unitSystem === 'SI' ? x : Number(convert(x, q, 'SI', project.unitSystem, opts).toFixed(DIGITS[q])))
  const label = (q: Quantity) => unitLabel(q, project.unitSystem, opts)
  return {
    len: (x: number | null | undefined) => v(x, 'length'),
    stress: (x: number | null | undefined) => v(x, 'stress'),
    gamma: (x: number | null | undefined) => v(x, 'unitWeight'),
    cv: (x: number | null | undefined) => v(x, 'coefficientOfConsolidation'),
    label,
    /** "Depth (ft)". */
    head: (text: string, q: Quantity) => `${text} (${label(q)})`,
    /** The About sheet's units line. */
    words: `${label('length')}, ${label('stress')}, ${label('unitWeight')}, %`,
  }
}

/** The project's logs as an XLSX workbook, one sheet per table, in the project's units with their labels in the headers. */
export async function logsWorkbook(project: ProjectRow): Promise<Buffer> {
  const d = await loadProjectLogs(project.id)
  const u = exportUnits(project)
  const L = (text: string) => u.head(text, 'length')
  const S = (text: string) => u.head(text, 'stress')
  const G = (text: string) => u.head(text, 'unitWeight')
  const code = new Map(d.strata.map(s => [s.id, s.code]))
  const pt = (id: string) => d.byId.get(id) ?? ''
  const wb = XLSX.utils.book_new()
  const add = (name: string, rows: (string | number | null)[][]) => XLSX.utils.book_append_sheet(wb, XLSX.utils.aoa_to_sheet(rows), name)
  add('About', [
    ['Project', `${project.jobNumber} ${project.name}`],
    ['Client', project.client],
    ['Exported', new Date().toISOString()],
    ['Units', u.words],
    ['Caution', RESULT_CAUTION],
  ])
  add('Strata', [['Code', 'Name', 'Description', G('Unit weight'), G('Saturated unit weight')], ...d.strata.map(s => [s.code, s.name, s.description, u.gamma(s.unitWeight), u.gamma(s.unitWeightSaturated)])])
  add('Points', [['Point', 'Kind', L('Easting'), L('Northing'), L('Ground elevation'), L('Final depth'), 'Started', 'Ended', 'Method', 'Logged by', 'Remarks'],
    ...d.points.map(p => [p.identifier, p.kind, u.len(p.easting), u.len(p.northing), u.len(p.groundElevation), u.len(p.finalDepth), p.startedOn, p.endedOn, p.method, p.loggedBy, p.remarks])])
  add('Intervals', [['Point', L('Top'), L('Bottom'), 'Description', 'USCS', 'Stratum', 'Moisture', 'Consistency / density'],
    ...d.intervals.map(i => [pt(i.pointId), u.len(i.top), u.len(i.bottom), i.description, i.uscs, i.stratumId ? code.get(i.stratumId) ?? null : null, i.moisture, i.consistency])])
  add('Samples', [['Point', 'Sample', L('Top'), L('Bottom'), 'Type', 'Recovery (%)', 'Remarks'],
    ...d.samples.map(({ sample: s }) => [pt(s.pointId), s.identifier, u.len(s.top), u.len(s.bottom), s.type, s.recovery, s.remarks])])
  add('Index tests', [['Point', 'Sample', 'Water content (%)', 'Liquid limit (%)', 'Plastic limit (%)', 'Plasticity index (%)', G('Bulk unit weight')],
    ...d.samples.flatMap(({ sample: s, index: i }) => i ? [[pt(s.pointId), s.identifier, i.waterContent, i.liquidLimit, i.plasticLimit, i.liquidLimit !== null && i.plasticLimit !== null ? i.liquidLimit - i.plasticLimit : null, u.gamma(i.bulkUnitWeight)]] : [])])
  // Blows as written and the result as reported: N, or blows over the penetration when the test drive stopped short ("50/100 mm").
  add('SPT', [['Point', L('Depth'), 'Blows', 'Seating blows', 'Seating (mm)', 'Test drive blows', 'Test drive (mm)', 'N', 'Result'], ...d.spt.map((s) => {
    const t = sptFromStored(s)
    return [pt(s.pointId), u.len(s.depth), sptBlowsText(t), t.seating.length ? t.seatingBlows : null, t.seating.length ? t.seatingPenetration : null, t.testBlows, t.testPenetration, t.n, sptResultText(t)]
  })])
  add('Groundwater', [['Point', 'Kind', 'Observed at', L('Depth'), S('Pressure'), 'Remarks'], ...d.groundwater.map(g => [pt(g.pointId), g.kind, g.observedAt, u.len(g.depth), u.stress(g.pressure), g.remarks])])
  add('Vane', [['Point', L('Depth'), S('Peak su,FV'), S('Remoulded')], ...d.vane.map(v => [pt(v.pointId), u.len(v.depth), u.stress(v.peak), u.stress(v.remoulded)])])
  const cptRows: (string | number | null)[][] = [['Point', 'Cone area ratio', L('Depth'), S('qc'), S('fs'), S('u2')]]
  for (const c of d.cpt) {
    for (let i = 0; i < c.count; i++) cptRows.push([pt(c.pointId), c.areaRatio, u.len(c.depth[i]), u.stress(c.qc[i]), u.stress(c.fs[i]), u.stress(c.u2[i])])
  }
  add('CPT', cptRows)
  return XLSX.write(wb, { type: 'buffer', bookType: 'xlsx', compression: true }) as Buffer
}

/** A file name safe for Content-Disposition. */
export function exportName(project: ProjectRow, what: string, ext: string): string {
  return `${project.jobNumber}-${what}.${ext}`.replace(/[^A-Za-z0-9._-]+/g, '_')
}

/** The project's investigation as the shared interchange model (for the AGS4 export). */
export async function loadInvestigationRecord(project: ProjectRow): Promise<InvestigationRecord> {
  const d = await loadInvestigationRows(project.id)
  return { project: { jobNumber: project.jobNumber, name: project.name, client: project.client }, strata: d.strata, points: d.points.map(p => p.record) }
}

/**
 * The project's strata and points as interchange records, each point with the stored ids of its
 * rows in the record's order (intervals, samples, SPT, groundwater, vane) and its samples' oedometer
 * test counts: what an import that updates holes compares the file with.
 */
export async function loadInvestigationRows(projectId: string) {
  const d = await loadProjectLogs(projectId)
  const db = useDb()
  const sampleIds = d.samples.map(s => s.sample.id)
  const tests = sampleIds.length ? await db.select().from(oedometerTests).where(anyOf(oedometerTests.sampleId, sampleIds)) : []
  const code = new Map(d.strata.map(s => [s.id, s.code]))
  const by = <T extends { pointId: string }>(rows: T[]) => {
    const m = new Map<string, T[]>()
    for (const r of rows) m.set(r.pointId, [...(m.get(r.pointId) ?? []), r])
    return m
  }
  const intervals = by(d.intervals)
  const samplesBy = by(d.samples.map(s => ({ ...s, pointId: s.sample.pointId })))
  const spt = by(d.spt)
  const gw = by(d.groundwater)
  const vane = by(d.vane)
  const cpt = new Map(d.cpt.map(c => [c.pointId, { areaRatio: c.areaRatio, depth: c.depth, qc: c.qc, fs: c.fs, u2: c.u2 }]))
  const test = new Map(tests.map(t => [t.sampleId, t]))
  const testCount = new Map<string, number>()
  for (const t of tests) testCount.set(t.sampleId, (testCount.get(t.sampleId) ?? 0) + 1)
  return {
    strata: d.strata.map(s => ({ code: s.code, name: s.name, description: s.description, colour: s.colour, pattern: s.pattern, unitWeight: s.unitWeight, unitWeightSaturated: s.unitWeightSaturated, displayOrder: s.displayOrder })),
    points: d.points.map(p => ({
      id: p.id,
      intervalIds: (intervals.get(p.id) ?? []).map(i => i.id),
      sampleIds: (samplesBy.get(p.id) ?? []).map(s => s.sample.id),
      sampleTestCounts: (samplesBy.get(p.id) ?? []).map(s => testCount.get(s.sample.id) ?? 0),
      sptIds: (spt.get(p.id) ?? []).map(s => s.id),
      groundwaterIds: (gw.get(p.id) ?? []).map(g => g.id),
      vaneIds: (vane.get(p.id) ?? []).map(v => v.id),
      record: {
        ...pointHeader(p),
        intervals: (intervals.get(p.id) ?? []).map(i => ({ top: i.top, bottom: i.bottom, description: i.description, uscs: i.uscs, stratumCode: i.stratumId ? code.get(i.stratumId) ?? null : null, moisture: i.moisture, consistency: i.consistency })),
        samples: (samplesBy.get(p.id) ?? []).map(({ sample: s, index: i }) => {
          const t = test.get(s.id)
          return {
            identifier: s.identifier,
            top: s.top,
            bottom: s.bottom,
            type: s.type,
            recovery: s.recovery,
            remarks: s.remarks,
            index: i ? { waterContent: i.waterContent, liquidLimit: i.liquidLimit, plasticLimit: i.plasticLimit, bulkUnitWeight: i.bulkUnitWeight } : null,
            // Stored in mm; the interchange model uses m.
            oedometer: t ? { testType: t.testType, specimenHeight: t.specimenHeight / 1000, initialWaterContent: t.initialWaterContent, specificGravity: t.specificGravity, e0: t.e0, stages: t.stages.map(st => ({ stress: st.stress, voidRatio: st.voidRatio })), remarks: t.remarks } : null,
          }
        }),
        spt: (spt.get(p.id) ?? []).map(s => ({ depth: s.depth, ...sptStored(sptFromStored(s)) })),
        groundwater: (gw.get(p.id) ?? []).map(g => ({ kind: g.kind, observedAt: new Date(g.observedAt).toISOString(), depth: g.depth, pressure: g.pressure, remarks: g.remarks })),
        cpt: cpt.get(p.id) ?? null,
        vane: (vane.get(p.id) ?? []).map(v => ({ depth: v.depth, peak: v.peak, remoulded: v.remoulded })),
      } satisfies PointRecord,
    })),
  }
}
