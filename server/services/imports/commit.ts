import { and, count, eq, sql } from 'drizzle-orm'
import type { CptColumns } from '#shared/imports/cpt-csv'
import { type ImportContext, type ImportTarget, type ParsedValue, stageConventionOf, STAGE_VALUE_FIELDS, vaneKey } from '#shared/imports/targets'
import { checkPointLimit } from '#shared/imports/limits'
import { type Tx, useDb } from '~~/server/db/client'
import { anyOf } from '~~/server/db/any'
import { groundwaterObservations, indexTests, investigationPoints, logIntervals, projects, samples, strata, vaneReadings } from '~~/server/db/schema'
import { recordAudit } from '../audit'
import { replaceCptSounding } from '../cpt'
import { replaceTestStages } from '../lab'

type Rec = Record<string, ParsedValue | undefined>

/** What an import needs to know about the project to check references. */
export async function importContext(projectId: string): Promise<ImportContext & { pointIds: Map<string, string>, strataIds: Map<string, string>, sampleIds: Map<string, string> }> {
  const db = useDb()
  const [points, sampleRows, strataRows] = await Promise.all([
    db.select({ id: investigationPoints.id, identifier: investigationPoints.identifier, finalDepth: investigationPoints.finalDepth }).from(investigationPoints).where(eq(investigationPoints.projectId, projectId)),
    db.select({ id: samples.id, identifier: samples.identifier, point: investigationPoints.identifier }).from(samples).innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId)).where(eq(investigationPoints.projectId, projectId)),
    db.select({ id: strata.id, code: strata.code }).from(strata).where(eq(strata.projectId, projectId)),
  ])
  return {
    points: new Map(points.map(p => [p.identifier, { finalDepth: p.finalDepth }])),
    pointIds: new Map(points.map(p => [p.identifier, p.id])),
    samples: new Set(sampleRows.map(s => `${s.point}/${s.identifier}`)),
    sampleIds: new Map(sampleRows.map(s => [`${s.point}/${s.identifier}`, s.id])),
    strata: new Set(strataRows.map(s => s.code)),
    strataIds: new Map(strataRows.map(s => [s.code, s.id])),
  }
}

const str = (v: ParsedValue | undefined) => (typeof v === 'string' ? v : '')
const strOrNull = (v: ParsedValue | undefined) => (typeof v === 'string' && v !== '' ? v : null)
const num = (v: ParsedValue | undefined) => v as number
const numOrNull = (v: ParsedValue | undefined) => (typeof v === 'number' ? v : null)

/**
 * Writes validated records in the caller's transaction. Intervals replace the
 * whole log of every point the file names; other targets add rows (index tests
 * replace a sample's existing set). A CPT import passes its columns as typed
 * arrays when the fast CSV check produced them (`cpt`), else they come from the records.
 */
export async function writeImport(tx: Tx, args: { projectId: string, actorId: string, target: ImportTarget, records: Rec[], cpt?: CptColumns, filename: string, cptPointId?: string, areaRatio?: number, testId?: string, testVersion?: number, mapping?: Record<string, string> }, ctx: Awaited<ReturnType<typeof importContext>>): Promise<number> {
  const { projectId, target, records } = args
  let written = records.length
  const pid = (r: Rec) => ctx.pointIds.get(str(r.point))!
  const CHUNK = 2000
  const insertChunks = async <T>(rows: T[], insert: (chunk: T[]) => Promise<unknown>) => {
    for (let i = 0; i < rows.length; i += CHUNK) await insert(rows.slice(i, i + CHUNK))
  }
  switch (target) {
    case 'points':
      await insertChunks(records.map(r => ({
        projectId, identifier: str(r.identifier), kind: r.kind as 'borehole', easting: num(r.easting), northing: num(r.northing), groundElevation: num(r.groundElevation), finalDepth: num(r.finalDepth),
        startedOn: strOrNull(r.startedOn), endedOn: strOrNull(r.endedOn), method: str(r.method), loggedBy: str(r.loggedBy), remarks: str(r.remarks),
      })), c => tx.insert(investigationPoints).values(c))
      break
    case 'intervals': {
      const pointIds = [...new Set(records.map(pid))]
      if (pointIds.length) await tx.delete(logIntervals).where(anyOf(logIntervals.pointId, pointIds))
      await insertChunks(records.map(r => ({
        pointId: pid(r), top: num(r.top), bottom: num(r.bottom), description: str(r.description), uscs: strOrNull(r.uscs),
        stratumId: typeof r.stratum === 'string' ? ctx.strataIds.get(r.stratum) ?? null : null, moisture: strOrNull(r.moisture), consistency: strOrNull(r.consistency),
      })), c => tx.insert(logIntervals).values(c))
      break
    }
    case 'samples':
      await insertChunks(records.map(r => ({
        pointId: pid(r), identifier: str(r.identifier), top: num(r.top), bottom: num(r.bottom), type: r.type as 'bulk', recovery: numOrNull(r.recovery), remarks: str(r.remarks),
      })), c => tx.insert(samples).values(c))
      break
    case 'index-tests':
      for (const r of records) {
        const sampleId = ctx.sampleIds.get(`${str(r.point)}/${str(r.sample)}`)!
        const values = { waterContent: numOrNull(r.waterContent), liquidLimit: numOrNull(r.liquidLimit), plasticLimit: numOrNull(r.plasticLimit), bulkUnitWeight: numOrNull(r.bulkUnitWeight) }
        await tx.insert(indexTests).values({ ...values, sampleId })
          .onConflictDoUpdate({ target: indexTests.sampleId, set: { ...values, version: sql`${indexTests.version} + 1`, updatedAt: new Date() } })
      }
      break
    case 'groundwater':
      await insertChunks(records.map(r => ({
        pointId: pid(r), kind: r.kind as 'strike', observedAt: str(r.observedAt), depth: numOrNull(r.depth), pressure: numOrNull(r.pressure), remarks: str(r.remarks),
      })), c => tx.insert(groundwaterObservations).values(c))
      break
    case 'cpt': {
      const cols = args.cpt ?? cptColumnsOf(records)
      await replaceCptSounding({ actorId: args.actorId, projectId, pointId: args.cptPointId! }, { areaRatio: args.areaRatio!, ...cols }, tx)
      written = cols.depth.length
      break
    }
    case 'oedometer-stages': {
      const convention = stageConventionOf(args.mapping ?? {})!
      const key = STAGE_VALUE_FIELDS[convention]
      // The stage replacement records its own audit entry (before and after), so it returns here.
      await replaceTestStages(tx, { projectId, actorId: args.actorId, testId: args.testId!, version: args.testVersion!, convention, stages: records.map(r => ({ stress: num(r.stress), value: num(r[key]) })), filename: args.filename })
      return records.length
    }
    case 'vane':
      await insertChunks(records.map(r => ({ pointId: pid(r), depth: num(r.depth), peak: num(r.peak), remoulded: numOrNull(r.remoulded) })), c => tx.insert(vaneReadings).values(c))
      break
  }
  await recordAudit({ actorId: args.actorId, projectId, action: 'import', entity: target, entityId: args.cptPointId ?? null, after: { filename: args.filename, rows: written } }, tx)
  return written
}

/** The CPT columns of records checked by the general row check (XLSX, or a CSV with quoted fields). */
function cptColumnsOf(records: Rec[]): CptColumns {
  const n = records.length
  const cols: CptColumns = { depth: new Float64Array(n), qc: new Float64Array(n), fs: new Float64Array(n), u2: new Float64Array(n) }
  for (let i = 0; i < n; i++) {
    const r = records[i]!
    cols.depth[i] = num(r.depth)
    cols.qc[i] = num(r.qc)
    cols.fs[i] = num(r.fs)
    cols.u2[i] = num(r.u2)
  }
  return cols
}

export async function pointInProject(projectId: string, pointId: string) {
  const [p] = await useDb().select().from(investigationPoints).where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, projectId)))
  return p
}

/** Vane readings already in the project, keyed like the import's duplicate check. */
export async function vaneDepths(projectId: string): Promise<Set<string>> {
  const rows = await useDb().select({ point: investigationPoints.identifier, depth: vaneReadings.depth }).from(vaneReadings)
    .innerJoin(investigationPoints, eq(investigationPoints.id, vaneReadings.pointId)).where(eq(investigationPoints.projectId, projectId))
  return new Set(rows.map(r => vaneKey(r.point, r.depth)))
}

/**
 * In the importing transaction: holds the project's row so two imports of
 * points cannot both pass the point limit, then refuses (`ImportLimitError`)
 * when `adding` points would bring the project past it.
 */
export async function holdPointLimit(tx: Tx, projectId: string, adding: number): Promise<void> {
  if (adding <= 0) return
  await tx.select({ id: projects.id }).from(projects).where(eq(projects.id, projectId)).for('no key update')
  const [row] = await tx.select({ n: count() }).from(investigationPoints).where(eq(investigationPoints.projectId, projectId))
  checkPointLimit(row?.n ?? 0, adding)
}
