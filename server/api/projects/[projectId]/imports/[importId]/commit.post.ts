import { eq } from 'drizzle-orm'
import { roleCan } from '#shared/auth/roles'
import { checkCptCsv, type CptColumns } from '#shared/imports/cpt-csv'
import { checkPointLimit, IMPORT_ROW_LIMITS, tooManyRows } from '#shared/imports/limits'
import { checkMapping, type ParsedValue, type RowError, validateRows } from '#shared/imports/targets'
import { ImportCommitSchema, ImportParamsSchema } from '#shared/schemas/imports'
import { importFiles, importMappings } from '~~/server/db/schema'
import { holdPointLimit, importContext, pointInProject, vaneDepths, writeImport } from '~~/server/services/imports/commit'
import type { UploadFormat } from '~~/server/services/imports/files'
import { asUploadRefusal, loadImportFile, plainCsvOrThrow, tableOrThrow } from '~~/server/services/imports/preview'
import { notFound, unprocessableError } from '~~/server/services/http-errors'
import { requireTest, staleTest } from '~~/server/services/lab'

const MAX_REPORTED = 500

/**
 * Checks every row of the uploaded file against the target and the project,
 * then writes all of it in one transaction — or, on any error, nothing: 422 with
 * the row-level report (file row, column, message). `dryRun` only reports.
 */
export default defineEventHandler(async (event) => {
  const { user, project, role } = await requireProjectRole(event, 'logs.write')
  const { importId } = validateParams(event, ImportParamsSchema)
  const body = await validateBody(event, ImportCommitSchema)
  const file = await loadImportFile(project.id, importId)
  // A CPT sounding in a CSV without quotes is checked in one pass over the text, straight into typed columns.
  const plain = body.target === 'cpt' && file.format === 'csv' ? plainCsvOrThrow(file.content, file.filename) : null
  // The target's row limit applies while reading: a file over it is refused before its rows are checked.
  const table = plain ? null : await tableOrThrow(file.content, file.format as UploadFormat, file.filename, body.sheet, undefined, body.target)
  const headers = plain ? plain.headers : table!.headers
  const mappingProblems = checkMapping(body.target, headers, body.mapping)
  if (mappingProblems.length) {
    throw unprocessableError(mappingProblems[0]!, { mappingProblems })
  }
  const ctx = await importContext(project.id)
  let cptPoint: Awaited<ReturnType<typeof pointInProject>>
  if (body.target === 'cpt') {
    cptPoint = await pointInProject(project.id, body.pointId!)
    if (!cptPoint) notFound('Point')
    ctx.cptFinalDepth = cptPoint.finalDepth
  }
  // Test data (oedometer stages, vane readings) is written by the roles that may enter tests.
  if ((body.target === 'oedometer-stages' || body.target === 'vane') && !roleCan(role, 'tests.write')) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `Your role (${role}) cannot enter test data.` })
  }
  if (body.target === 'oedometer-stages') {
    const test = await requireTest(project.id, body.testId!)
    if (test.test.version !== body.testVersion) staleTest(test)
    ctx.oedometerBasis = { e0: test.test.e0, specimenHeight: test.test.specimenHeight }
  }
  if (body.target === 'vane') ctx.vaneDepths = await vaneDepths(project.id)
  let records: Record<string, ParsedValue>[] = []
  let cpt: CptColumns | undefined
  let errors: RowError[]
  let rowCount: number
  if (plain) {
    const checked = checkCptCsv(plain, body.mapping, { ...ctx, maxRows: IMPORT_ROW_LIMITS.cpt })
    if (checked.overLimit) throw asUploadRefusal(tooManyRows(file.filename, IMPORT_ROW_LIMITS.cpt, 'cpt', true))
    ;({ errors, rowCount } = checked)
    cpt = checked.columns
  }
  else {
    const result = validateRows(body.target, table!.headers, table!.rows, body.mapping, ctx, table!.rowNumbers)
    ;({ errors, records } = result)
    rowCount = table!.rows.length
  }
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
  if (body.dryRun) return { dryRun: true, rowCount, errors: [] }

  const written = await useDb().transaction(async (tx) => {
    // Checked again under the project's lock: another import may have added points meanwhile.
    await holdPointLimit(tx, project.id, addingPoints)
    const n = await writeImport(tx, { projectId: project.id, actorId: user.id, target: body.target, records, cpt, filename: file.filename, cptPointId: cptPoint?.id, areaRatio: body.areaRatio, testId: body.testId, testVersion: body.testVersion, mapping: body.mapping }, ctx)
    if (body.saveMapping) {
      await tx.insert(importMappings).values({ projectId: project.id, target: body.target, mapping: body.mapping, savedBy: user.id })
        .onConflictDoUpdate({ target: [importMappings.projectId, importMappings.target], set: { mapping: body.mapping, savedBy: user.id, updatedAt: new Date() } })
    }
    await tx.delete(importFiles).where(eq(importFiles.id, file.id))
    return n
  }).catch((err: unknown) => {
    throw asUploadRefusal(err)
  })
  return { dryRun: false, written, target: body.target }
})
