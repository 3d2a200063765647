import { and, count, desc, eq, isNull, sql } from 'drizzle-orm'
import type { z } from 'zod'
import { NOTIFICATION_KIND_LABELS, OPTIONAL_NOTIFICATION_KINDS, type NotificationMode } from '#shared/notifications/kinds'
import type { InboxQuerySchema, NotificationPreferencesSchema } from '#shared/schemas/notifications'
import type { InboxMarkedReply, NotificationPreferencesReply, ServerInboxReply } from '#shared/types/notifications'
import { useDb } from '../db/client'
import { notificationPreferences, notifications, projects, users } from '../db/schema'
import { recordAudit } from './audit'
import { notFound } from './http-errors'
import { publishLiveEvent } from './live-events'

const unreadOf = (userId: string) => and(eq(notifications.userId, userId), isNull(notifications.readAt))

async function unreadCount(userId: string): Promise<number> {
  const [row] = await useDb().select({ n: count() }).from(notifications).where(unreadOf(userId))
  return Number(row?.n ?? 0)
}

/** The caller's own inbox, newest first (only their rows: the user id is in every WHERE clause). */
export async function listInbox(userId: string, q: z.infer<typeof InboxQuerySchema>): Promise<ServerInboxReply> {
  const db = useDb()
  const where = q.unread ? unreadOf(userId) : eq(notifications.userId, userId)
  const rows = await db.select({
    id: notifications.id, projectId: notifications.projectId, kind: notifications.kind, title: notifications.title, body: notifications.body,
    link: notifications.link, readAt: notifications.readAt, createdAt: notifications.createdAt, actor: users.displayName, projectJobNumber: projects.jobNumber,
  }).from(notifications)
    .leftJoin(users, eq(users.id, notifications.actorId))
    .leftJoin(projects, eq(projects.id, notifications.projectId))
    .where(where)
    .orderBy(desc(notifications.createdAt), desc(notifications.id))
    .limit(q.limit).offset(q.offset)
  const [total] = await db.select({ n: count() }).from(notifications).where(where)
  return { notifications: rows, unread: await unreadCount(userId), total: Number(total?.n ?? 0), limit: q.limit, offset: q.offset }
}

export async function inboxCount(userId: string): Promise<{ unread: number }> {
  return { unread: await unreadCount(userId) }
}

/** Marks one of the caller's entries read (another person's entry, or none: 404). Reading it twice is fine. */
export async function markInboxEntryRead(userId: string, notificationId: string): Promise<InboxMarkedReply> {
  const marked = await useDb().transaction(async (tx) => {
    const [row] = await tx.select({ id: notifications.id, readAt: notifications.readAt }).from(notifications)
      .where(and(eq(notifications.id, notificationId), eq(notifications.userId, userId)))
    if (!row) notFound('Inbox entry')
    if (row.readAt) return 0
    await tx.update(notifications).set({ readAt: new Date() }).where(eq(notifications.id, row.id))
    await publishLiveEvent({ type: 'inbox.changed', projectId: null, userId }, tx)
    return 1
  })
  return { marked, unread: await unreadCount(userId) }
}

/** Marks every unread entry of the caller read. */
export async function markInboxAllRead(userId: string): Promise<InboxMarkedReply> {
  const marked = await useDb().transaction(async (tx) => {
    const rows = await tx.update(notifications).set({ readAt: sql`now()` }).where(unreadOf(userId)).returning({ id: notifications.id })
    if (rows.length) await publishLiveEvent({ type: 'inbox.changed', projectId: null, userId }, tx)
    return rows.length
  })
  return { marked, unread: await unreadCount(userId) }
}

/** The caller's choice per optional kind (no row: immediate). */
export async function notificationPreferencesOf(userId: string): Promise<NotificationPreferencesReply> {
  const rows = await useDb().select({ kind: notificationPreferences.kind, mode: notificationPreferences.mode })
    .from(notificationPreferences).where(eq(notificationPreferences.userId, userId))
  const chosen = new Map<string, NotificationMode>(rows.map(r => [r.kind, r.mode]))
  return {
    preferences: OPTIONAL_NOTIFICATION_KINDS.map(kind => ({ kind, label: NOTIFICATION_KIND_LABELS[kind], mode: chosen.get(kind) ?? 'immediate' })),
  }
}

/** Sets the caller's mode for the kinds named (one upsert each, one transaction, audited). */
export async function updateNotificationPreferences(userId: string, body: z.infer<typeof NotificationPreferencesSchema>): Promise<NotificationPreferencesReply> {
  const entries = Object.entries(body.preferences).flatMap(([kind, mode]) => (mode ? [{ kind: kind as keyof typeof body.preferences, mode }] : []))
  await useDb().transaction(async (tx) => {
    await tx.insert(notificationPreferences).values(entries.map(e => ({ userId, kind: e.kind, mode: e.mode })))
      .onConflictDoUpdate({ target: [notificationPreferences.userId, notificationPreferences.kind], set: { mode: sql`excluded.mode` } })
    await recordAudit({ actorId: userId, action: 'update', entity: 'notification-preferences', entityId: userId, after: body.preferences }, tx)
  })
  return notificationPreferencesOf(userId)
}
