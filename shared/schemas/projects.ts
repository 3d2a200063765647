import { z } from 'zod'
import { PROJECT_ROLES, UNIT_SYSTEMS } from '../auth/roles'
import { EmailSchema, UuidSchema } from './common'

export const JobNumberSchema = z.string().trim()
  .min(2, { message: 'must be at least 2 characters' })
  .max(32, { message: 'must be at most 32 characters' })
  .regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, { message: 'may use letters, digits and . _ / - only' })

export const CreateProjectSchema = z.object({
  jobNumber: JobNumberSchema,
  name: z.string().trim().min(1, { message: 'is required' }).max(160),
  client: z.string().trim().max(160).default(''),
  unitSystem: z.enum(UNIT_SYSTEMS).default('SI'),
  description: z.string().trim().max(4000).default(''),
})
export type CreateProjectInput = z.infer<typeof CreateProjectSchema>

export const UpdateProjectSchema = CreateProjectSchema.partial().refine(v => Object.keys(v).length > 0, { message: 'nothing to change' })

export const RoleSchema = z.enum(PROJECT_ROLES)

export const AddMemberSchema = z.object({
  email: EmailSchema,
  role: RoleSchema,
})

export const UpdateMemberSchema = z.object({ role: RoleSchema })

export const MemberParamsSchema = z.object({ projectId: UuidSchema, userId: UuidSchema })
