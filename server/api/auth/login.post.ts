import { sql } from 'drizzle-orm'
import { LoginSchema } from '#shared/schemas/auth'
import { users } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { recordSuccess, takeAttempt } from '~~/server/services/login-throttle'
import { dummyPasswordHash, verifyPassword } from '~~/server/utils/password'

const WRONG = 'E-mail or password is wrong.'

export default defineEventHandler(async (event) => {
  const { email, password } = await validateBody(event, LoginSchema)
  const ip = clientIp(event)

  const wait = await takeAttempt(email, ip)
  if (wait > 0) {
    setResponseHeader(event, 'Retry-After', wait)
    throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `Too many failed sign-ins. Try again in ${Math.ceil(wait / 60)} minute(s).` })
  }

  const [user] = await useDb().select().from(users).where(sql`lower(${users.email}) = ${email}`).limit(1)
  // Same work and the same answer for an unknown e-mail and a wrong password.
  const ok = await verifyPassword(user?.passwordHash ?? await dummyPasswordHash(), password)
  if (!user || !ok) {
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: WRONG })
  }
  await recordSuccess(email, ip)
  // Told only to someone who knows the password: no probing of which accounts are disabled.
  if (user.disabledAt) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This account is disabled. Ask a site admin to enable it.' })
  }

  await startSession(event, user.id)
  await recordAudit({ actorId: user.id, action: 'login', entity: 'session', entityId: null, after: { ip } })
  return { user: { id: user.id, email: user.email, displayName: user.displayName, isSiteAdmin: user.isSiteAdmin } }
})
