import { AdminUsersQuerySchema } from '#shared/schemas/people'
import type { ServerPeopleList } from '#shared/types/people'
import { listPeople } from '~~/server/services/people'

/** Site admins: every account with its site-admin and disabled state and how many projects it is in. */
export default defineEventHandler(async (event): Promise<ServerPeopleList> => {
  requireSiteAdmin(event)
  const query = validateQuery(event, AdminUsersQuerySchema)
  return listPeople(query)
})
