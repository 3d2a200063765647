import { listStrata } from '~~/server/services/strata'
import type { ServerStrataReply } from '#shared/types/investigation'

/** The project's strata in display order. */
export default defineEventHandler(async (event): Promise<ServerStrataReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  return { strata: await listStrata(project.id) }
})
