import { eq } from 'drizzle-orm'
import { ChangePasswordSchema } from '#shared/schemas/auth'
import { useDb } from '../../db/client'
import { users } from '../../db/schema'
import { recordAudit } from '../../services/audit'
import { hashPassword, verifyPassword } from '../../utils/password'

/** Change one's own password; every other session of the user is signed out. */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  const body = await validateBody(event, ChangePasswordSchema)
  const db = useDb()
  const [row] = await db.select({ passwordHash: users.passwordHash }).from(users).where(eq(users.id, user.id))
  if (!row || !(await verifyPassword(row.passwordHash, body.currentPassword))) {
    throw createError({ statusCode: 422, statusMessage: 'Unprocessable Entity', message: 'The current password is wrong.', data: { issues: [{ path: 'currentPassword', message: 'is wrong' }] } })
  }
  await db.update(users).set({ passwordHash: await hashPassword(body.newPassword) }).where(eq(users.id, user.id))
  await useLucia().invalidateUserSessions(user.id)
  if (event.context.authVia === 'session') await startSession(event, user.id)
  await recordAudit({ actorId: user.id, action: 'password-change', entity: 'user', entityId: user.id })
  return { ok: true }
})
