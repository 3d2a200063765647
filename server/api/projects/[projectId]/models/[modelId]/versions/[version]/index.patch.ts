import { VersionParamsSchema } from '#shared/schemas/models'
import { requireModel, requireVersion } from '~~/server/services/model-versions'

/** Saved versions are immutable: start a new draft from one instead. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'model.write')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  await requireModel(project.id, modelId)
  await requireVersion(modelId, version)
  throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Version ${version} is saved and cannot be changed. Start a new draft from it and save a new version.` })
})
