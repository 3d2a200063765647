import { ModelParamsSchema, SaveDraftSchema } from '#shared/schemas/models'
import { saveDraft } from '~~/server/services/model-drafts'

/** Saves the editable draft (not a version); a stale revision is 409 with the current draft. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const body = await validateBody(event, SaveDraftSchema)
  return { model: await saveDraft(project.id, user.id, modelId, body) }
})
