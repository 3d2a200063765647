import { sql } from 'drizzle-orm'
import { boolean, check, index, integer, pgTable, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { createdAt, moment, ownedRow, rowKey, timestamps } from './columns'

/**
 * A person named on a record (its author, uploader, decider, recipient…): set to null when their account is
 * deleted, and the record stays.
 */
export function namedUser() {
  return uuid().references(() => users.id, { onDelete: 'set null' })
}

export const users = pgTable('users', {
  id: rowKey(),
  email: text().notNull(),
  displayName: text().notNull(),
  passwordHash: text().notNull(),
  isSiteAdmin: boolean().notNull().default(false),
  /** A disabled account cannot sign in; its sessions and tokens stop at once. */
  disabledAt: moment(),
  ...timestamps,
}, t => [
  // E-mail is unique regardless of case: "Ana@x" and "ana@x" are one account.
  uniqueIndex('users_email_lower_idx').on(sql`lower(${t.email})`),
])

/** Lucia v3 sessions (see server/utils/auth.ts); the id is the SHA-256 of the cookie's token, never the token. */
export const sessions = pgTable('sessions', {
  id: text().primaryKey(),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: moment().notNull(),
}, t => [
  index('sessions_user_idx').on(t.userId),
  check('sessions_id_is_sha256', sql`${t.id} ~ '^[0-9a-f]{64}$'`),
])

export const API_TOKEN_SCOPES = ['read-write', 'read-only'] as const

/**
 * Personal API tokens for scripts: only a SHA-256 hash is stored; the token is shown once.
 * Every token expires (at most a year after creation); tokens that existed before expiry
 * was introduced got 90 days from the day the migration ran (the column default).
 */
export const apiTokens = pgTable('api_tokens', {
  ...ownedRow('userId', () => users.id),
  name: text().notNull(),
  tokenHash: text().notNull(),
  prefix: text().notNull(),
  scope: text({ enum: API_TOKEN_SCOPES }).notNull().default('read-write'),
  expiresAt: moment().notNull().default(sql`now() + interval '90 days'`),
  lastUsedAt: moment(),
  revokedAt: moment(),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('api_tokens_hash_idx').on(t.tokenHash),
  index('api_tokens_user_idx').on(t.userId),
  check('api_tokens_scope_known', sql`${t.scope} in ('read-write', 'read-only')`),
])

/**
 * Sign-in attempt counters for the throttle (server/services/login-throttle.ts): one row per
 * (e-mail, IP) pair and one per IP, each counting the attempts of its current 15-minute window.
 */
export const loginThrottle = pgTable('login_throttle', {
  key: text().primaryKey(),
  attempts: integer().notNull(),
  windowStart: moment().notNull().defaultNow(),
}, t => [index('login_throttle_window_idx').on(t.windowStart)])
