import { z } from 'zod'
import { EmailSchema, PasswordSchema, str } from './common'

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

export const CreateTokenSchema = z.object({
  name: str().trim().min(1, { message: 'is required' }).max(80),
})

/** What the client knows about the signed-in user. */
export interface SessionUser {
  id: string
  email: string
  displayName: string
  isSiteAdmin: boolean
}
