import { index, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { createdAt, moment, ownedRow, rowKey } from './columns'
import { projectRole, projects } from './projects'
import { namedUser, users } from './users'

/**
 * An invitation by e-mail: to a project with a role, or (project null) to the site from the
 * people page. Only the SHA-256 of the link's token is stored; single use; revocable.
 */
export const invitations = pgTable('invitations', {
  id: rowKey(),
  projectId: uuid().references(() => projects.id, { onDelete: 'cascade' }),
  email: text().notNull(),
  role: projectRole(),
  tokenHash: text().notNull(),
  invitedBy: namedUser(),
  expiresAt: moment().notNull(),
  acceptedAt: moment(),
  acceptedBy: namedUser(),
  revokedAt: moment(),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('invitations_token_idx').on(t.tokenHash),
  index('invitations_project_idx').on(t.projectId, t.createdAt),
])

/** A password-reset link: only the token's SHA-256 is stored; one hour, single use. */
export const passwordResets = pgTable('password_resets', {
  ...ownedRow('userId', () => users.id),
  tokenHash: text().notNull(),
  expiresAt: moment().notNull(),
  usedAt: moment(),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('password_resets_token_idx').on(t.tokenHash),
  index('password_resets_user_idx').on(t.userId),
])
