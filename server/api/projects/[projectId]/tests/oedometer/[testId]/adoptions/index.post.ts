import { AdoptionInputSchema, OedometerTestParamsSchema } from '#shared/schemas/lab'
import { adoptPreconsolidation } from '~~/server/services/oedometer-tests'

/**
 * Adopts a σ'p for the test with a reason: the adoption in force is superseded (kept in the
 * history). A value named after one of the constructions must be that construction's σ'p (422).
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'interpretation.write')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  const body = await validateBody(event, AdoptionInputSchema)
  const adopted = await adoptPreconsolidation(project.id, user, testId, body)
  setResponseStatus(event, 201)
  return adopted
})
