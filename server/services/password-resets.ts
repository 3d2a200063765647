import { setTimeout as sleep } from 'node:timers/promises'
import { and, count, eq, gt, isNull, sql } from 'drizzle-orm'
import type { PasswordResetDoneReply, ServerPasswordResetPreview } from '#shared/types/people'
import { type Database, type Tx, useDb } from '../db/client'
import { passwordResets, sessions, users } from '../db/schema'
import { hashPassword } from '../utils/password'
import { revokeAllTokens } from './api-tokens'
import { recordAudit } from './audit'
import { hashLinkToken, newLinkToken, unknownLink, workingLink } from './link-tokens'
import { sendAccountMail } from './notify'

/** How long a reset link works. */
export const RESET_MINUTES = 60
/** Unused links one account may have asked for within the hour; more requests send nothing. */
export const RESETS_PER_HOUR = 3
/**
 * Every request answers no sooner than this, whether the address has an account or not, so
 * the time taken does not tell (the lookup and the writes take a few milliseconds).
 */
const ANSWER_FLOOR_MS = 300

/** The one answer to every reset request, known address or not. */
export const RESET_REQUESTED_MESSAGE = 'If an account uses this address, a link to choose a new password is on its way. It works once, for one hour.'

const GONE = {
  used: 'This password-reset link has already been used. Ask for a new one if you still need it.',
  revoked: 'This password-reset link no longer works. Ask for a new one.',
  expired: 'This password-reset link has expired (links work for one hour). Ask for a new one.',
}
const UNKNOWN = 'This password-reset link is not valid. Check that the whole link was copied, or ask for a new one.'

/**
 * "Forgot password?": for an existing, enabled account a one-hour link goes out by e-mail; for
 * any other address nothing happens. The caller answers 202 with the same message either way.
 */
export async function requestPasswordReset(email: string): Promise<{ message: string }> {
  const started = Date.now()
  const db = useDb()
  const [user] = await db.select({ id: users.id, email: users.email, disabledAt: users.disabledAt })
    .from(users).where(sql`lower(${users.email}) = ${email}`).limit(1)
  if (user && !user.disabledAt) {
    await db.transaction(async (tx) => {
      // Serialises two requests for the same account, so the hourly bound holds.
      await tx.select({ id: users.id }).from(users).where(eq(users.id, user.id)).for('update')
      const [recent] = await tx.select({ n: count() }).from(passwordResets).where(and(
        eq(passwordResets.userId, user.id),
        isNull(passwordResets.usedAt),
        gt(passwordResets.createdAt, sql`now() - interval '1 hour'`),
      ))
      if ((recent?.n ?? 0) >= RESETS_PER_HOUR) return
      const { token, hash } = newLinkToken()
      const expiresAt = new Date(Date.now() + RESET_MINUTES * 60_000)
      const [row] = await tx.insert(passwordResets).values({ userId: user.id, tokenHash: hash, expiresAt }).returning({ id: passwordResets.id })
      await recordAudit({ actorId: user.id, action: 'password-reset', entity: 'user', entityId: user.id, after: { resetId: row?.id, expiresAt } }, tx)
      await sendAccountMail({
        kind: 'password-reset',
        to: user.email,
        userId: user.id,
        title: 'Choose a new Pastload password',
        body: `Someone (we hope you) asked to reset the password of your Pastload account. Open the link within one hour to choose a new one; it works once. If you did not ask, ignore this message: your password stays as it is.`,
        link: `/reset-password/${token}`,
      }, tx)
    })
  }
  const rest = ANSWER_FLOOR_MS - (Date.now() - started)
  if (rest > 0) await sleep(rest)
  return { message: RESET_REQUESTED_MESSAGE }
}

async function resetByToken(db: Database | Tx, token: string, lock: boolean) {
  const q = db.select().from(passwordResets).where(eq(passwordResets.tokenHash, hashLinkToken(token))).limit(1)
  const [row] = lock ? await q.for('update') : await q
  return workingLink(row, UNKNOWN, GONE)
}

/** Whether a reset link still works (the page asks before showing the form). */
export async function previewPasswordReset(token: string): Promise<ServerPasswordResetPreview> {
  const row = await resetByToken(useDb(), token, false)
  return { expiresAt: row.expiresAt }
}

const DISABLED = 'This account is disabled. Ask a site admin to enable it.'

/**
 * Sets the new password from a reset link: the link (and any other unused link of the account)
 * is marked used, every session of the account ends and every API token is revoked, in one
 * transaction. The caller then signs this browser in with a fresh session.
 */
export async function completePasswordReset(token: string, password: string): Promise<PasswordResetDoneReply> {
  const db = useDb()
  await resetByToken(db, token, false)
  // The slow hash before the transaction, so no lock is held while it runs.
  const passwordHash = await hashPassword(password)
  return db.transaction(async (tx) => {
    const reset = await resetByToken(tx, token, true)
    const [user] = await tx.select({ id: users.id, email: users.email, displayName: users.displayName, isSiteAdmin: users.isSiteAdmin, disabledAt: users.disabledAt })
      .from(users).where(eq(users.id, reset.userId)).for('update')
    if (!user) throw unknownLink(UNKNOWN)
    if (user.disabledAt) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: DISABLED })
    await tx.update(users).set({ passwordHash }).where(eq(users.id, user.id))
    await tx.update(passwordResets).set({ usedAt: new Date() }).where(and(eq(passwordResets.userId, user.id), isNull(passwordResets.usedAt)))
    await tx.delete(sessions).where(eq(sessions.userId, user.id))
    const tokensRevoked = await revokeAllTokens(tx, user.id)
    await recordAudit({ actorId: user.id, action: 'password-change', entity: 'user', entityId: user.id, after: { via: 'reset-link', tokensRevoked } }, tx)
    return { user: { id: user.id, email: user.email, displayName: user.displayName, isSiteAdmin: user.isSiteAdmin }, tokensRevoked }
  })
}
