import { CreateTokenSchema } from '#shared/schemas/auth'
import { createApiToken } from '../../../services/api-tokens'
import { recordAudit } from '../../../services/audit'

/** Creates a personal API token; the secret is in this response only. */
export default defineEventHandler(async (event) => {
  const user = requireUser(event)
  if (event.context.authVia !== 'session') {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'API tokens are created from a signed-in browser session, not with another token.' })
  }
  const { name } = await validateBody(event, CreateTokenSchema)
  const created = await createApiToken(user.id, name)
  await recordAudit({ actorId: user.id, action: 'create', entity: 'api-token', entityId: created.id, after: { name, prefix: created.prefix } })
  setResponseStatus(event, 201)
  return { token: created }
})
