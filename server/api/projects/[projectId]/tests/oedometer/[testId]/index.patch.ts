import { OedometerTestParamsSchema, OedometerTestUpdateSchema } from '#shared/schemas/lab'
import { editTest } from '~~/server/services/oedometer-tests'

/**
 * Edits a test (version → 409 with the current test). When the curve changes (stages, convention,
 * e0, specimen height), the σ'p adopted from the old curve is withdrawn: it is marked superseded
 * and stays in the history, and the test needs a new adoption.
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  const body = await validateBody(event, OedometerTestUpdateSchema)
  return editTest(project.id, user.id, testId, body)
})
