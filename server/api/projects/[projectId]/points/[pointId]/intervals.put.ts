import { and, asc, eq, sql } from 'drizzle-orm'
import { checkIntervals } from '#shared/investigation/intervals'
import { LogReplaceSchema, PointParamsSchema } from '#shared/schemas/investigation'
import { anyOf } from '~~/server/db/any'
import { logIntervals, strata } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { assertLogValid, requirePoint } from '~~/server/services/points'
import { unprocessableError } from '~~/server/services/http-errors'
import type { ServerLogReply } from '#shared/types/investigation'

/**
 * Saves a hole's whole log at once, as the log table edits it: rows with an id
 * update (their version must match, else 409 with the current log), rows without
 * one are added, rows left out are deleted. All or nothing.
 */
export default defineEventHandler(async (event): Promise<ServerLogReply> => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const { intervals } = await validateBody(event, LogReplaceSchema)

  return useDb().transaction(async (tx) => {
    const point = await requirePoint(project.id, pointId, tx, { lock: true })
    const existing = await tx.select().from(logIntervals).where(eq(logIntervals.pointId, point.id)).orderBy(asc(logIntervals.top))
    const byId = new Map(existing.map(r => [r.id, r]))

    const stale = intervals.filter(iv => iv.id && byId.get(iv.id)?.version !== iv.version)
    if (stale.length) {
      throw createError({
        statusCode: 409,
        statusMessage: 'Conflict',
        message: `The log of ${point.identifier} was changed by someone else since you opened it (${stale.length} row(s)). Review the current log and apply your change again.`,
        data: { current: existing },
      })
    }
    assertLogValid(intervals, point.finalDepth)

    const stratumIds = [...new Set(intervals.map(iv => iv.stratumId).filter((s): s is string => !!s))]
    if (stratumIds.length) {
      const found = await tx.select({ id: strata.id }).from(strata).where(and(eq(strata.projectId, project.id), anyOf(strata.id, stratumIds)))
      if (found.length !== stratumIds.length) throw unprocessableError('A row names a stratum that is not in this project.')
    }

    const keep = new Set(intervals.flatMap(iv => (iv.id ? [iv.id] : [])))
    const removed = existing.filter(r => !keep.has(r.id)).map(r => r.id)
    if (removed.length) await tx.delete(logIntervals).where(anyOf(logIntervals.id, removed))
    for (const { id, version: _v, ...values } of intervals) {
      if (id) {
        const before = byId.get(id)!
        const changed = (Object.keys(values) as (keyof typeof values)[]).some(k => values[k] !== before[k])
        if (changed) await tx.update(logIntervals).set({ ...values, version: sql`${logIntervals.version} + 1` }).where(eq(logIntervals.id, id))
      }
      else {
        await tx.insert(logIntervals).values({ ...values, pointId: point.id })
      }
    }
    const after = await tx.select().from(logIntervals).where(eq(logIntervals.pointId, point.id)).orderBy(asc(logIntervals.top))
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'log', entityId: point.id, before: { intervals: existing }, after: { intervals: after } }, tx)
    return { intervals: after, gaps: checkIntervals(after, point.finalDepth).gaps }
  })
})
