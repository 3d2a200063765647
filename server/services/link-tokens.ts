import { randomBytes } from 'node:crypto'
import { hashToken } from './api-tokens'

/**
 * The secret of an e-mailed one-time link (invitation, password reset): 32 random bytes in
 * base64url (43 characters). Only its SHA-256 is stored; the token itself goes into the one
 * e-mail and nowhere else.
 */
export function newLinkToken(): { token: string, hash: string } {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashToken(token) }
}

export { hashToken as hashLinkToken }

/** Why a one-time link no longer works, or null while it does. */
export type LinkState = 'used' | 'revoked' | 'expired' | null

export function linkState(row: { expiresAt: Date, usedAt?: Date | null, acceptedAt?: Date | null, revokedAt?: Date | null }, now = new Date()): LinkState {
  if (row.usedAt || row.acceptedAt) return 'used'
  if (row.revokedAt) return 'revoked'
  if (row.expiresAt.getTime() <= now.getTime()) return 'expired'
  return null
}

/** 410 Gone with the plain reason (`data.state` for the page), for a link that worked once but no longer does. */
export function goneLink(state: Exclude<LinkState, null>, messages: Record<Exclude<LinkState, null>, string>) {
  return createError({ statusCode: 410, statusMessage: 'Gone', message: messages[state], data: { state } })
}

export function unknownLink(message: string) {
  return createError({ statusCode: 404, statusMessage: 'Not Found', message, data: { state: 'not-found' } })
}

/** The row a link's token found, once it still works; else the 404 (no such link) or the 410 that says why it no longer does. */
export function workingLink<T extends Parameters<typeof linkState>[0]>(row: T | undefined, unknown: string, gone: Record<Exclude<LinkState, null>, string>): T {
  if (!row) throw unknownLink(unknown)
  const state = linkState(row)
  if (state) throw goneLink(state, gone)
  return row
}
