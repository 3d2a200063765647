import { createHash, randomBytes } from 'node:crypto'
import { and, desc, eq, isNull } from 'drizzle-orm'
import type { H3Event } from 'h3'
import type { SessionUser } from '#shared/schemas/auth'
import type { ApiTokenRow, ApiTokenScope } from '#shared/types/api-tokens'
import { type Tx, useDb } from '../db/client'
import { apiTokens, users } from '../db/schema'
import { returnedRow } from '../db/rows'

const PREFIX = 'plt_'

/** Tokens are 32 random bytes; only their SHA-256 is stored (a high-entropy secret needs no slow hash). */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex')
}

export interface NewApiToken {
  name: string
  scope: ApiTokenScope
  expiresAt: Date
}

/** What a token shows of itself (never the secret or its hash). */
const TOKEN_COLUMNS = {
  id: apiTokens.id,
  name: apiTokens.name,
  prefix: apiTokens.prefix,
  scope: apiTokens.scope,
  createdAt: apiTokens.createdAt,
  expiresAt: apiTokens.expiresAt,
}

/** Inserts a token inside the caller's transaction (its audit row goes in the same one). */
export async function createApiToken(tx: Tx, userId: string, input: NewApiToken) {
  const token = PREFIX + randomBytes(32).toString('base64url')
  const rows = await tx.insert(apiTokens).values({
    userId,
    name: input.name,
    scope: input.scope,
    expiresAt: input.expiresAt,
    tokenHash: hashToken(token),
    prefix: token.slice(0, PREFIX.length + 6),
  }).returning(TOKEN_COLUMNS)
  return { ...returnedRow(rows), token }
}

/** The user's API tokens, newest first, with scope, expiry, last use and revocation. */
export async function listApiTokens(userId: string): Promise<ApiTokenRow[]> {
  const rows = await useDb().select({ ...TOKEN_COLUMNS, lastUsedAt: apiTokens.lastUsedAt, revokedAt: apiTokens.revokedAt })
    .from(apiTokens).where(eq(apiTokens.userId, userId)).orderBy(desc(apiTokens.createdAt))
  return rows.map(r => ({
    ...r,
    createdAt: r.createdAt.toISOString(),
    expiresAt: r.expiresAt.toISOString(),
    lastUsedAt: r.lastUsedAt?.toISOString() ?? null,
    revokedAt: r.revokedAt?.toISOString() ?? null,
  }))
}

/** Revokes every live token of the user (a password change does this); returns how many. */
export async function revokeAllTokens(tx: Tx, userId: string): Promise<number> {
  const rows = await tx.update(apiTokens)
    .set({ revokedAt: new Date() })
    .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)))
    .returning({ id: apiTokens.id })
  return rows.length
}

export type TokenCheck =
  | { ok: true, user: SessionUser, scope: ApiTokenScope }
  | { ok: false, message: string }

const UNKNOWN = 'The API token is invalid or revoked.'

/** Looks a bearer token up: its user and scope, or why it is refused (unknown, revoked, expired, account disabled). */
export async function authenticateToken(token: string): Promise<TokenCheck> {
  if (!token.startsWith(PREFIX) || token.length > 200) return { ok: false, message: UNKNOWN }
  const db = useDb()
  const [row] = await db.select({
    tokenId: apiTokens.id,
    scope: apiTokens.scope,
    expiresAt: apiTokens.expiresAt,
    revokedAt: apiTokens.revokedAt,
    id: users.id,
    email: users.email,
    displayName: users.displayName,
    isSiteAdmin: users.isSiteAdmin,
    disabledAt: users.disabledAt,
  })
    .from(apiTokens)
    .innerJoin(users, eq(users.id, apiTokens.userId))
    .where(eq(apiTokens.tokenHash, hashToken(token)))
    .limit(1)
  if (!row || row.revokedAt) return { ok: false, message: UNKNOWN }
  if (row.disabledAt) return { ok: false, message: 'The account this API token belongs to is disabled.' }
  if (row.expiresAt.getTime() <= Date.now()) {
    return { ok: false, message: `The API token expired on ${row.expiresAt.toISOString().slice(0, 10)}; create a new one on the account page.` }
  }
  await db.update(apiTokens).set({ lastUsedAt: new Date() }).where(eq(apiTokens.id, row.tokenId))
  const { id, email, displayName, isSiteAdmin } = row
  return { ok: true, user: { id, email, displayName, isSiteAdmin }, scope: row.scope }
}

/**
 * Puts the caller of an `Authorization: Bearer` request on `event.context` (user, scope),
 * or marks the token refused with the reason requireUser answers 401 with. A bad token is
 * never silently downgraded to a cookie session.
 */
export async function applyBearerToken(event: H3Event, token: string): Promise<void> {
  const check = await authenticateToken(token)
  if (check.ok) {
    event.context.user = check.user
    event.context.authVia = 'token'
    event.context.tokenScope = check.scope
    event.context.tokenRejected = false
  }
  else {
    event.context.tokenRejected = true
    event.context.tokenRejectedMessage = check.message
  }
}
