import { VersionParamsSchema } from '#shared/schemas/models'
import { requireModel, requireVersion } from '~~/server/services/model-versions'
import type { ServerModelVersionReply } from '#shared/types/models'

/** One saved version, read-only. */
export default defineEventHandler(async (event): Promise<ServerModelVersionReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  const model = await requireModel(project.id, modelId)
  return { model: { id: model.id, name: model.name }, version: await requireVersion(modelId, version) }
})
