import { and, eq, isNull } from 'drizzle-orm'
import { z } from 'zod'
import { UuidSchema } from '#shared/schemas/common'
import { useDb } from '../../../db/client'
import { apiTokens } from '../../../db/schema'
import { recordAudit } from '../../../services/audit'

const Params = z.object({ tokenId: UuidSchema })

/** Revokes one of the caller's tokens; it is refused (401) from the next request on. */
export default defineEventHandler(async (event) => {
  const user = requireSessionUser(event, 'Revoking an API token')
  const { tokenId } = validateParams(event, Params)
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
