import { AgsCommitSchema, ImportParamsSchema } from '#shared/schemas/imports'
import { commitAgsImport } from '~~/server/services/imports/commit'

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
  return commitAgsImport({ projectId: project.id, actorId: user.id, importId, dryRun })
})
