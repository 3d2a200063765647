import { PointParamsSchema, VaneInputSchema } from '#shared/schemas/investigation'
import { createPointRow } from '~~/server/services/point-rows'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const body = await validateBody(event, VaneInputSchema)
  const row = await createPointRow('vane', { actorId: user.id, projectId: project.id, pointId }, body)
  setResponseStatus(event, 201)
  return { row }
})
