import { and, eq } from 'drizzle-orm'
import { strata } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { notFound } from '~~/server/services/http-errors'
import { StratumParamsSchema } from '#shared/schemas/investigation'

/** Deletes a stratum; intervals that named it stay, unassigned. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { stratumId } = validateParams(event, StratumParamsSchema)
  await useDb().transaction(async (tx) => {
    const [before] = await tx.delete(strata).where(and(eq(strata.id, stratumId), eq(strata.projectId, project.id))).returning()
    if (!before) notFound('Stratum')
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'delete', entity: 'stratum', entityId: stratumId, before }, tx)
  })
  return { ok: true }
})
