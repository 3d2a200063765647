import { z } from 'zod'
import { HOLE_IMPORT_MODES } from '../imports/hole-plan'
import { IMPORT_TARGETS } from '../imports/targets'
import { int, str, UuidSchema } from './common'

export const ImportParamsSchema = z.object({ projectId: UuidSchema, importId: UuidSchema })

export const ImportPreviewQuerySchema = z.object({
  target: z.enum(IMPORT_TARGETS).optional(),
  sheet: str().max(120).optional(),
})

/**
 * Importing an uploaded AGS4 file; a dry run checks and answers the plan per hole without writing.
 * `mode` says what happens to holes already in the project (shared/imports/hole-plan.ts): skipped
 * (the default), merged, or made exactly as in the file.
 */
export const AgsCommitSchema = z.object({ dryRun: z.boolean().default(false), mode: z.enum(HOLE_IMPORT_MODES).default('add-new') })

/** What every tabular import's commit carries, whatever its target. */
const commitFields = {
  mapping: z.record(str().max(60), str().max(200)),
  sheet: str().max(120).optional(),
  /** Check everything and report, write nothing. */
  dryRun: z.boolean().default(false),
  /** Remember this mapping for the next file of this target. */
  saveMapping: z.boolean().default(true),
  /**
   * The unit of each numeric column, by field key (`{ finalDepth: 'ft', pressure: 'psf' }`); a field not named is
   * in SI (m, kPa, kN/m³). A unit not in `IMPORT_UNITS` for its field is a 422 naming the column.
   */
  units: z.record(str().max(60), str().max(20)).optional(),
}

/** A commit of an uploaded table into one target; a CPT sounding and an oedometer test's stages name what they belong to. */
export const ImportCommitSchema = z.discriminatedUnion('target', [
  z.object({ target: z.enum(['points', 'intervals', 'samples', 'index-tests', 'groundwater', 'vane']), ...commitFields }),
  /** CPT: the point the sounding belongs to, and its cone area ratio. */
  z.object({ target: z.literal('cpt'), ...commitFields, pointId: UuidSchema, areaRatio: z.number().gt(0).max(1) }),
  /** Oedometer stages: the test whose stages the file replaces, and the version of it the client read (stale: 409). */
  z.object({ target: z.literal('oedometer-stages'), ...commitFields, testId: UuidSchema, testVersion: int(1) }),
])
export type ImportCommit = z.infer<typeof ImportCommitSchema>
