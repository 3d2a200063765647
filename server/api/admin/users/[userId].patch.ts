import { AdminUserParamsSchema, AdminUserUpdateSchema } from '#shared/schemas/people'
import type { ServerPersonReply } from '#shared/types/people'
import { updatePerson } from '~~/server/services/people'

/** Site admins disable or enable an account, grant or revoke site admin (never the last enabled one). */
export default defineEventHandler(async (event): Promise<ServerPersonReply> => {
  const admin = requireSiteAdmin(event)
  const { userId } = validateParams(event, AdminUserParamsSchema)
  const change = await validateBody(event, AdminUserUpdateSchema)
  return { user: await updatePerson({ actor: admin, userId, change }) }
})
