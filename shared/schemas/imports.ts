import { z } from 'zod'
import { IMPORT_TARGETS } from '../imports/targets'
import { int, str, UuidSchema } from './common'

export const ImportParamsSchema = z.object({ projectId: UuidSchema, importId: UuidSchema })

export const ImportPreviewQuerySchema = z.object({
  target: z.enum(IMPORT_TARGETS).optional(),
  sheet: str().max(120).optional(),
})

/** Importing an uploaded AGS4 file whole; a dry run checks and reports without writing. */
export const AgsCommitSchema = z.object({ dryRun: z.boolean().default(false) })

export const ImportCommitSchema = z.object({
  target: z.enum(IMPORT_TARGETS),
  mapping: z.record(str().max(60), str().max(200)),
  sheet: str().max(120).optional(),
  /** CPT only: the point the sounding belongs to, and its cone area ratio. */
  pointId: UuidSchema.optional(),
  areaRatio: z.number().gt(0).max(1).optional(),
  /** Oedometer stages only: the test whose stages the file replaces, and the version of it the client read (stale: 409). */
  testId: UuidSchema.optional(),
  testVersion: int(1).optional(),
  /** Check everything and report, write nothing. */
  dryRun: z.boolean().default(false),
  /** Remember this mapping for the next file of this target. */
  saveMapping: z.boolean().default(true),
}).refine(v => v.target !== 'cpt' || (v.pointId && v.areaRatio), { path: ['pointId'], message: 'a CPT import needs the point and its cone area ratio' })
  .refine(v => v.target !== 'oedometer-stages' || (v.testId && v.testVersion), { path: ['testId'], message: 'an oedometer-stages import needs the test and the version of it you read' })
