import { StratumParamsSchema, StratumUpdateSchema } from '#shared/schemas/investigation'
import { updateStratum } from '~~/server/services/strata'

/** Edits a stratum (stale version or a code already used: 409). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { stratumId } = validateParams(event, StratumParamsSchema)
  const body = await validateBody(event, StratumUpdateSchema)
  return { stratum: await updateStratum(project.id, user.id, stratumId, body) }
})
