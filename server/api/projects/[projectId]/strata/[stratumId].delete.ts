import { StratumParamsSchema } from '#shared/schemas/investigation'
import { deleteStratum } from '~~/server/services/strata'

/** Deletes a stratum; intervals that named it stay, unassigned. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { stratumId } = validateParams(event, StratumParamsSchema)
  await deleteStratum(project.id, user.id, stratumId)
  return { ok: true }
})
