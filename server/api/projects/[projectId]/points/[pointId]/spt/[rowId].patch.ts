import { PointRowParamsSchema, SptUpdateSchema } from '#shared/schemas/investigation'
import { updatePointRow } from '~~/server/services/point-rows'

const Body = SptUpdateSchema

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, rowId } = validateParams(event, PointRowParamsSchema)
  const { version, ...values } = await validateBody(event, Body)
  const row = await updatePointRow('spt', { actorId: user.id, projectId: project.id, pointId }, rowId, version, { ...values, n: values.blows[1] + values.blows[2] })
  return { row }
})
