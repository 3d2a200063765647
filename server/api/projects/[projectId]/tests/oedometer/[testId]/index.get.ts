import { OedometerTestParamsSchema } from '#shared/schemas/lab'
import { adoptionHistory, requireTest, testJson } from '~~/server/services/lab'
import type { ServerOedometerTestReply } from '#shared/types/lab'

/** One test with its stages as entered and converted, and the σ'p adopted for it (if any). */
export default defineEventHandler(async (event): Promise<ServerOedometerTestReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  const ctx = await requireTest(project.id, testId)
  const history = await adoptionHistory(testId)
  return { test: testJson(ctx), adoption: history.find(a => a.supersededAt === null) ?? null }
})
