import { sql } from 'drizzle-orm'
import { bigint, index, integer, pgEnum, pgTable, primaryKey, text, uuid } from 'drizzle-orm/pg-core'
import { NOTIFICATION_KINDS, NOTIFICATION_MODES } from '#shared/notifications/kinds'
import { createdAt, moment, ownedRow } from './columns'
import { projects } from './projects'
import { namedUser, users } from './users'

export const notificationKind = pgEnum('notification_kind', NOTIFICATION_KINDS)
export const notificationMode = pgEnum('notification_mode', NOTIFICATION_MODES)
export const outboxStatus = pgEnum('outbox_status', ['pending', 'sent', 'failed'])

/**
 * E-mail waiting to be delivered. A row is written in the same transaction as the event
 * that causes it and delivered afterwards (retry with back-off), so a message is never
 * sent for a write that rolled back and never lost when the SMTP server is down.
 */
export const mailOutbox = pgTable('mail_outbox', {
  id: bigint({ mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
  kind: notificationKind().notNull(),
  toAddress: text().notNull(),
  toUserId: namedUser(),
  projectId: uuid().references(() => projects.id, { onDelete: 'set null' }),
  subject: text().notNull(),
  textBody: text().notNull(),
  htmlBody: text().notNull(),
  status: outboxStatus().notNull().default('pending'),
  attempts: integer().notNull().default(0),
  nextAttemptAt: moment().notNull().defaultNow(),
  /** The last delivery error's message (never the message body). */
  lastError: text(),
  createdAt: createdAt(),
  sentAt: moment(),
}, t => [
  index('mail_outbox_due_idx').on(t.nextAttemptAt).where(sql`${t.status} = 'pending'`),
  index('mail_outbox_status_idx').on(t.status, t.createdAt),
])

/** The in-app inbox: one row per person and event. */
export const notifications = pgTable('notifications', {
  ...ownedRow('userId', () => users.id),
  projectId: uuid().references(() => projects.id, { onDelete: 'cascade' }),
  kind: notificationKind().notNull(),
  title: text().notNull(),
  body: text().notNull().default(''),
  /** The app path of the exact page the event concerns. */
  link: text().notNull(),
  actorId: namedUser(),
  readAt: moment(),
  createdAt: createdAt(),
}, t => [index('notifications_user_idx').on(t.userId, t.createdAt)])

/** A person's choice per kind of e-mail; no row means the default (immediate). */
export const notificationPreferences = pgTable('notification_preferences', {
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  kind: notificationKind().notNull(),
  mode: notificationMode().notNull(),
}, t => [primaryKey({ name: 'notification_preferences_pk', columns: [t.userId, t.kind] })])
