import { OedometerTestInputSchema } from '#shared/schemas/lab'
import { createTest } from '~~/server/services/oedometer-tests'

/** A new oedometer test on a sample of the project; stages converted to void ratios from the chosen convention. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const body = await validateBody(event, OedometerTestInputSchema)
  const created = await createTest(project.id, user.id, body)
  setResponseStatus(event, 201)
  return created
})
