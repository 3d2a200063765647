import { modelInForce } from '~~/server/services/site-models'
import type { ServerModelInForce } from '#shared/types/model-in-force'

/**
 * The version of the design model whose σ'v0 the pages use: the latest approved one, else the
 * latest saved one (status says it is not yet approved), or `{ modelId: null }` with none saved.
 */
export default defineEventHandler(async (event): Promise<ServerModelInForce> => {
  const { project } = await requireProjectRole(event, 'project.read')
  return modelInForce(project.id)
})
