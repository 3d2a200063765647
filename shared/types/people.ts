/**
 * Replies of the invitation, password-reset and people routes. `Server…` is what the
 * route returns, the plain name what the page reads. No reply ever carries a token or
 * its hash: the one link goes out by e-mail only.
 */
import type { ProjectRole } from '#shared/auth/roles'
import type { invitations, users } from '~~/server/db/schema'
import type { Serialize } from './serialize'

type InvitationRow = typeof invitations.$inferSelect
type UserRow = typeof users.$inferSelect

/** A pending invitation as the team panel and the people page list it. */
export type ServerPendingInvitation = Pick<InvitationRow, 'id' | 'email' | 'role' | 'expiresAt' | 'createdAt'> & { invitedByName: string | null }
export type PendingInvitation = Serialize<ServerPendingInvitation>

/** GET …/invitations */
export interface ServerInvitationList { invitations: ServerPendingInvitation[] }
export type InvitationList = Serialize<ServerInvitationList>

/** POST /api/projects/:projectId/invitations (201): either the account was added at once, or an invitation went out. */
export type ServerInviteReply
  = | { outcome: 'member-added', member: { userId: string, email: string, displayName: string, role: ProjectRole } }
    | { outcome: 'invited', invitation: ServerPendingInvitation }
export type InviteReply = Serialize<ServerInviteReply>

/** GET /api/invitations/:token — what the link is for (public; nothing secret). */
export interface ServerInvitationPreview {
  email: string
  role: ProjectRole | null
  project: { id: string, jobNumber: string, name: string } | null
  invitedByName: string | null
  expiresAt: Date
}
export type InvitationPreview = Serialize<ServerInvitationPreview>

/** POST /api/invitations/:token/accept (201): the new account, signed in; where to go next. */
export interface AcceptInvitationReply {
  user: { id: string, email: string, displayName: string, isSiteAdmin: boolean }
  projectId: string | null
  next: string
}

/** GET /api/auth/password-reset/:token */
export interface ServerPasswordResetPreview { expiresAt: Date }
export type PasswordResetPreview = Serialize<ServerPasswordResetPreview>

/** POST /api/auth/password-reset/:token: the password is set, every other session ended, and this browser signed in. */
export interface PasswordResetDoneReply {
  user: { id: string, email: string, displayName: string, isSiteAdmin: boolean }
  tokensRevoked: number
}

/** One account on the people page. */
export type ServerPersonRow = Pick<UserRow, 'id' | 'email' | 'displayName' | 'isSiteAdmin' | 'disabledAt' | 'createdAt'> & { projects: number }
export type PersonRow = Serialize<ServerPersonRow>

/** GET /api/admin/users */
export interface ServerPeopleList { users: ServerPersonRow[], total: number, limit: number, offset: number }
export type PeopleList = Serialize<ServerPeopleList>

/** PATCH /api/admin/users/:userId */
export interface ServerPersonReply { user: ServerPersonRow }
export type PersonReply = Serialize<ServerPersonReply>
