import { z } from 'zod'
import { SiteModelDefinitionSchema } from '../site-model/definition'
import { int, INT32_MAX, str, UuidSchema } from './common'

export const ModelParamsSchema = z.object({ projectId: UuidSchema, modelId: UuidSchema })
export const VersionParamsSchema = ModelParamsSchema.extend({ version: z.coerce.number().int().min(1).max(1_000_000) })

export const CreateModelSchema = z.object({
  name: str().trim().min(1, { message: 'is required' }).max(120),
  description: str().trim().max(2000).default(''),
  /** Start from a saved version of another (or the same) model; default: from the project's logs. */
  from: z.object({ modelId: UuidSchema, version: int(1) }).optional(),
})

export const SaveDraftSchema = z.object({
  draft: SiteModelDefinitionSchema,
  /** The draft revision the client read (409 when someone saved in between). */
  version: int(1),
})

export const SaveVersionSchema = z.object({
  message: str().trim().min(3, { message: 'say what changed (3 characters or more)' }).max(2000),
  version: int(1),
})

export const CompareQuerySchema = z.object({
  a: z.coerce.number().int().min(1).max(INT32_MAX),
  b: z.coerce.number().int().min(1).max(INT32_MAX),
})

export const ExportQuerySchema = z.object({
  format: z.enum(['json', 'xlsx']).default('json'),
  maxThickness: z.coerce.number().gt(0).max(5).default(0.25),
})

/** At most this many reviewers per submission. */
export const MAX_REVIEWERS = 20

/** Sends a saved version for review to one or more project members who may review. */
export const SubmitVersionSchema = z.object({
  message: str(2000).trim().default(''),
  reviewerIds: z.array(UuidSchema).min(1, { message: 'choose at least one reviewer' }).max(MAX_REVIEWERS, { message: `at most ${MAX_REVIEWERS} reviewers` }),
})

/**
 * A reviewer's decision on a submitted version. Returning it needs a comment saying why;
 * `override` is the reason for approving while open flags stand on points its fits use.
 */
export const VersionDecisionSchema = z.object({
  decision: z.enum(['approve', 'return']),
  comment: str(2000).trim().default(''),
  override: str(2000).trim().min(3, { message: 'give the reason for approving despite the open flags (3 characters or more)' }).optional(),
}).superRefine((b, ctx) => {
  if (b.decision === 'return' && b.comment.length < 3) {
    ctx.addIssue({ code: 'custom', path: ['comment'], message: 'say why it is returned (3 characters or more)' })
  }
})
