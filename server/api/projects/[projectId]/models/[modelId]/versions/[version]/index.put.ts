import { VersionParamsSchema } from '#shared/schemas/models'
import { refuseVersionWrite } from '~~/server/services/model-drafts'

/** Saved versions are immutable: start a new draft from one instead. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'model.write')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  return refuseVersionWrite(project.id, modelId, version)
})
