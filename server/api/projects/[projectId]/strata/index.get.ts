import { strataReply } from '~~/server/services/strata'
import type { ServerStrataReply } from '#shared/types/investigation'

/** The project's strata in display order, with each one's "derive σ'p from CPT and vane" switch. */
export default defineEventHandler(async (event): Promise<ServerStrataReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  return strataReply(project.id)
})
