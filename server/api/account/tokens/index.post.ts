import { CreateTokenSchema, tokenExpiry } from '#shared/schemas/auth'
import type { ApiTokenCreatedReply } from '#shared/types/api-tokens'
import { createApiToken } from '~~/server/services/api-tokens'
import { recordAudit } from '~~/server/services/audit'

/** Creates a personal API token (expiry and scope chosen here); the secret is in this response only. */
export default defineEventHandler(async (event): Promise<ApiTokenCreatedReply> => {
  const user = requireSessionUser(event, 'Creating an API token')
  const body = await validateBody(event, CreateTokenSchema)
  const scope = body.readOnly ? 'read-only' : 'read-write'
  const created = await useDb().transaction(async (tx) => {
    const row = await createApiToken(tx, user.id, { name: body.name, scope, expiresAt: tokenExpiry(body) })
    await recordAudit({ actorId: user.id, action: 'create', entity: 'api-token', entityId: row.id, after: { name: row.name, prefix: row.prefix, scope, expiresAt: row.expiresAt.toISOString() } }, tx)
    return row
  })
  setResponseStatus(event, 201)
  return { token: { ...created, createdAt: created.createdAt.toISOString(), expiresAt: created.expiresAt.toISOString() } }
})
