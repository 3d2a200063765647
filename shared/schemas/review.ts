import { z } from 'zod'
import { FLAG_TARGETS, FLAG_VERDICTS } from '../review/flags'
import { int, INT32_MAX, str, UuidSchema } from './common'

export const FlagParamsSchema = z.object({ projectId: UuidSchema, flagId: UuidSchema })

export const CreateFlagSchema = z.object({
  targetType: z.enum(FLAG_TARGETS),
  /** Read strictly by the route (`parseFlagTarget`): a malformed one names nothing, 404 like an unknown one. */
  targetId: str().min(1).max(120),
  verdict: z.enum(FLAG_VERDICTS),
  comment: str().trim().min(3, { message: 'give the reason (3 characters or more)' }).max(4000),
})

export const UpdateFlagSchema = z.object({
  verdict: z.enum(FLAG_VERDICTS).optional(),
  comment: str().trim().min(3).max(4000).optional(),
  status: z.enum(['open', 'resolved']).optional(),
  version: int(1),
})

export const ReplySchema = z.object({ body: str().trim().min(1, { message: 'is empty' }).max(4000) })

export const FlagListQuerySchema = z.object({
  status: z.enum(['open', 'resolved']).optional(),
  targetType: z.enum(FLAG_TARGETS).optional(),
  verdict: z.enum(FLAG_VERDICTS).optional(),
  targetId: str().max(120).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(200),
  offset: z.coerce.number().int().min(0).max(INT32_MAX).default(0),
})
