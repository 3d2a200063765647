import type { H3Event } from 'h3'
import { and, asc, eq, gt, inArray, isNull, lt, or, sql } from 'drizzle-orm'
import pg from 'pg'
import type { LiveEventMessage, LiveEventType } from '#shared/types/live'
import { type Tx, databaseUrl, useDb } from '~~/server/db/client'
import { liveEvents, projectMembers, sessions, users } from '~~/server/db/schema'

export type { LiveEventType } from '#shared/types/live'

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

type LiveRow = typeof liveEvents.$inferSelect

function message(row: LiveRow): LiveEventMessage {
  return { id: row.id, type: row.type as LiveEventType, projectId: row.projectId, entityId: row.entityId, at: row.at.toISOString() }
}

/** One open event stream: a member watching a project. */
interface Subscriber {
  projectId: string
  userId: string
  deliver: (m: LiveEventMessage) => void
  /** Re-checks that the watcher may still see the project (after a membership change). */
  recheck: () => void
}

/** Whether an event belongs on a subscriber's stream: the project's shared events, and the watcher's own. */
export function eventIsFor(row: Pick<LiveRow, 'projectId' | 'userId'>, sub: Pick<Subscriber, 'projectId' | 'userId'>): boolean {
  if (row.userId) return row.userId === sub.userId
  return row.projectId === sub.projectId
}

/**
 * The process's one LISTEN connection, opened when the first stream opens and reconnected
 * with back-off when the database drops it. Each NOTIFY names a committed row; the rows
 * are read back in batches and handed to the streams they concern, so events written by
 * any app process on the same database reach every process's watchers.
 */
class LiveEventHub {
  private subscribers = new Set<Subscriber>()
  private client: pg.Client | null = null
  private connecting: Promise<void> | null = null
  private pending = new Set<number>()
  private flushing = false
  private retryMs = 500
  private closed = false

  get size(): number {
    return this.subscribers.size
  }

  countFor(userId: string): number {
    let n = 0
    for (const s of this.subscribers) if (s.userId === userId) n++
    return n
  }

  async add(sub: Subscriber): Promise<() => void> {
    this.subscribers.add(sub)
    await this.ensureListening()
    return () => {
      this.subscribers.delete(sub)
    }
  }

  private ensureListening(): Promise<void> {
    if (this.client || this.closed) return Promise.resolve()
    this.connecting ??= this.connect().finally(() => {
      this.connecting = null
    })
    return this.connecting
  }

  private async connect(): Promise<void> {
    const client = new pg.Client({ connectionString: databaseUrl(), connectionTimeoutMillis: 3000 })
    client.on('notification', (n) => {
      const id = Number(n.payload)
      if (Number.isSafeInteger(id) && id > 0) this.enqueue(id)
    })
    client.on('error', () => this.lost(client))
    client.on('end', () => this.lost(client))
    try {
      await client.connect()
      await client.query(`LISTEN ${LIVE_EVENTS_CHANNEL}`)
      this.client = client
      this.retryMs = 500
    }
    catch {
      await client.end().catch(() => {})
      this.scheduleReconnect()
    }
  }

  private lost(client: pg.Client) {
    if (this.client !== client) return
    this.client = null
    void client.end().catch(() => {})
    this.scheduleReconnect()
  }

  private scheduleReconnect() {
    if (this.closed || this.subscribers.size === 0) return
    const wait = this.retryMs
    this.retryMs = Math.min(this.retryMs * 2, 15_000)
    const t = setTimeout(() => void this.ensureListening(), wait)
    t.unref()
  }

  private enqueue(id: number) {
    this.pending.add(id)
    if (!this.flushing) void this.flush()
  }

  private async flush() {
    this.flushing = true
    try {
      while (this.pending.size > 0) {
        const ids = [...this.pending].slice(0, 500)
        for (const id of ids) this.pending.delete(id)
        if (this.subscribers.size === 0) continue
        const rows = await useDb().select().from(liveEvents).where(inArray(liveEvents.id, ids)).orderBy(asc(liveEvents.id))
        for (const row of rows) this.dispatch(row)
      }
    }
    catch {
      // The database is unreachable: these events are lost to live pages, which replay on reconnect.
    }
    finally {
      this.flushing = false
    }
  }

  private dispatch(row: LiveRow) {
    const m = message(row)
    for (const sub of this.subscribers) {
      if (eventIsFor(row, sub)) sub.deliver(m)
      if (row.type === 'member.changed' && row.projectId === sub.projectId) sub.recheck()
    }
  }

  async close() {
    this.closed = true
    this.subscribers.clear()
    const c = this.client
    this.client = null
    if (c) await c.end().catch(() => {})
  }
}

let hub: LiveEventHub | undefined
function useHub(): LiveEventHub {
  hub ??= new LiveEventHub()
  return hub
}

/** Stops listening (the server is closing). */
export async function closeLiveEvents(): Promise<void> {
  const h = hub
  hub = undefined
  await h?.close()
}

/** At most this many open streams per person (tabs); one more is 429. */
export const MAX_STREAMS_PER_USER = 12
/** Replayed on reconnect at most; a gap larger than this is answered with `resync`. */
const MAX_REPLAY = 500
/** Keep-alive and access re-check interval. */
const PING_MS = Number(process.env.PASTLOAD_LIVE_PING_MS ?? 25_000)

export interface LiveStreamRequest {
  projectId: string
  userId: string
  /** The browser's session row (a cookie caller), re-checked on every ping; null for an API token. */
  sessionId: string | null
  lastEventId: number | null
}

/**
 * Opens the Server-Sent Events stream of one project for one member: what was missed since
 * `lastEventId` first, then live events as they commit, a `ping` event as keep-alive. The
 * stream ends when the watcher signs out, is disabled or leaves the project.
 */
export async function openProjectEventStream(event: H3Event, req: LiveStreamRequest) {
  const h = useHub()
  if (h.countFor(req.userId) >= MAX_STREAMS_PER_USER) {
    throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: `At most ${MAX_STREAMS_PER_USER} live connections per person: close a tab and try again.` })
  }
  const stream = createEventStream(event)
  let open = true
  let lastSent = req.lastEventId ?? 0
  const send = (m: LiveEventMessage) => {
    if (!open || m.id <= lastSent) return
    lastSent = m.id
    void stream.push({ id: String(m.id), data: JSON.stringify(m) }).catch(() => {})
  }
  const stop = () => {
    if (!open) return
    open = false
    clearInterval(timer)
    remove()
    void stream.close().catch(() => {})
  }
  const recheck = () => {
    void stillAllowed(req).then((ok) => {
      if (!ok) stop()
    }, () => {})
  }
  const remove = await h.add({ projectId: req.projectId, userId: req.userId, deliver: send, recheck })
  const timer = setInterval(() => {
    void stream.push({ event: 'ping', data: String(Date.now()) }).catch(() => {})
    recheck()
  }, PING_MS)
  timer.unref()
  stream.onClosed(stop)
  // A first keep-alive at once, so the answer's headers go out now rather than with the first change.
  void stream.push({ event: 'ping', data: String(Date.now()) }).catch(() => {})
  if (req.lastEventId !== null) void replay(req, send, () => stop())
  return stream.send()
}

async function replay(req: LiveStreamRequest, send: (m: LiveEventMessage) => void, stop: () => void) {
  try {
    const lastId = req.lastEventId ?? 0
    const rows = await useDb().select().from(liveEvents)
      .where(and(
        gt(liveEvents.id, lastId),
        or(and(eq(liveEvents.projectId, req.projectId), isNull(liveEvents.userId)), eq(liveEvents.userId, req.userId)),
      ))
      .orderBy(asc(liveEvents.id))
      .limit(MAX_REPLAY + 1)
    if (rows.length > MAX_REPLAY) {
      const newest = rows[rows.length - 1]
      if (newest) send({ id: newest.id, type: 'resync', projectId: req.projectId, entityId: null, at: new Date().toISOString() })
      return
    }
    for (const row of rows) send(message(row))
  }
  catch {
    stop()
  }
}

/** The watcher is still a member, still enabled and (for a browser) still signed in. */
async function stillAllowed(req: LiveStreamRequest): Promise<boolean> {
  const db = useDb()
  const [member] = await db.select({ userId: projectMembers.userId }).from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(and(eq(projectMembers.projectId, req.projectId), eq(projectMembers.userId, req.userId), isNull(users.disabledAt)))
    .limit(1)
  if (!member) return false
  if (req.sessionId === null) return true
  const [session] = await db.select({ id: sessions.id }).from(sessions)
    .where(and(eq(sessions.id, req.sessionId), gt(sessions.expiresAt, new Date()))).limit(1)
  return Boolean(session)
}

/** Live events are for pages open now: rows older than a day are removed. */
export async function pruneLiveEvents(olderThanMs = 24 * 3600_000): Promise<number> {
  const rows = await useDb().delete(liveEvents).where(lt(liveEvents.at, new Date(Date.now() - olderThanMs))).returning({ id: liveEvents.id })
  return rows.length
}
