import { ModelParamsSchema } from '#shared/schemas/models'
import { listVersions, requireModel } from '~~/server/services/model-versions'
import type { ServerModelDetail } from '#shared/types/models'

/** The model with its draft and the list of saved versions. */
export default defineEventHandler(async (event): Promise<ServerModelDetail> => {
  const { project, role } = await requireProjectRole(event, 'project.read')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const model = await requireModel(project.id, modelId)
  return { model, versions: await listVersions(modelId), role }
})
