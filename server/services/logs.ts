import { and, asc, eq, sql } from 'drizzle-orm'
import { knownEntry } from '../db/rows'
import { checkIntervals } from '#shared/investigation/intervals'
import type { IntervalInput } from '#shared/schemas/investigation'
import { useDb } from '../db/client'
import { anyOf } from '../db/any'
import { logIntervals, strata } from '../db/schema'
import { recordAudit } from './audit'
import { unprocessableError } from './http-errors'
import { assertLogValid, requirePoint } from './points'
import { projectDepthWords } from './project-units'

/** A row of the log as the table sends it: with the id and version it read, or neither for a new row. */
export type LogRowInput = IntervalInput & { id?: string, version?: number }

type LogValues = Omit<LogRowInput, 'id' | 'version'>
const FIELDS = ['top', 'bottom', 'description', 'uscs', 'stratumId', 'moisture', 'consistency'] as const satisfies readonly (keyof LogValues)[]

/**
 * Saves a hole's whole log at once, as the log table edits it: rows with an id update (their version
 * must match, else 409 with the current log), rows without one are added, rows left out are deleted.
 * All or nothing, set-based: one DELETE, one UPDATE … FROM (VALUES …) for the rows that changed (their
 * version bumped), one INSERT, whatever the number of rows. One audit entry holds both logs.
 */
export async function replaceLog(projectId: string, actorId: string, pointId: string, intervals: LogRowInput[]) {
  return useDb().transaction(async (tx) => {
    const point = await requirePoint(projectId, pointId, tx, { lock: true })
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
    // Refused in the project's units (the units are read only when there is something to say).
    if (checkIntervals(intervals, point.finalDepth).issues.length) assertLogValid(intervals, point.finalDepth, (await projectDepthWords(projectId, tx)).intervals)

    const stratumIds = [...new Set(intervals.map(iv => iv.stratumId).filter((s): s is string => !!s))]
    if (stratumIds.length) {
      const found = await tx.select({ id: strata.id }).from(strata).where(and(eq(strata.projectId, projectId), anyOf(strata.id, stratumIds)))
      if (found.length !== stratumIds.length) throw unprocessableError('A row names a stratum that is not in this project.')
    }

    const keep = new Set(intervals.flatMap(iv => (iv.id ? [iv.id] : [])))
    const removed = existing.filter(r => !keep.has(r.id)).map(r => r.id)
    const changed = intervals.filter((iv): iv is LogRowInput & { id: string } => !!iv.id && FIELDS.some(k => iv[k] !== knownEntry(byId, iv.id)[k]))
    const added = intervals.filter(iv => !iv.id)

    if (removed.length) await tx.delete(logIntervals).where(anyOf(logIntervals.id, removed))
    if (changed.length) {
      const values = sql.join(changed.map(r => sql`(${r.id}::uuid, ${r.top}::float8, ${r.bottom}::float8, ${r.description}::text, ${r.uscs}::text, ${r.stratumId}::uuid, ${r.moisture}::text, ${r.consistency}::text)`), sql`, `)
      await tx.execute(sql`
        update ${logIntervals} set top = v.top, bottom = v.bottom, description = v.description, uscs = v.uscs, stratum_id = v.stratum_id,
          moisture = v.moisture, consistency = v.consistency, version = ${logIntervals.version} + 1, updated_at = now()
        from (values ${values}) as v(id, top, bottom, description, uscs, stratum_id, moisture, consistency)
        where ${logIntervals.id} = v.id`)
    }
    if (added.length) {
      await tx.insert(logIntervals).values(added.map(({ id: _id, version: _v, ...values }) => ({ ...values, pointId: point.id })))
    }

    const after = await tx.select().from(logIntervals).where(eq(logIntervals.pointId, point.id)).orderBy(asc(logIntervals.top))
    await recordAudit({ actorId, projectId, action: 'update', entity: 'log', entityId: point.id, before: { intervals: existing }, after: { intervals: after } }, tx)
    return { intervals: after, gaps: checkIntervals(after, point.finalDepth).gaps }
  })
}
