import { and, eq, sql } from 'drizzle-orm'
import { FlagParamsSchema, UpdateFlagSchema } from '#shared/schemas/review'
import { reviewFlags } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { versionedUpdate } from '~~/server/services/http-errors'

/** Change a flag's verdict or comment, or resolve / reopen it. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'review.write')
  const { flagId } = validateParams(event, FlagParamsSchema)
  const { version, status, ...patch } = await validateBody(event, UpdateFlagSchema)
  const scope = and(eq(reviewFlags.id, flagId), eq(reviewFlags.projectId, project.id))
  const flag = await useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(reviewFlags).where(scope)
    const statusPatch = status === undefined
      ? {}
      : status === 'resolved' ? { status, resolvedBy: user.id, resolvedAt: new Date() } : { status, resolvedBy: null, resolvedAt: null }
    const row = await versionedUpdate({
      entity: 'Flag',
      update: () => tx.update(reviewFlags).set({ ...patch, ...statusPatch, version: sql`${reviewFlags.version} + 1` }).where(and(scope, eq(reviewFlags.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId: user.id, projectId: project.id, action: status === 'resolved' ? 'resolve' : status === 'open' ? 'reopen' : 'update', entity: 'review-flag', entityId: flagId, before, after: row }, tx)
    return row
  })
  return { flag }
})
