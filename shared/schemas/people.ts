import { z } from 'zod'
import { EmailSchema, INT32_MAX, PasswordSchema, str, UuidSchema } from './common'
import { RoleSchema } from './projects'

/** An owner invites someone by e-mail with a role (an existing account becomes a member at once). */
export const InviteSchema = z.object({
  email: EmailSchema,
  role: RoleSchema,
})
export type InviteInput = z.infer<typeof InviteSchema>

/** A site admin invites someone to the site (no project): they choose their own name and password. */
export const SiteInviteSchema = z.object({ email: EmailSchema })

export const InvitationParamsSchema = z.object({ projectId: UuidSchema, invitationId: UuidSchema })
export const SiteInvitationParamsSchema = z.object({ invitationId: UuidSchema })

/**
 * The one-time token of an e-mailed link (32 random bytes in base64url, 43 characters). Any
 * short text is looked up by its hash, so a mangled link gets the plain "not valid" answer.
 */
export const LinkTokenSchema = str(128).min(1, { message: 'is required' })
export const LinkTokenParamsSchema = z.object({ token: LinkTokenSchema })

export const DisplayNameSchema = str(120).trim().min(1, { message: 'is required' }).max(120)

/** The invitee's own name and password, set when they accept. */
export const AcceptInvitationSchema = z.object({
  displayName: DisplayNameSchema,
  password: PasswordSchema,
})
export type AcceptInvitationInput = z.infer<typeof AcceptInvitationSchema>

export const PasswordResetRequestSchema = z.object({ email: EmailSchema })
export const PasswordResetSchema = z.object({ password: PasswordSchema })

/** A site admin's change to an account: disable or enable it, grant or revoke site admin. */
export const AdminUserUpdateSchema = z.object({
  disabled: z.boolean().optional(),
  isSiteAdmin: z.boolean().optional(),
}).refine(v => v.disabled !== undefined || v.isSiteAdmin !== undefined, { message: 'nothing to change' })
export type AdminUserUpdateInput = z.infer<typeof AdminUserUpdateSchema>

export const AdminUserParamsSchema = z.object({ userId: UuidSchema })

export const AdminUsersQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(100),
  offset: z.coerce.number().int().min(0).max(INT32_MAX).default(0),
  q: str(120).trim().max(120).optional(),
})
