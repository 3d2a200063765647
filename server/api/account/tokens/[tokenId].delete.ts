import { and, eq, isNull } from 'drizzle-orm'
import { ApiTokenParamsSchema } from '#shared/schemas/auth'
import { apiTokens } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'

/** Revokes one of the caller's tokens; it is refused (401) from the next request on. */
export default defineEventHandler(async (event) => {
  const user = requireSessionUser(event, 'Revoking an API token')
  const { tokenId } = validateParams(event, ApiTokenParamsSchema)
  const revoked = await useDb().transaction(async (tx) => {
    const [row] = await tx.update(apiTokens)
      .set({ revokedAt: new Date() })
      .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, user.id), isNull(apiTokens.revokedAt)))
      .returning({ id: apiTokens.id, name: apiTokens.name })
    if (row) await recordAudit({ actorId: user.id, action: 'delete', entity: 'api-token', entityId: row.id, before: { name: row.name } }, tx)
    return row
  })
  if (!revoked) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Token not found or already revoked.' })
  return { ok: true }
})
