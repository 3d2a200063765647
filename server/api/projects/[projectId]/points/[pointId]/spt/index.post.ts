import { PointParamsSchema, SptInputSchema } from '#shared/schemas/investigation'
import { createPointRow } from '~~/server/services/point-rows'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const body = await validateBody(event, SptInputSchema)
  const row = await createPointRow('spt', { actorId: user.id, projectId: project.id, pointId }, { ...body, n: body.blows[1] + body.blows[2] })
  setResponseStatus(event, 201)
  return { row }
})
