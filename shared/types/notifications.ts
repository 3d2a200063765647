import type { mailOutbox, notifications } from '~~/server/db/schema'
import type { NotificationKind, NotificationMode } from '#shared/notifications/kinds'
import type { Serialize } from './serialize'

/** One entry of a person's in-app inbox. */
export type ServerInboxEntry = Pick<typeof notifications.$inferSelect, 'id' | 'projectId' | 'kind' | 'title' | 'body' | 'link' | 'readAt' | 'createdAt'> & {
  /** Who caused it (display name), null when unknown or gone. */
  actor: string | null
  /** The project's job number, for the list. */
  projectJobNumber: string | null
}
export type InboxEntry = Serialize<ServerInboxEntry>

/** GET /api/account/inbox */
export interface ServerInboxReply {
  notifications: ServerInboxEntry[]
  unread: number
  total: number
  limit: number
  offset: number
}
export type InboxReply = Serialize<ServerInboxReply>

/** GET /api/account/inbox/count */
export interface InboxCountReply {
  unread: number
}

/** POST /api/account/inbox/read-all, POST /api/account/inbox/{id}/read */
export interface InboxMarkedReply {
  marked: number
  unread: number
}

/** GET and PUT /api/account/notifications: one line per kind a person may turn off. */
export interface NotificationPreferencesReply {
  preferences: { kind: NotificationKind, label: string, mode: NotificationMode }[]
}

/** A message of the outbox as site admins see it: never its body. */
export type ServerOutboxMessage = Pick<typeof mailOutbox.$inferSelect, 'id' | 'kind' | 'toAddress' | 'subject' | 'status' | 'attempts' | 'nextAttemptAt' | 'lastError' | 'createdAt' | 'sentAt'>
export type OutboxMessage = Serialize<ServerOutboxMessage>

/** GET /api/admin/mail */
export interface ServerOutboxReply {
  messages: ServerOutboxMessage[]
  counts: { pending: number, failed: number, sent: number }
  limit: number
  offset: number
}
export type OutboxReply = Serialize<ServerOutboxReply>
