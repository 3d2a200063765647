import { z } from 'zod'
import { OEDOMETER_TEST_TYPES } from '../investigation/types'
import type { PreconsolidationSource } from '../lab/sources'
import { STAGE_CONVENTIONS } from '../lab/stages'
import { SiteModelDefinitionSchema } from '../site-model/definition'
import { int, INT32_MAX, str, UuidSchema } from './common'

/**
 * Shapes of the laboratory API: oedometer tests on samples, σ'p adoptions, and
 * the σ'p points list. Shared by the forms and the routes. Laboratory units:
 * specimen height in mm, water content in %, stresses in kPa, times in minutes.
 */

/** How an adopted σ'p was obtained: one of the engine's constructions, a marker dragged on the plot, or a typed value. */
export const ADOPTION_METHODS = ['casagrande', 'pachecoSilva', 'work', 'bilinear', 'dragged', 'typed'] as const
export type AdoptionMethod = (typeof ADOPTION_METHODS)[number]

export const ADOPTION_METHOD_LABELS: Record<AdoptionMethod, string> = {
  casagrande: 'Casagrande',
  pachecoSilva: 'Pacheco Silva',
  work: 'Work (strain energy)',
  bilinear: 'Bilinear log(1+e)',
  dragged: 'Marker on the plot',
  typed: 'Typed value',
}

const text = (max = 2000) => str().trim().max(max)

export const TimeReadingSchema = z.object({
  minutes: z.number({ error: 'time must be a number' }).min(0, { message: 'time must be 0 min or later' }).max(1_000_000),
  dial: z.number({ error: 'gauge reading must be a number' }).min(-1000).max(1000),
})

export const StageInputSchema = z.object({
  stress: z.number({ error: 'σ\' must be a number' }).positive({ message: 'σ\' must be above 0 kPa' }).max(100_000, { message: 'σ\' must be at most 100 000 kPa' }),
  value: z.number({ error: 'must be a number' }).min(-1000, { message: 'must be at least −1000' }).max(1000, { message: 'must be at most 1000' }),
  readings: z.array(TimeReadingSchema).max(400).optional(),
})

const specimen = {
  label: str().trim().min(1, { message: 'is required' }).max(80),
  testType: z.enum(OEDOMETER_TEST_TYPES),
  specimenHeight: z.number({ error: 'must be a number' }).min(2, { message: 'must be at least 2 mm' }).max(200, { message: 'must be at most 200 mm' }),
  initialWaterContent: z.number({ error: 'must be a number' }).gt(0, { message: 'must be above 0 %' }).max(1500).nullable(),
  specificGravity: z.number({ error: 'must be a number' }).min(1.2, { message: 'must be at least 1.2' }).max(3.5, { message: 'must be at most 3.5' }).nullable(),
  /** null: computed as Gs·w/100 (a saturated specimen). */
  e0: z.number({ error: 'must be a number' }).gt(0, { message: 'must be above 0' }).max(30).nullable(),
  convention: z.enum(STAGE_CONVENTIONS),
  stages: z.array(StageInputSchema).min(1, { message: 'needs at least one stage' }).max(300),
  remarks: text(),
}

function hasE0Basis(t: { e0?: number | null, specificGravity?: number | null, initialWaterContent?: number | null }): boolean {
  return (t.e0 !== null && t.e0 !== undefined) || (t.specificGravity !== null && t.specificGravity !== undefined && t.initialWaterContent !== null && t.initialWaterContent !== undefined)
}

export const OedometerTestInputSchema = z.object({
  sampleId: UuidSchema,
  label: specimen.label,
  testType: specimen.testType.default('incremental'),
  specimenHeight: specimen.specimenHeight,
  initialWaterContent: specimen.initialWaterContent.default(null),
  specificGravity: specimen.specificGravity.default(null),
  e0: specimen.e0.default(null),
  convention: specimen.convention,
  stages: specimen.stages,
  remarks: specimen.remarks.default(''),
}).refine(hasE0Basis, { path: ['e0'], message: 'give e0, or Gs and the water content to compute it' })
export type OedometerTestInput = z.infer<typeof OedometerTestInputSchema>

/**
 * A change to a test. Changing the convention needs the stages in the new convention; `e0: null`
 * recomputes e0 from Gs·w. A change to the curve (stages, e0, convention, specimen height)
 * withdraws the adopted σ'p, which was read from the old curve.
 */
export const OedometerTestUpdateSchema = z.object({
  label: specimen.label.optional(),
  testType: specimen.testType.optional(),
  specimenHeight: specimen.specimenHeight.optional(),
  initialWaterContent: specimen.initialWaterContent.optional(),
  specificGravity: specimen.specificGravity.optional(),
  e0: specimen.e0.optional(),
  convention: specimen.convention.optional(),
  stages: specimen.stages.optional(),
  remarks: specimen.remarks.optional(),
  version: int(1),
}).refine(t => t.convention === undefined || t.stages !== undefined, { path: ['stages'], message: 'changing the convention needs the stages in the new convention' })
export type OedometerTestUpdate = z.infer<typeof OedometerTestUpdateSchema>

export const AdoptionInputSchema = z.object({
  method: z.enum(ADOPTION_METHODS),
  value: z.number({ error: 'σ\'p must be a number' }).positive({ message: 'σ\'p must be above 0 kPa' }).max(100_000),
  reason: str(1000, 'a reason is required').trim().min(3, { message: 'a reason of at least 3 characters is required' }).max(1000),
})
export type AdoptionInput = z.infer<typeof AdoptionInputSchema>

export const OedometerTestParamsSchema = z.object({ projectId: UuidSchema, testId: UuidSchema })

export const OedometerListQuerySchema = z.object({
  pointId: UuidSchema.optional(),
  limit: z.coerce.number().int().min(1).max(500).default(200),
  offset: z.coerce.number().int().min(0).max(INT32_MAX).default(0),
})

const flag = z.enum(['0', '1', 'true', 'false']).optional().transform(v => v === '1' || v === 'true')

/** Resampling of CPT σ'p: window height in m (median per window). */
const spacing = z.coerce.number({ error: 'spacing must be a number of metres' }).min(0.02, { message: 'spacing must be at least 0.02 m' }).max(5, { message: 'spacing must be at most 5 m' }).default(0.25)

export const PreconsolidationPointsQuerySchema = z.object({
  spacing,
  /** Also every CPT row as compact arrays, for the canvas's dense layer. */
  dense: flag,
})

/**
 * The same points through a stress model sent in the body: the canvas's working
 * copy (unsaved edits included) or a saved version being viewed, so CPT σ'p
 * follow the σv on screen rather than the project's latest saved draft.
 */
export const PreconsolidationPointsEvaluateSchema = z.object({
  definition: SiteModelDefinitionSchema,
  spacing,
  dense: z.boolean().default(false),
  /** How the page names the model, for the answer's description ("Site model X, unsaved edits"). */
  label: str().trim().max(200).default('the stress model on screen'),
})

export const CptInterpretationQuerySchema = z.object({ spacing })

export { PRECONSOLIDATION_SOURCES, type PreconsolidationSource } from '../lab/sources'

/**
 * One σ'p point, whatever its source, as the σ'p points routes send it: `TDate`
 * is a Date on the server and the ISO string it becomes in JSON on the client.
 */
export interface PreconsolidationPoint<TDate = string> {
  /** Adoption id (oedometer), `cpt:<pointId>:<depth mm>` (CPT) or `vane:<readingId>` (vane). */
  id: string
  source: PreconsolidationSource
  /** Oedometer: the adoption's method. CPT: `k-qnet`. Vane: where the PI for μ came from (`pi-at-point`, `pi-of-stratum`, `uncorrected`). */
  method: string
  pointId: string
  pointIdentifier: string
  depth: number
  preconsolidation: number
  /** σ'v0 at that depth from the stress model used; null outside it. */
  effectiveStress: number | null
  stratumCode: string | null
  /** Sample quality class at adoption (oedometer only). */
  qualityClass: string | null
  adoptedBy: string | null
  adoptedAt: TDate | null
}
