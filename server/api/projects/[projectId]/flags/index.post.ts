import { CreateFlagSchema } from '#shared/schemas/review'
import { createFlag } from '~~/server/services/review'
import type { ServerFlagCreatedReply } from '#shared/types/review'

/** A reviewer flags a σ'p point, test or log interval as questionable, excluded from fits, or accepted. */
export default defineEventHandler(async (event): Promise<ServerFlagCreatedReply> => {
  const { user, project } = await requireProjectRole(event, 'review.write')
  const body = await validateBody(event, CreateFlagSchema)
  const flag = await createFlag(project.id, user.id, body)
  setResponseStatus(event, 201)
  return { flag }
})
