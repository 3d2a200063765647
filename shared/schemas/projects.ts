import { z } from 'zod'
import { PROJECT_ROLES, UNIT_SYSTEMS } from '../auth/roles'
import { US_STRESS_UNITS } from '../units'
import { EmailSchema, str, UuidSchema } from './common'

export const JobNumberSchema = str().trim()
  .min(2, { message: 'must be at least 2 characters' })
  .max(32, { message: 'must be at most 32 characters' })
  .regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, { message: 'may use letters, digits and . _ / - only' })

export const CreateProjectSchema = z.object({
  jobNumber: JobNumberSchema,
  name: str().trim().min(1, { message: 'is required' }).max(160),
  client: str().trim().max(160).default(''),
  unitSystem: z.enum(UNIT_SYSTEMS).default('SI'),
  /** How a US project shows stresses: psf or tsf (SI projects keep it for a later switch). */
  usStressUnit: z.enum(US_STRESS_UNITS).default('psf'),
  description: str().trim().max(4000).default(''),
})
export type CreateProjectInput = z.infer<typeof CreateProjectSchema>

// No defaults here: a field left out of a PATCH stays as it is.
export const UpdateProjectSchema = z.object({
  jobNumber: JobNumberSchema.optional(),
  name: str().trim().min(1, { message: 'is required' }).max(160).optional(),
  client: str().trim().max(160).optional(),
  unitSystem: z.enum(UNIT_SYSTEMS).optional(),
  usStressUnit: z.enum(US_STRESS_UNITS).optional(),
  description: str().trim().max(4000).optional(),
  /** The project's design model (owner or engineer): its version in force feeds every page's σ'v0. */
  designModelId: UuidSchema.optional(),
}).refine(v => Object.values(v).some(x => x !== undefined), { message: 'nothing to change' })

export const RoleSchema = z.enum(PROJECT_ROLES)

export const AddMemberSchema = z.object({
  email: EmailSchema,
  role: RoleSchema,
})

export const UpdateMemberSchema = z.object({ role: RoleSchema })

export const MemberParamsSchema = z.object({ projectId: UuidSchema, userId: UuidSchema })
