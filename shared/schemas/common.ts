import { z } from 'zod'

/** Route params and paging shared by many routes. */
export const UuidSchema = z.uuid({ message: 'must be a valid id' })

export const ProjectParamsSchema = z.object({ projectId: UuidSchema })

export const PageQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(100).default(50),
  offset: z.coerce.number().int().min(0).default(0),
})

export const EmailSchema = z.email({ message: 'must be an e-mail address' })
  .max(254)
  .transform(v => v.trim().toLowerCase())

export const PasswordSchema = z.string()
  .min(12, { message: 'must be at least 12 characters' })
  .max(256, { message: 'must be at most 256 characters' })
