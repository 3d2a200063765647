import { sql } from 'drizzle-orm'
import { type Tx, useDb } from '~~/server/db/client'
import { liveEvents } from '~~/server/db/schema'

/** The kinds of change live pages listen for (ids only, never documents). */
export type LiveEventType
  = | 'flag.changed'
    | 'flag.reply'
    | 'version.changed'
    | 'review.changed'
    | 'inbox.changed'
    | 'member.changed'

export interface LiveEventInput {
  type: LiveEventType
  /** The project the change belongs to; null for a person's own inbox outside a project. */
  projectId: string | null
  /** Set for an event only one person should receive (their inbox). */
  userId?: string | null
  entityId?: string | null
}

/** The PostgreSQL channel every app process listens on. */
export const LIVE_EVENTS_CHANNEL = 'pastload_live_events'

/**
 * Records a change for live pages in the caller's transaction and announces it with
 * NOTIFY, which PostgreSQL delivers only when the transaction commits (nothing is
 * announced for a write that rolls back). The payload carries the row id only.
 */
export async function publishLiveEvent(event: LiveEventInput, tx?: Tx): Promise<void> {
  const db = tx ?? useDb()
  const [row] = await db.insert(liveEvents).values({
    type: event.type,
    projectId: event.projectId,
    userId: event.userId ?? null,
    entityId: event.entityId ?? null,
  }).returning({ id: liveEvents.id })
  if (row) await db.execute(sql`select pg_notify(${LIVE_EVENTS_CHANNEL}, ${String(row.id)})`)
}
