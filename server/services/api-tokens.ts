import { createHash, randomBytes } from 'node:crypto'
import { and, eq, isNull } from 'drizzle-orm'
import type { SessionUser } from '#shared/schemas/auth'
import { useDb } from '../db/client'
import { apiTokens, users } from '../db/schema'

const PREFIX = 'plt_'

/** Tokens are 32 random bytes; only their SHA-256 is stored (a high-entropy secret needs no slow hash). */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export async function createApiToken(userId: string, name: string) {
  const token = PREFIX + randomBytes(32).toString('base64url')
  const [row] = await useDb().insert(apiTokens).values({
    userId,
    name,
    tokenHash: hashToken(token),
    prefix: token.slice(0, PREFIX.length + 6),
  }).returning({ id: apiTokens.id, name: apiTokens.name, prefix: apiTokens.prefix, createdAt: apiTokens.createdAt })
  return { ...row!, token }
}

export async function authenticateToken(token: string): Promise<SessionUser | null> {
  if (!token.startsWith(PREFIX) || token.length > 200) return null
  const db = useDb()
  const [row] = await db.select({
    tokenId: apiTokens.id,
    id: users.id,
    email: users.email,
    displayName: users.displayName,
    isSiteAdmin: users.isSiteAdmin,
  })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(and(eq(apiTokens.tokenHash, hashToken(token)), isNull(apiTokens.revokedAt)))
    .limit(1)
  if (!row) return null
  await db.update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.tokenId))
  const { tokenId: _tokenId, ...user } = row
  return user
}
