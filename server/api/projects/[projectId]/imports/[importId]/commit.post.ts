import { ImportCommitSchema, ImportParamsSchema } from '#shared/schemas/imports'
import { commitImport } from '~~/server/services/imports/commit'

/**
 * Checks every row of the uploaded file against the target and the project,
 * then writes all of it in one transaction — or, on any error, nothing: 422 with
 * the row-level report (file row, column, message). `dryRun` only reports.
 */
export default defineEventHandler(async (event) => {
  const { user, project, role } = await requireProjectRole(event, 'logs.write')
  const { importId } = validateParams(event, ImportParamsSchema)
  const body = await validateBody(event, ImportCommitSchema)
  return commitImport({ projectId: project.id, actorId: user.id, role, importId, body })
})
