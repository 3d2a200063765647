import { StratumInputSchema } from '#shared/schemas/investigation'
import { createStratum } from '~~/server/services/strata'

/** A new stratum of the project (a code already used is 409). */
export default projectCreateHandler('logs.write', StratumInputSchema, async (projectId, actorId, body) => ({ stratum: await createStratum(projectId, actorId, body) }))
