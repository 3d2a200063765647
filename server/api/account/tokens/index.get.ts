import { desc, eq } from 'drizzle-orm'
import type { ApiTokenListReply } from '#shared/types/api-tokens'
import { useDb } from '../../../db/client'
import { apiTokens } from '../../../db/schema'

/** The caller's API tokens, newest first, with scope and expiry (never the secret or its hash). */
export default defineEventHandler(async (event): Promise<ApiTokenListReply> => {
  const user = requireSessionUser(event, 'Listing API tokens')
  const rows = await useDb().select({
    id: apiTokens.id,
    name: apiTokens.name,
    prefix: apiTokens.prefix,
    scope: apiTokens.scope,
    createdAt: apiTokens.createdAt,
    expiresAt: apiTokens.expiresAt,
    lastUsedAt: apiTokens.lastUsedAt,
    revokedAt: apiTokens.revokedAt,
  }).from(apiTokens).where(eq(apiTokens.userId, user.id)).orderBy(desc(apiTokens.createdAt))
  return {
    tokens: rows.map(r => ({
      ...r,
      createdAt: r.createdAt.toISOString(),
      expiresAt: r.expiresAt.toISOString(),
      lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
      revokedAt: r.revokedAt?.toISOString() ?? null,
    })),
  }
})
