import { VersionParamsSchema } from '#shared/schemas/models'
import { projectVersion } from '~~/server/services/model-drafts'
import type { ServerModelVersionReply } from '#shared/types/models'

/** One saved version, read-only. */
export default defineEventHandler(async (event): Promise<ServerModelVersionReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  const { model, version: saved } = await projectVersion(project.id, modelId, version)
  return { model: { id: model.id, name: model.name }, version: saved }
})
