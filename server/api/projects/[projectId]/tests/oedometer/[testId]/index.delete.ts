import { OedometerTestParamsSchema } from '#shared/schemas/lab'
import { deleteTest } from '~~/server/services/oedometer-tests'

/** Deletes a test and its adoption history (audited with the test row); its files move to the project. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  await deleteTest(project.id, user.id, testId)
  return { ok: true }
})
