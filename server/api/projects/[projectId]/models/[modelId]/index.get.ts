import { ModelParamsSchema } from '#shared/schemas/models'
import { modelDetail } from '~~/server/services/model-drafts'
import type { ServerModelDetail } from '#shared/types/models'

/** The model with its draft and the list of saved versions. */
export default defineEventHandler(async (event): Promise<ServerModelDetail> => {
  const { project, role } = await requireProjectRole(event, 'project.read')
  const { modelId } = validateParams(event, ModelParamsSchema)
  return { ...await modelDetail(project.id, modelId), role }
})
