import { CreateUserSchema } from '#shared/schemas/auth'
import { users } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { isUniqueViolation } from '~~/server/utils/db-errors'
import { hashPassword } from '~~/server/utils/password'

/** Site admins create accounts; the new user changes the password on the account page. */
export default defineEventHandler(async (event) => {
  const admin = requireSiteAdmin(event)
  const body = await validateBody(event, CreateUserSchema)
  try {
    const [row] = await useDb().insert(users).values({
      email: body.email,
      displayName: body.displayName,
      isSiteAdmin: body.isSiteAdmin,
      passwordHash: await hashPassword(body.password),
    }).returning({ id: users.id, email: users.email, displayName: users.displayName, isSiteAdmin: users.isSiteAdmin })
    await recordAudit({ actorId: admin.id, action: 'create', entity: 'user', entityId: row!.id, after: row })
    setResponseStatus(event, 201)
    return { user: row }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `An account already uses ${body.email}.` })
    throw err
  }
})
