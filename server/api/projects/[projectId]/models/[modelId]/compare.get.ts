import { CompareQuerySchema, ModelParamsSchema } from '#shared/schemas/models'
import { compareVersions } from '~~/server/services/model-drafts'
import type { ServerCompareAnswer } from '#shared/types/models'

/** What changed between two saved versions, and both stress profiles to overlay. */
export default defineEventHandler(async (event): Promise<ServerCompareAnswer> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const { a, b } = validateQuery(event, CompareQuerySchema)
  return compareVersions(project.id, modelId, a, b, project.unitSystem, project.usStressUnit)
})
