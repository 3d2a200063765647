import { ModelParamsSchema } from '#shared/schemas/models'
import { listVersions, requireModel } from '~~/server/services/model-versions'

/** The model with its draft and the list of saved versions. */
export default defineEventHandler(async (event) => {
  const { project, role } = await requireProjectRole(event, 'project.read')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const model = await requireModel(project.id, modelId)
  return { model, versions: await listVersions(modelId), role }
})
