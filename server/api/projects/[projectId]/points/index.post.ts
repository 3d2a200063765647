import { PointInputSchema } from '#shared/schemas/investigation'
import { createPoint } from '~~/server/services/investigation-points'

/** A new investigation point (the project's point limit: 422; an identifier already used: 409). */
export default projectCreateHandler('logs.write', PointInputSchema, async (projectId, actorId, body) => ({ point: await createPoint(projectId, actorId, body) }))
