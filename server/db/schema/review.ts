import { index, pgEnum, pgTable, text } from 'drizzle-orm/pg-core'
import { FLAG_TARGETS, FLAG_VERDICTS } from '#shared/review/flags'
import { createdAt, moment, ownedRow, timestamps, versioned } from './columns'
import { projects } from './projects'
import { namedUser } from './users'

export const flagTarget = pgEnum('flag_target', FLAG_TARGETS)
export const flagVerdict = pgEnum('flag_verdict', FLAG_VERDICTS)
export const flagStatus = pgEnum('flag_status', ['open', 'resolved'])

/** A reviewer's flag on a σ'p point, a test or a log interval, with a thread of replies. */
export const reviewFlags = pgTable('review_flags', {
  ...ownedRow('projectId', () => projects.id),
  targetType: flagTarget().notNull(),
  /** Id of the flagged record; derived points use a stable composite id (see shared/review/flags.ts). */
  targetId: text().notNull(),
  verdict: flagVerdict().notNull(),
  comment: text().notNull(),
  status: flagStatus().notNull().default('open'),
  createdBy: namedUser(),
  resolvedBy: namedUser(),
  resolvedAt: moment(),
  ...versioned,
  ...timestamps,
}, t => [
  index('review_flags_project_idx').on(t.projectId, t.status),
  index('review_flags_target_idx').on(t.targetType, t.targetId),
])

export const reviewReplies = pgTable('review_replies', {
  ...ownedRow('flagId', () => reviewFlags.id),
  body: text().notNull(),
  createdBy: namedUser(),
  createdAt: createdAt(),
}, t => [index('review_replies_flag_idx').on(t.flagId, t.createdAt)])
