import { ModelParamsSchema, SaveVersionSchema } from '#shared/schemas/models'
import { saveVersion } from '~~/server/services/model-drafts'

/**
 * Saves the current draft as the next immutable version, with the reviewer
 * flags in force at that moment. The client sends the draft revision it has
 * seen (`version`), so it never saves a draft it has not looked at (409 otherwise).
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const { message, version } = await validateBody(event, SaveVersionSchema)
  const saved = await saveVersion(project.id, user.id, modelId, { message, draftRevision: version })
  setResponseStatus(event, 201)
  return { version: saved }
})
