import { and, asc, count, desc, eq, lte, sql } from 'drizzle-orm'
import nodemailer, { type Transporter } from 'nodemailer'
import type { z } from 'zod'
import type { OutboxQuerySchema } from '#shared/schemas/notifications'
import type { ServerOutboxReply } from '#shared/types/notifications'
import { useDb } from '../db/client'
import { mailOutbox } from '../db/schema'
import { recordAudit } from './audit'
import { notFound } from './http-errors'
import { MAIL_OUTBOX_CHANNEL, type MailSettings, retryDelayMs } from './mail-settings'

/** A nodemailer transport for the settings: the local catcher speaks plain SMTP on loopback (no STARTTLS). */
export function createMailTransport(s: MailSettings): Transporter {
  const timeouts = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 20_000 }
  if (s.local) {
    const url = new URL(s.smtpUrl)
    return nodemailer.createTransport({ host: url.hostname, port: Number(url.port), secure: false, ignoreTLS: true, ...timeouts })
  }
  return nodemailer.createTransport({ url: s.smtpUrl, ...timeouts })
}

/** What one delivery round did: outbox ids only (never addresses or bodies). */
export interface DeliveryRound {
  sent: number[]
  retrying: number[]
  failed: number[]
}

/** An SMTP error's own message, one line and bounded (never the message it was sending). */
function errorMessage(err: unknown): string {
  const text = err instanceof Error ? err.message : 'unknown error'
  // eslint-disable-next-line no-control-regex -- a server's multi-line reply becomes one line
  return text.replace(/[\u0000-\u001f\u007f]+/g, ' ').trim().slice(0, 500) || 'unknown error'
}

/**
 * Delivers up to `batch` due messages. The rows are locked with FOR UPDATE SKIP LOCKED for the
 * whole round, so another app process running the same round skips them: a message is sent by
 * one process only. A failure schedules the next attempt with exponential back-off, and after
 * `maxAttempts` the message is marked failed.
 */
export async function deliverDueMail(transport: Transporter, s: MailSettings, batch = 20): Promise<DeliveryRound> {
  return useDb().transaction(async (tx) => {
    const due = await tx.select().from(mailOutbox)
      .where(and(eq(mailOutbox.status, 'pending'), lte(mailOutbox.nextAttemptAt, sql`now()`)))
      .orderBy(asc(mailOutbox.nextAttemptAt), asc(mailOutbox.id))
      .limit(batch)
      .for('update', { skipLocked: true })
    const round: DeliveryRound = { sent: [], retrying: [], failed: [] }
    for (const m of due) {
      try {
        await transport.sendMail({
          from: s.from,
          to: m.toAddress,
          subject: m.subject,
          text: m.textBody,
          html: m.htmlBody,
          headers: { 'X-Pastload-Outbox-Id': String(m.id), 'X-Pastload-Kind': m.kind, 'Auto-Submitted': 'auto-generated' },
        })
        await tx.update(mailOutbox).set({ status: 'sent', sentAt: new Date(), attempts: m.attempts + 1, lastError: null }).where(eq(mailOutbox.id, m.id))
        round.sent.push(m.id)
      }
      catch (err) {
        const attempts = m.attempts + 1
        const givesUp = attempts >= s.maxAttempts
        await tx.update(mailOutbox).set({
          attempts,
          lastError: errorMessage(err),
          ...(givesUp ? { status: 'failed' as const } : { nextAttemptAt: new Date(Date.now() + retryDelayMs(attempts, s)) }),
        }).where(eq(mailOutbox.id, m.id))
        ;(givesUp ? round.failed : round.retrying).push(m.id)
      }
    }
    return round
  })
}

/** The outbox for site admins, newest first, with counts by status (never the bodies). */
export async function listOutbox(q: z.infer<typeof OutboxQuerySchema>): Promise<ServerOutboxReply> {
  const db = useDb()
  const messages = await db.select({
    id: mailOutbox.id, kind: mailOutbox.kind, toAddress: mailOutbox.toAddress, subject: mailOutbox.subject, status: mailOutbox.status,
    attempts: mailOutbox.attempts, nextAttemptAt: mailOutbox.nextAttemptAt, lastError: mailOutbox.lastError, createdAt: mailOutbox.createdAt, sentAt: mailOutbox.sentAt,
  }).from(mailOutbox)
    .where(q.status ? eq(mailOutbox.status, q.status) : undefined)
    .orderBy(desc(mailOutbox.createdAt), desc(mailOutbox.id))
    .limit(q.limit).offset(q.offset)
  const byStatus = await db.select({ status: mailOutbox.status, n: count() }).from(mailOutbox).groupBy(mailOutbox.status)
  const counts = { pending: 0, failed: 0, sent: 0 }
  for (const r of byStatus) counts[r.status] = Number(r.n)
  return { messages, counts, limit: q.limit, offset: q.offset }
}

/** A site admin sends a failed message again: pending, due now, attempts counted afresh (409 unless failed). */
export async function retryFailedMail(actorId: string, messageId: number) {
  return useDb().transaction(async (tx) => {
    const [row] = await tx.select({ id: mailOutbox.id, status: mailOutbox.status }).from(mailOutbox).where(eq(mailOutbox.id, messageId)).for('update')
    if (!row) notFound('Message')
    if (row.status !== 'failed') {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Only a failed message can be retried; this one is ${row.status}.` })
    }
    await tx.update(mailOutbox).set({ status: 'pending', attempts: 0, nextAttemptAt: new Date() }).where(eq(mailOutbox.id, messageId))
    await recordAudit({ actorId, action: 'update', entity: 'mail-outbox', entityId: String(messageId), before: { status: 'failed' }, after: { status: 'pending', attempts: 0 } }, tx)
    await tx.execute(sql`select pg_notify(${MAIL_OUTBOX_CHANNEL}, '')`)
    return { id: messageId, status: 'pending' as const }
  })
}
