import { eq } from 'drizzle-orm'
import { AgsCommitSchema, ImportParamsSchema } from '#shared/schemas/imports'
import { importFiles, investigationPoints, strata } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { checkPointLimit } from '#shared/imports/limits'
import { analyseAgsOrThrow, asRowErrors } from '~~/server/services/imports/ags'
import { holdPointLimit } from '~~/server/services/imports/commit'
import { asUploadRefusal, loadImportFile } from '~~/server/services/imports/preview'
import { writeInvestigation } from '~~/server/services/investigation-writer'
import { unprocessableError } from '~~/server/services/http-errors'

/**
 * Imports an uploaded AGS4 file whole, in one transaction: any rule error or a
 * point that already exists means nothing is written (422 with line, group,
 * rule and message). Groups Pastload does not map are reported, never dropped
 * silently.
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { importId } = validateParams(event, ImportParamsSchema)
  const { dryRun } = await validateBody(event, AgsCommitSchema)
  const file = await loadImportFile(project.id, importId)
  if (file.format !== 'ags4') throw unprocessableError(`${file.filename} is not an AGS4 file; map its columns instead.`)
  const a = analyseAgsOrThrow(file.content, file.filename)
  const errors = asRowErrors(a.errors)
  const ids = a.data.points.map(p => p.identifier)
  const db = useDb()
  if (ids.length) {
    const mine = await db.select({ identifier: investigationPoints.identifier }).from(investigationPoints).where(eq(investigationPoints.projectId, project.id))
    const taken = new Set(mine.map(r => r.identifier))
    for (const id of ids) if (taken.has(id)) errors.push({ row: 0, column: 'LOCA', message: `Point ${id} already exists in this project.`, rule: 'pastload' })
    if (!errors.length) {
      try {
        checkPointLimit(mine.length, ids.length)
      }
      catch (err) {
        throw asUploadRefusal(err)
      }
    }
  }
  if (errors.length) {
    throw unprocessableError(
      `${errors.length} problem(s) in ${file.filename}; nothing was imported. First: line ${errors[0]!.row}, ${errors[0]!.column}: ${errors[0]!.message}`,
      { errors: errors.slice(0, 500), errorCount: errors.length, unknownGroups: a.unknownGroups },
    )
  }
  if (dryRun) return { dryRun: true, summary: a.summary, unknownGroups: a.unknownGroups, warnings: asRowErrors(a.warnings) }
  await db.transaction(async (tx) => {
    await holdPointLimit(tx, project.id, ids.length)
    const existingStrata = new Map((await tx.select({ id: strata.id, code: strata.code }).from(strata).where(eq(strata.projectId, project.id))).map(s => [s.code, s.id]))
    await writeInvestigation(tx, project.id, a.data, existingStrata)
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'import', entity: 'ags4', after: { filename: file.filename, ...a.summary, unknownGroups: a.unknownGroups } }, tx)
    await tx.delete(importFiles).where(eq(importFiles.id, file.id))
  }).catch((err: unknown) => {
    throw asUploadRefusal(err)
  })
  return { dryRun: false, summary: a.summary, unknownGroups: a.unknownGroups, warnings: asRowErrors(a.warnings) }
})
