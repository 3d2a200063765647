import { desc, eq } from 'drizzle-orm'
import { useDb } from '../../../db/client'
import { apiTokens } from '../../../db/schema'

export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const tokens = await useDb().select({
    id: apiTokens.id,
    name: apiTokens.name,
    prefix: apiTokens.prefix,
    createdAt: apiTokens.createdAt,
    lastUsedAt: apiTokens.lastUsedAt,
    revokedAt: apiTokens.revokedAt,
  }).from(apiTokens).where(eq(apiTokens.userId, user.id)).orderBy(desc(apiTokens.createdAt))
  return { tokens }
})
