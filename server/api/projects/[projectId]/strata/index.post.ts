import { StratumInputSchema } from '#shared/schemas/investigation'
import { createStratum } from '~~/server/services/strata'

/** A new stratum of the project (a code already used is 409). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const body = await validateBody(event, StratumInputSchema)
  const stratum = await createStratum(project.id, user.id, body)
  setResponseStatus(event, 201)
  return { stratum }
})
