import { OedometerTestParamsSchema } from '#shared/schemas/lab'
import { testInterpretation } from '~~/server/services/oedometer-tests'
import type { ServerOedometerInterpretationReply } from '#shared/types/lab'

/**
 * The four σ'p constructions side by side with Cc, Cr, sample quality at σ'v0, cv and Cα from time
 * readings, the liquid-limit check on Cc, and the adoption in force with its history. A curve with
 * no yield is 422 with the engine's message.
 */
export default defineEventHandler(async (event): Promise<ServerOedometerInterpretationReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  return testInterpretation(project.id, testId)
})
