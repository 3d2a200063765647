import { asc } from 'drizzle-orm'
import { PageQuerySchema } from '#shared/schemas/common'
import { users } from '~~/server/db/schema'

/** Site admins list accounts (paged). */
export default defineEventHandler(async (event) => {
  requireSiteAdmin(event)
  const { limit, offset } = validateQuery(event, PageQuerySchema)
  const rows = await useDb().select({ id: users.id, email: users.email, displayName: users.displayName, isSiteAdmin: users.isSiteAdmin, createdAt: users.createdAt })
    .from(users).orderBy(asc(users.displayName)).limit(limit).offset(offset)
  return { users: rows, limit, offset }
})
