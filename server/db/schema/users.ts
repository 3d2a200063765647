import { sql } from 'drizzle-orm'
import { boolean, check, index, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { timestamps } from './columns'

export const users = pgTable('users', {
  id: uuid().primaryKey().defaultRandom(),
  email: text().notNull(),
  displayName: text().notNull(),
  passwordHash: text().notNull(),
  isSiteAdmin: boolean().notNull().default(false),
  ...timestamps,
}, t => [
  // E-mail is unique regardless of case: "Ana@x" and "ana@x" are one account.
  uniqueIndex('users_email_lower_idx').on(sql`lower(${t.email})`),
])

/** Lucia v3 sessions (see server/utils/auth.ts); the id is the SHA-256 of the cookie's token, never the token. */
export const sessions = pgTable('sessions', {
  id: text().primaryKey(),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  expiresAt: timestamp({ withTimezone: true, mode: 'date' }).notNull(),
}, t => [
  index('sessions_user_idx').on(t.userId),
  check('sessions_id_is_sha256', sql`${t.id} ~ '^[0-9a-f]{64}$'`),
])

/** Personal API tokens for scripts: only a SHA-256 hash is stored; the token is shown once. */
export const apiTokens = pgTable('api_tokens', {
  id: uuid().primaryKey().defaultRandom(),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  tokenHash: text().notNull(),
  prefix: text().notNull(),
  lastUsedAt: timestamp({ withTimezone: true, mode: 'date' }),
  revokedAt: timestamp({ withTimezone: true, mode: 'date' }),
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [
  uniqueIndex('api_tokens_hash_idx').on(t.tokenHash),
  index('api_tokens_user_idx').on(t.userId),
])

/** Failed sign-in attempts, kept for the rate limit (15-minute window). */
export const loginAttempts = pgTable('login_attempts', {
  id: uuid().primaryKey().defaultRandom(),
  email: text().notNull(),
  ip: text().notNull(),
  attemptedAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [
  index('login_attempts_email_idx').on(t.email, t.attemptedAt),
  index('login_attempts_ip_idx').on(t.ip, t.attemptedAt),
])
