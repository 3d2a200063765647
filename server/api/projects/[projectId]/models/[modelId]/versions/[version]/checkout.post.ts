import { VersionParamsSchema } from '#shared/schemas/models'
import { checkoutVersion } from '~~/server/services/model-drafts'

/** Starts a new draft from a saved version (the old draft is kept in the audit log). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  return { model: await checkoutVersion(project.id, user.id, modelId, version) }
})
