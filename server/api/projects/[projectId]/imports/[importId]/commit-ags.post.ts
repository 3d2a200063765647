import { AgsCommitSchema, ImportParamsSchema } from '#shared/schemas/imports'
import { commitAgsImport } from '~~/server/services/imports/ags-commit'

/**
 * Imports an uploaded AGS4 file in one transaction: any problem means nothing
 * is written (422 with line, group and message). Holes already in the project
 * are skipped, merged or replaced as the body's mode says; a dry run answers
 * the plan per hole. A replace that would remove a sample with tests or
 * attachments is refused (409). Groups Pastload does not map are reported,
 * never dropped silently.
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { importId } = validateParams(event, ImportParamsSchema)
  const { dryRun, mode } = await validateBody(event, AgsCommitSchema)
  return commitAgsImport({ projectId: project.id, actorId: user.id, importId, dryRun, mode })
})
