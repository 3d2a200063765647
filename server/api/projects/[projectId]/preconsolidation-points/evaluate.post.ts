import { RESULT_CAUTION } from '#shared/caution'
import { PreconsolidationPointsEvaluateSchema } from '#shared/schemas/lab'
import { stressContextOf } from '~~/server/services/lab'
import { allPreconsolidationPoints } from '~~/server/services/preconsolidation-points'
import type { ServerPreconsolidationPointsReply } from '#shared/types/lab'

/**
 * The project's σ'p points (as GET …/preconsolidation-points) with σv, u and σ'v0 from the stress
 * model in the body: the canvas sends its working copy, unsaved edits included, or the saved
 * version it shows, so CPT σ'p = k·(qt − σv0) follow the stresses on screen. Nothing is written.
 * A definition the engine cannot use is 422 with the engine's message.
 */
export default defineEventHandler(async (event): Promise<ServerPreconsolidationPointsReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { definition, spacing, dense, label } = await validateBody(event, PreconsolidationPointsEvaluateSchema)
  const stress = stressContextOf(definition, { source: 'given', modelId: null, modelName: null, version: null, status: null, description: `The stresses of ${label}.` })
  const result = await allPreconsolidationPoints(project.id, stress, { spacing, dense })
  return { ...result, spacing, stressModel: stress.info, caution: RESULT_CAUTION }
})
