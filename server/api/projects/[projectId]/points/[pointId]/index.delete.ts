import { PointParamsSchema } from '#shared/schemas/investigation'
import { deletePoint } from '~~/server/services/investigation-points'

/** Deletes a point and everything logged at it (audited with the point row); its files move to the project. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  await deletePoint(project.id, user.id, pointId)
  return { ok: true }
})
