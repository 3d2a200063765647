import { bigint, index, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { moment } from './columns'
import { projects } from './projects'
import { users } from './users'

/**
 * What changed in a project, for live updates: ids, never documents. The row's id is the
 * Server-Sent Event id, so a client that reconnects with Last-Event-ID gets what it missed.
 * `userId` set means the event is for that person only (their inbox).
 */
export const liveEvents = pgTable('live_events', {
  id: bigint({ mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
  projectId: uuid().references(() => projects.id, { onDelete: 'cascade' }),
  userId: uuid().references(() => users.id, { onDelete: 'cascade' }),
  type: text().notNull(),
  entityId: text(),
  at: moment().notNull().defaultNow(),
}, t => [
  index('live_events_project_idx').on(t.projectId, t.id),
  index('live_events_user_idx').on(t.userId, t.id),
])
