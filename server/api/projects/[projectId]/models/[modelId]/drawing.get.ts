import { ModelParamsSchema } from '#shared/schemas/models'
import { draftDrawing } from '~~/server/services/model-drawing'
import type { ServerModelDrawing } from '#shared/types/models'

/** The saved draft drawn on the server (stresses, σ'p points, trends and key): what the stress-model page opens with. */
export default defineEventHandler(async (event): Promise<ServerModelDrawing> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId } = validateParams(event, ModelParamsSchema)
  return draftDrawing(project.id, modelId, project.unitSystem, project.usStressUnit)
})
