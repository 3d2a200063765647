import { OedometerTestParamsSchema } from '#shared/schemas/lab'
import { adoptionHistory, requireTest } from '~~/server/services/lab'
import type { ServerAdoptionHistoryReply } from '#shared/types/lab'

/** Every σ'p adopted for the test, newest first; the one in force has no `supersededAt`. */
export default defineEventHandler(async (event): Promise<ServerAdoptionHistoryReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  await requireTest(project.id, testId)
  const history = await adoptionHistory(testId)
  return { adoption: history.find(a => a.supersededAt === null) ?? null, history }
})
