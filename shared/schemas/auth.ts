import { z } from 'zod'
import { EmailSchema, PasswordSchema, str, UuidSchema } from './common'

export const LoginSchema = z.object({
  email: EmailSchema,
  // No length rule here: a wrong password of any length is the same 401.
  password: str().min(1, { message: 'is required' }).max(256),
}).meta({ id: 'LoginRequest' })
export type LoginInput = z.infer<typeof LoginSchema>

export const ChangePasswordSchema = z.object({
  currentPassword: str().min(1, { message: 'is required' }).max(256),
  newPassword: PasswordSchema,
}).refine(v => v.currentPassword !== v.newPassword, { path: ['newPassword'], message: 'must differ from the current password' })
export type ChangePasswordInput = z.infer<typeof ChangePasswordSchema>

export const CreateUserSchema = z.object({
  email: EmailSchema,
  displayName: str().trim().min(1, { message: 'is required' }).max(120),
  password: PasswordSchema,
  isSiteAdmin: z.boolean().default(false),
})
export type CreateUserInput = z.infer<typeof CreateUserSchema>

export const TOKEN_DEFAULT_DAYS = 90
export const TOKEN_MAX_DAYS = 365
const DAY_MS = 24 * 60 * 60 * 1000

/**
 * A new API token: a name, an expiry (either a number of days, or the moment it stops
 * working; at most a year ahead; 90 days when neither is given) and whether it may only read.
 */
export const CreateTokenSchema = z.object({
  name: str().trim().min(1, { message: 'is required' }).max(80),
  expiresInDays: z.number().int({ message: 'must be a whole number of days' })
    .min(1, { message: 'must be at least 1 day' })
    .max(TOKEN_MAX_DAYS, { message: `must be at most ${TOKEN_MAX_DAYS} days (one year)` })
    .optional(),
  expiresAt: z.iso.datetime({ offset: true, message: 'must be a date and time (ISO 8601)' })
    .refine(v => Date.parse(v) > Date.now(), { message: 'must be in the future' })
    .refine(v => Date.parse(v) <= Date.now() + TOKEN_MAX_DAYS * DAY_MS, { message: `must be at most ${TOKEN_MAX_DAYS} days (one year) ahead` })
    .optional(),
  readOnly: z.boolean().default(false),
}).refine(v => v.expiresInDays === undefined || v.expiresAt === undefined, { path: ['expiresAt'], message: 'give either expiresInDays or expiresAt, not both' })
export type CreateTokenInput = z.infer<typeof CreateTokenSchema>

/** When a token created now with these choices stops working. */
export function tokenExpiry(input: Pick<CreateTokenInput, 'expiresInDays' | 'expiresAt'>, now = Date.now()): Date {
  if (input.expiresAt !== undefined) return new Date(input.expiresAt)
  return new Date(now + (input.expiresInDays ?? TOKEN_DEFAULT_DAYS) * DAY_MS)
}

/** What the client knows about the signed-in user. */
export interface SessionUser {
  id: string
  email: string
  displayName: string
  isSiteAdmin: boolean
}

/** Route params of one of the caller's API tokens. */
export const ApiTokenParamsSchema = z.object({ tokenId: UuidSchema })
