import { and, count, eq, sql } from 'drizzle-orm'
import { type Capability, type ProjectRole, roleCan } from '#shared/auth/roles'
import { checkCptCsv, type CptColumns, type PlainCsvText } from '#shared/imports/cpt-csv'
import { checkMapping, checkUnits, type ImportContext, type ImportTarget, type ParsedValue, type RowError, stageConventionOf, STAGE_VALUE_FIELDS, validateRows, vaneKey } from '#shared/imports/targets'
import { checkPointLimit, IMPORT_ROW_LIMITS, tooManyRows } from '#shared/imports/limits'
import type { ImportCommit } from '#shared/schemas/imports'
import type { LogReplacement } from '#shared/types/imports'
import { type Tx, useDb } from '~~/server/db/client'
import { anyOf } from '~~/server/db/any'
import { groundwaterObservations, importFiles, importMappings, indexTests, investigationPoints, logIntervals, projects, samples, strata, vaneReadings } from '~~/server/db/schema'
import { recordAudit } from '../audit'
import { replaceCptSounding } from '../cpt'
import { notFound, unprocessableError } from '../http-errors'
import { replaceTestStages, requireTest, staleTest } from '../lab'
import type { UploadFormat } from './files'
import { asUploadRefusal, loadImportFile, plainCsvOrThrow, tableOrThrow } from './preview'
import { projectDepthWords } from '~~/server/services/project-units'

type Rec = Record<string, ParsedValue | undefined>

/** What an import needs to know about the project to check references. */
export async function importContext(projectId: string): Promise<ImportContext & { pointIds: Map<string, string>, strataIds: Map<string, string>, sampleIds: Map<string, string> }> {
  const db = useDb()
  const [points, sampleRows, strataRows, words] = await Promise.all([
    db.select({ id: investigationPoints.id, identifier: investigationPoints.identifier, finalDepth: investigationPoints.finalDepth }).from(investigationPoints).where(eq(investigationPoints.projectId, projectId)),
    db.select({ id: samples.id, identifier: samples.identifier, point: investigationPoints.identifier }).from(samples).innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId)).where(eq(investigationPoints.projectId, projectId)),
    db.select({ id: strata.id, code: strata.code }).from(strata).where(eq(strata.projectId, projectId)),
    projectDepthWords(projectId, db),
  ])
  return {
    depthWords: words.depth,
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

export type ProjectImportContext = Awaited<ReturnType<typeof importContext>>
type Source = { plain: PlainCsvText, table?: undefined } | { plain?: undefined, table: Awaited<ReturnType<typeof tableOrThrow>> }
interface Checked { records: Rec[], cpt?: CptColumns, errors: RowError[], rowCount: number }
interface WriteArgs<B> { projectId: string, actorId: string, body: B, records: Rec[], cpt?: CptColumns, filename: string }

/** One import target: what it needs to know first, how its rows are checked, how they are written. */
interface ImportTargetEntry<B extends ImportCommit> {
  /** A capability the role needs beyond `logs.write` (test data is entered by the roles that may enter tests). */
  capability?: Capability
  /** Adds what the target's check needs to the project's context (404 / 409 on what the body names). */
  context?: (projectId: string, body: B, ctx: ProjectImportContext) => Promise<void>
  /** The row check; default: every row of the table against the target's fields and the project. */
  check?: (source: Source, body: B, ctx: ProjectImportContext, filename: string) => Checked
  /** Writes the checked rows in the caller's transaction; returns the rows written and whether it audited itself. */
  write: (tx: Tx, args: WriteArgs<B>, ctx: ProjectImportContext) => Promise<{ written: number, audited?: boolean }>
}

type BodyOf<T extends ImportTarget> = ImportCommit & { target: T }

const CHUNK = 2000
async function insertChunks<T>(rows: T[], insert: (chunk: T[]) => Promise<unknown>) {
  for (let i = 0; i < rows.length; i += CHUNK) await insert(rows.slice(i, i + CHUNK))
}
const pid = (ctx: ProjectImportContext, r: Rec) => ctx.pointIds.get(str(r.point))!

/**
 * The import targets. Intervals replace the whole log of every point the file names; other targets
 * add rows (index tests replace a sample's existing set, a CPT its point's sounding, oedometer stages
 * one test's stages).
 */
export const IMPORT_TARGET_REGISTRY: { [T in ImportTarget]: ImportTargetEntry<BodyOf<T>> } = {
  'points': {
    write: async (tx, { projectId, records }) => {
      await insertChunks(records.map(r => ({
        projectId, identifier: str(r.identifier), kind: r.kind as 'borehole', easting: num(r.easting), northing: num(r.northing), groundElevation: num(r.groundElevation), finalDepth: num(r.finalDepth),
        startedOn: strOrNull(r.startedOn), endedOn: strOrNull(r.endedOn), method: str(r.method), loggedBy: str(r.loggedBy), remarks: str(r.remarks),
      })), c => tx.insert(investigationPoints).values(c))
      return { written: records.length }
    },
  },
  'intervals': {
    write: async (tx, { records }, ctx) => {
      const pointIds = [...new Set(records.map(r => pid(ctx, r)))]
      if (pointIds.length) await tx.delete(logIntervals).where(anyOf(logIntervals.pointId, pointIds))
      await insertChunks(records.map(r => ({
        pointId: pid(ctx, r), top: num(r.top), bottom: num(r.bottom), description: str(r.description), uscs: strOrNull(r.uscs),
        stratumId: typeof r.stratum === 'string' ? ctx.strataIds.get(r.stratum) ?? null : null, moisture: strOrNull(r.moisture), consistency: strOrNull(r.consistency),
      })), c => tx.insert(logIntervals).values(c))
      return { written: records.length }
    },
  },
  'samples': {
    write: async (tx, { records }, ctx) => {
      await insertChunks(records.map(r => ({
        pointId: pid(ctx, r), identifier: str(r.identifier), top: num(r.top), bottom: num(r.bottom), type: r.type as 'bulk', recovery: numOrNull(r.recovery), remarks: str(r.remarks),
      })), c => tx.insert(samples).values(c))
      return { written: records.length }
    },
  },
  'index-tests': {
    write: async (tx, { records }, ctx) => {
      for (const r of records) {
        const sampleId = ctx.sampleIds.get(`${str(r.point)}/${str(r.sample)}`)!
        const values = { waterContent: numOrNull(r.waterContent), liquidLimit: numOrNull(r.liquidLimit), plasticLimit: numOrNull(r.plasticLimit), bulkUnitWeight: numOrNull(r.bulkUnitWeight) }
        await tx.insert(indexTests).values({ ...values, sampleId })
          .onConflictDoUpdate({ target: indexTests.sampleId, set: { ...values, version: sql`${indexTests.version} + 1`, updatedAt: new Date() } })
      }
      return { written: records.length }
    },
  },
  'groundwater': {
    write: async (tx, { records }, ctx) => {
      await insertChunks(records.map(r => ({
        pointId: pid(ctx, r), kind: r.kind as 'strike', observedAt: str(r.observedAt), depth: numOrNull(r.depth), pressure: numOrNull(r.pressure), remarks: str(r.remarks),
      })), c => tx.insert(groundwaterObservations).values(c))
      return { written: records.length }
    },
  },
  'cpt': {
    context: async (projectId, body, ctx) => {
      const point = await pointInProject(projectId, body.pointId)
      if (!point) notFound('Point')
      ctx.cptFinalDepth = point.finalDepth
    },
    // A CPT sounding in a CSV without quotes is checked in one pass over the text, straight into typed columns.
    check: (source, body, ctx, filename) => {
      if (!source.plain) return checkTable(source.table, body, ctx)
      const checked = checkCptCsv(source.plain, body.mapping, { ...ctx, maxRows: IMPORT_ROW_LIMITS.cpt, units: body.units })
      if (checked.overLimit) throw asUploadRefusal(tooManyRows(filename, IMPORT_ROW_LIMITS.cpt, 'cpt', true))
      return { records: [], cpt: checked.columns, errors: checked.errors, rowCount: checked.rowCount }
    },
    write: async (tx, { projectId, actorId, body, records, cpt }) => {
      const cols = cpt ?? cptColumnsOf(records)
      await replaceCptSounding({ actorId, projectId, pointId: body.pointId }, { areaRatio: body.areaRatio, ...cols }, tx)
      return { written: cols.depth.length }
    },
  },
  'oedometer-stages': {
    capability: 'tests.write',
    context: async (projectId, body, ctx) => {
      const test = await requireTest(projectId, body.testId)
      if (test.test.version !== body.testVersion) staleTest(test)
      ctx.oedometerBasis = { e0: test.test.e0, specimenHeight: test.test.specimenHeight }
    },
    write: async (tx, { projectId, actorId, body, records, filename }) => {
      const convention = stageConventionOf(body.mapping)!
      const key = STAGE_VALUE_FIELDS[convention]
      // The stage replacement records its own audit entry (before and after).
      await replaceTestStages(tx, { projectId, actorId, testId: body.testId, version: body.testVersion, convention, stages: records.map(r => ({ stress: num(r.stress), value: num(r[key]) })), filename })
      return { written: records.length, audited: true }
    },
  },
  'vane': {
    capability: 'tests.write',
    context: async (projectId, _body, ctx) => {
      ctx.vaneDepths = await vaneDepths(projectId)
    },
    write: async (tx, { records }, ctx) => {
      await insertChunks(records.map(r => ({ pointId: pid(ctx, r), depth: num(r.depth), peak: num(r.peak), remoulded: numOrNull(r.remoulded) })), c => tx.insert(vaneReadings).values(c))
      return { written: records.length }
    },
  },
}

/** The general row check of a table (CSV or XLSX) against the target's fields and the project. */
function checkTable(table: Awaited<ReturnType<typeof tableOrThrow>>, body: ImportCommit, ctx: ProjectImportContext): Checked {
  const { errors, records } = validateRows(body.target, table.headers, table.rows, body.mapping, ctx, table.rowNumbers, body.units)
  return { records, errors, rowCount: table.rows.length }
}

const MAX_REPORTED = 500

/**
 * Checks every row of an uploaded file against the target and the project, then writes all of it in
 * one transaction — or, on any error, nothing: 422 with the row-level report (file row, column,
 * message). `dryRun` only reports. The target's entry in `IMPORT_TARGET_REGISTRY` adds its context,
 * check and write; the mapping, the point limit, the saved mapping and the audit are the same for all.
 */
export async function commitImport(args: { projectId: string, actorId: string, role: ProjectRole, importId: string, body: ImportCommit }) {
  const { projectId, actorId, role, body } = args
  // Each entry is typed by its own body; the body's target picks the entry, so this view of it is sound.
  const entry = IMPORT_TARGET_REGISTRY[body.target] as ImportTargetEntry<ImportCommit>
  const file = await loadImportFile(projectId, args.importId)
  const plain = body.target === 'cpt' && file.format === 'csv' ? plainCsvOrThrow(file.content, file.filename) : null
  // The target's row limit applies while reading: a file over it is refused before its rows are checked.
  const source: Source = plain ? { plain } : { table: await tableOrThrow(file.content, file.format as UploadFormat, file.filename, body.sheet, undefined, body.target) }
  const mappingProblems = checkMapping(body.target, source.plain ? source.plain.headers : source.table.headers, body.mapping)
  if (mappingProblems.length) throw unprocessableError(mappingProblems[0]!, { mappingProblems })
  const unitProblems = checkUnits(body.target, body.units, body.mapping)
  if (unitProblems.length) throw unprocessableError(unitProblems[0]!, { mappingProblems: unitProblems })
  if (entry.capability && !roleCan(role, entry.capability)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `Your role (${role}) cannot enter test data.` })
  }
  const ctx = await importContext(projectId)
  await entry.context?.(projectId, body, ctx)
  const { records, cpt, errors, rowCount } = entry.check ? entry.check(source, body, ctx, file.filename) : checkTable(source.table!, body, ctx)
  if (errors.length) {
    throw unprocessableError(
      `${errors.length} problem(s) in ${file.filename}; nothing was imported. First: row ${errors[0]!.row}, ${errors[0]!.column}: ${errors[0]!.message}`,
      { errors: errors.slice(0, MAX_REPORTED), errorCount: errors.length, rowCount },
    )
  }
  const addingPoints = body.target === 'points' ? records.length : 0
  try {
    checkPointLimit(ctx.points.size, addingPoints)
  }
  catch (err) {
    throw asUploadRefusal(err)
  }
  if (body.dryRun) {
    // An interval import replaces whole logs: the preview says whose, and how many intervals each had.
    const replaces = body.target === 'intervals' ? await logReplacements(ctx, records) : undefined
    return { dryRun: true as const, rowCount, errors: [] as [], ...(replaces ? { replaces } : {}) }
  }

  const written = await useDb().transaction(async (tx) => {
    // Checked again under the project's lock: another import may have added points meanwhile.
    await holdPointLimit(tx, projectId, addingPoints)
    const out = await entry.write(tx, { projectId, actorId, body, records, cpt, filename: file.filename }, ctx)
    if (!out.audited) {
      await recordAudit({ actorId, projectId, action: 'import', entity: body.target, entityId: body.target === 'cpt' ? body.pointId : null, after: { filename: file.filename, rows: out.written } }, tx)
    }
    if (body.saveMapping) {
      // The columns' units are saved with the mapping, so the next file of the same layout reads alike.
      const units = body.units && Object.keys(body.units).length ? body.units : null
      await tx.insert(importMappings).values({ projectId, target: body.target, mapping: body.mapping, units, savedBy: actorId })
        .onConflictDoUpdate({ target: [importMappings.projectId, importMappings.target], set: { mapping: body.mapping, units, savedBy: actorId, updatedAt: new Date() } })
    }
    await tx.delete(importFiles).where(eq(importFiles.id, file.id))
    return out.written
  }).catch((err: unknown) => {
    throw asUploadRefusal(err)
  })
  return { dryRun: false as const, written, target: body.target }
}

/** For an interval import: each point the file names, with the intervals it has now and those it will have. */
async function logReplacements(ctx: ProjectImportContext, records: Rec[]): Promise<LogReplacement[]> {
  const after = new Map<string, number>()
  for (const r of records) after.set(str(r.point), (after.get(str(r.point)) ?? 0) + 1)
  const ids = [...after.keys()].map(p => ctx.pointIds.get(p)!).filter(Boolean)
  const rows = ids.length
    ? await useDb().select({ pointId: logIntervals.pointId, n: count() }).from(logIntervals).where(anyOf(logIntervals.pointId, ids)).groupBy(logIntervals.pointId)
    : []
  const before = new Map(rows.map(r => [r.pointId, r.n]))
  return [...after].map(([point, n]) => ({ point, before: before.get(ctx.pointIds.get(point)!) ?? 0, after: n }))
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
