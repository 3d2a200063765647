import { computeStressProfile } from '#shared/geotech/stress'
import { CompareQuerySchema, ModelParamsSchema } from '#shared/schemas/models'
import { toStressInput } from '#shared/site-model/convert'
import { diffDefinitions, requireModel, requireVersion } from '~~/server/services/model-versions'
import type { ServerCompareAnswer } from '#shared/types/models'

/** What changed between two saved versions, and both stress profiles to overlay. */
export default defineEventHandler(async (event): Promise<ServerCompareAnswer> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const { a, b } = validateQuery(event, CompareQuerySchema)
  await requireModel(project.id, modelId)
  const [va, vb] = await Promise.all([requireVersion(modelId, a), requireVersion(modelId, b)])
  const profile = (def: typeof va.definition) => runEngine(() => computeStressProfile(toStressInput(def))).points
  return {
    a: { version: a, message: va.message, savedAt: va.createdAt, author: va.author },
    b: { version: b, message: vb.message, savedAt: vb.createdAt, author: vb.author },
    changes: diffDefinitions(va.definition, vb.definition).filter(c => !c.path.startsWith('flagsInForce')),
    flagsChanged: diffDefinitions(va.definition.flagsInForce, vb.definition.flagsInForce).length > 0,
    profiles: { a: profile(va.definition), b: profile(vb.definition) },
  }
})
