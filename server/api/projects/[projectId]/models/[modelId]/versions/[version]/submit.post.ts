import { SubmitVersionSchema, VersionParamsSchema } from '#shared/schemas/models'
import { submitVersion } from '~~/server/services/model-review'

/** Sends a saved version for review to project members who may review (422 for anyone else; 409 unless it is saved). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  const body = await validateBody(event, SubmitVersionSchema)
  return { version: await submitVersion(project.id, user.id, modelId, version, body) }
})
