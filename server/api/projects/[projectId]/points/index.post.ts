import { PointInputSchema } from '#shared/schemas/investigation'
import { createPoint } from '~~/server/services/investigation-points'

/** A new investigation point (the project's point limit: 422; an identifier already used: 409). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const body = await validateBody(event, PointInputSchema)
  const point = await createPoint(project.id, user.id, body)
  setResponseStatus(event, 201)
  return { point }
})
