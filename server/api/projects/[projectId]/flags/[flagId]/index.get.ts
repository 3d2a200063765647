import { FlagParamsSchema } from '#shared/schemas/review'
import { flagThread } from '~~/server/services/review'
import type { ServerReviewThreadReply } from '#shared/types/review'

/** One flag with its author and thread. */
export default defineEventHandler(async (event): Promise<ServerReviewThreadReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { flagId } = validateParams(event, FlagParamsSchema)
  return flagThread(project.id, flagId)
})
