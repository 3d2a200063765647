import { PointParamsSchema, SampleInputSchema } from '#shared/schemas/investigation'
import { createSample } from '~~/server/services/samples'

/** A new sample at a point (below the hole: 422; an identifier already used there: 409). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const body = await validateBody(event, SampleInputSchema)
  const sample = await createSample(project.id, user.id, pointId, body)
  setResponseStatus(event, 201)
  return { sample }
})
