import { OedometerListQuerySchema } from '#shared/schemas/lab'
import { listTests } from '~~/server/services/oedometer-tests'
import type { ServerOedometerList } from '#shared/types/lab'

/**
 * The project's oedometer tests with their sample, point and logged stratum, the σ'p in force (if adopted) and a
 * live reading of the curve: Casagrande σ'p and sample quality at σ'v0 from the stress model in
 * force, or the engine's reason when the curve cannot be read.
 */
export default defineEventHandler(async (event): Promise<ServerOedometerList> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const query = validateQuery(event, OedometerListQuerySchema)
  return listTests(project.id, query)
})
