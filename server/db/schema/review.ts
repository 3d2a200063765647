import { index, integer, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { FLAG_TARGETS, FLAG_VERDICTS } from '#shared/review/flags'
import { timestamps } from './columns'
import { projects } from './projects'
import { users } from './users'

export const flagTarget = pgEnum('flag_target', FLAG_TARGETS)
export const flagVerdict = pgEnum('flag_verdict', FLAG_VERDICTS)
export const flagStatus = pgEnum('flag_status', ['open', 'resolved'])

/** A reviewer's flag on a σ'p point, a test or a log interval, with a thread of replies. */
export const reviewFlags = pgTable('review_flags', {
  id: uuid().primaryKey().defaultRandom(),
  projectId: uuid().notNull().references(() => projects.id, { onDelete: 'cascade' }),
  targetType: flagTarget().notNull(),
  /** Id of the flagged record; derived points use a stable composite id (see shared/review/flags.ts). */
  targetId: text().notNull(),
  verdict: flagVerdict().notNull(),
  comment: text().notNull(),
  status: flagStatus().notNull().default('open'),
  createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  resolvedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  resolvedAt: timestamp({ withTimezone: true, mode: 'date' }),
  version: integer().notNull().default(1),
  ...timestamps,
}, t => [
  index('review_flags_project_idx').on(t.projectId, t.status),
  index('review_flags_target_idx').on(t.targetType, t.targetId),
])

export const reviewReplies = pgTable('review_replies', {
  id: uuid().primaryKey().defaultRandom(),
  flagId: uuid().notNull().references(() => reviewFlags.id, { onDelete: 'cascade' }),
  body: text().notNull(),
  createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [index('review_replies_flag_idx').on(t.flagId, t.createdAt)])
