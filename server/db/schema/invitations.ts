import { index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { projectRole, projects } from './projects'
import { users } from './users'

/**
 * An invitation by e-mail: to a project with a role, or (project null) to the site from the
 * people page. Only the SHA-256 of the link's token is stored; single use; revocable.
 */
export const invitations = pgTable('invitations', {
  id: uuid().primaryKey().defaultRandom(),
  projectId: uuid().references(() => projects.id, { onDelete: 'cascade' }),
  email: text().notNull(),
  role: projectRole(),
  tokenHash: text().notNull(),
  invitedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  expiresAt: timestamp({ withTimezone: true, mode: 'date' }).notNull(),
  acceptedAt: timestamp({ withTimezone: true, mode: 'date' }),
  acceptedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  revokedAt: timestamp({ withTimezone: true, mode: 'date' }),
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [
  uniqueIndex('invitations_token_idx').on(t.tokenHash),
  index('invitations_project_idx').on(t.projectId, t.createdAt),
])

/** A password-reset link: only the token's SHA-256 is stored; one hour, single use. */
export const passwordResets = pgTable('password_resets', {
  id: uuid().primaryKey().defaultRandom(),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text().notNull(),
  expiresAt: timestamp({ withTimezone: true, mode: 'date' }).notNull(),
  usedAt: timestamp({ withTimezone: true, mode: 'date' }),
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [
  uniqueIndex('password_resets_token_idx').on(t.tokenHash),
  index('password_resets_user_idx').on(t.userId),
])
