import { eq } from 'drizzle-orm'
import { ChangePasswordSchema } from '#shared/schemas/auth'
import { users } from '~~/server/db/schema'
import { revokeAllTokens } from '~~/server/services/api-tokens'
import { recordAudit } from '~~/server/services/audit'
import { hashPassword, verifyPassword } from '~~/server/utils/password'
import { unprocessableError } from '~~/server/services/http-errors'

/**
 * Change one's own password (from a browser session only): every API token of the user is
 * revoked with it, and every other session is signed out.
 */
export default defineEventHandler(async (event) => {
  const user = requireSessionUser(event, 'Changing the password')
  const body = await validateBody(event, ChangePasswordSchema)
  const db = useDb()
  const [row] = await db.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, user.id))
  if (!row || !(await verifyPassword(row.passwordHash, body.currentPassword))) {
    throw unprocessableError('The current password is wrong.', { issues: [{ path: 'currentPassword', message: 'is wrong' }] })
  }
  const passwordHash = await hashPassword(body.newPassword)
  const tokensRevoked = await db.transaction(async (tx) => {
    await tx.update(users).set({ passwordHash }).where(eq(users.id, user.id))
    const n = await revokeAllTokens(tx, user.id)
    await recordAudit({ actorId: user.id, action: 'password-change', entity: 'user', entityId: user.id, after: { tokensRevoked: n } }, tx)
    return n
  })
  await useLucia().invalidateUserSessions(user.id)
  await startSession(event, user.id)
  return { ok: true, tokensRevoked }
})
