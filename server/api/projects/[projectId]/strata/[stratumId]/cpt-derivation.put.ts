import { StratumCptDerivationSchema, StratumParamsSchema } from '#shared/schemas/investigation'
import { setStratumCptDerivation } from '~~/server/services/strata'

/** Sets a stratum's "derive σ'p from CPT and vane" switch (null follows the logged symbols); an interpretation choice. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'interpretation.write')
  const { stratumId } = validateParams(event, StratumParamsSchema)
  const body = await validateBody(event, StratumCptDerivationSchema)
  return { stratum: await setStratumCptDerivation(project.id, user.id, stratumId, body) }
})
