import { and, eq, inArray, sql } from 'drizzle-orm'
import type { NotificationKind } from '#shared/notifications/kinds'
import { type Tx, useDb } from '~~/server/db/client'
import { mailOutbox, notificationPreferences, notifications, users } from '~~/server/db/schema'
import { publishLiveEvent } from '~~/server/services/live-events'
import { MAIL_OUTBOX_CHANNEL, publicBaseUrl } from '~~/server/services/mail-settings'
import { renderMail } from '~~/server/services/mail-templates'

/** One event told to some people: an inbox entry each, and an e-mail each unless they turned the kind off. */
export interface NoticeInput {
  kind: NotificationKind
  projectId: string | null
  /** User ids; the actor is left out (nobody is told of their own action); duplicates are merged. */
  recipients: readonly string[]
  actorId: string | null
  /** One line for the inbox and the e-mail's subject. */
  title: string
  /** A few lines of plain text: the comment, the flag's words. */
  body?: string
  /** The app path of the exact page, e.g. `/projects/<id>/models/<id>/versions/3`. */
  link: string
}

/**
 * Writes the inbox rows and the outbox rows in the caller's transaction (the e-mail goes out
 * only if the event commits) and announces the inbox change to live pages.
 */
export async function notify(input: NoticeInput, tx?: Tx): Promise<void> {
  const db = tx ?? useDb()
  const ids = [...new Set(input.recipients)].filter(id => id !== input.actorId)
  if (ids.length === 0) return
  const people = await db.select({ id: users.id, email: users.email, disabledAt: users.disabledAt })
    .from(users).where(inArray(users.id, ids))
  const off = await db.select({ userId: notificationPreferences.userId }).from(notificationPreferences)
    .where(and(inArray(notificationPreferences.userId, ids), eq(notificationPreferences.kind, input.kind), eq(notificationPreferences.mode, 'off')))
  const silenced = new Set(off.map(r => r.userId))
  const active = people.filter(p => !p.disabledAt)
  if (active.length === 0) return
  await db.insert(notifications).values(active.map(p => ({
    userId: p.id,
    projectId: input.projectId,
    kind: input.kind,
    title: input.title,
    body: input.body ?? '',
    link: input.link,
    actorId: input.actorId,
  })))
  const mail = active.filter(p => !silenced.has(p.id))
  if (mail.length > 0) {
    await db.insert(mailOutbox).values(mail.map(p => ({
      kind: input.kind,
      toAddress: p.email,
      toUserId: p.id,
      projectId: input.projectId,
      ...renderMail({ kind: input.kind, title: input.title, body: input.body ?? '', link: input.link, baseUrl: publicBaseUrl() }),
    })))
    await wakeMailWorker(db)
  }
  for (const p of active) await publishLiveEvent({ type: 'inbox.changed', projectId: null, userId: p.id }, tx)
}

/** E-mail to an address that may have no account yet (invitation, password reset): always sent. */
export async function sendAccountMail(input: { kind: 'invitation' | 'password-reset', to: string, userId?: string | null, projectId?: string | null, title: string, body: string, link: string }, tx?: Tx): Promise<void> {
  const db = tx ?? useDb()
  await db.insert(mailOutbox).values({
    kind: input.kind,
    toAddress: input.to,
    toUserId: input.userId ?? null,
    projectId: input.projectId ?? null,
    ...renderMail({ kind: input.kind, title: input.title, body: input.body, link: input.link, baseUrl: publicBaseUrl() }),
  })
  await wakeMailWorker(db)
}

/** Tells the delivery workers (every app process) that mail is waiting: PostgreSQL delivers it at commit. */
async function wakeMailWorker(db: Tx | ReturnType<typeof useDb>): Promise<void> {
  await db.execute(sql`select pg_notify(${MAIL_OUTBOX_CHANNEL}, '')`)
}
