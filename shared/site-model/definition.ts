import { z } from 'zod'

/**
 * A site model: the stress model of one site as the engineer built it — strata
 * bands top-down with unit weights, groundwater and piezometric profile, surface
 * pressure, per-stratum σ'p trends with the points used and excluded, and
 * adopted compressibility. Stored as the draft of a model and as immutable
 * versions; `schemaVersion` lets later releases read older snapshots.
 * docs/site-model-schema.md describes it for other tools.
 */
export const SITE_MODEL_SCHEMA_VERSION = 1

export const TrendModelSchema = z.enum(['constant', 'linear', 'pop', 'ocr', 'crust'])

export const StratumTrendSchema = z.object({
  model: TrendModelSchema,
  crustBelow: z.enum(['constant', 'linear', 'pop', 'ocr']).optional(),
  logSpace: z.boolean().default(false),
  parameters: z.record(z.string(), z.number()),
  n: z.number().int().min(0),
  r2: z.number().nullable(),
  rmse: z.number().nullable(),
  aic: z.number().nullable(),
  aicc: z.number().nullable(),
  /** σ'p point ids fitted and left out (by the engineer or by reviewer flags). */
  includedPointIds: z.array(z.string()).max(200_000),
  excludedPointIds: z.array(z.string()).max(200_000),
  /** A hand-drawn trend instead of a fit: knots (depth, σ'p), with the reason required. */
  manual: z.object({
    knots: z.array(z.object({ depth: z.number(), preconsolidation: z.number() })).min(2).max(50),
    reason: z.string().trim().min(3, { message: 'a manual trend needs a reason' }).max(1000),
  }).optional(),
})
export type StratumTrend = z.infer<typeof StratumTrendSchema>

export const CompressibilitySchema = z.object({
  cc: z.number().min(0),
  cr: z.number().min(0),
  e0: z.number().gt(0),
  cv: z.number().gt(0).optional(),
  calpha: z.number().min(0).optional(),
  drainage: z.enum(['double', 'top', 'bottom']).default('double'),
  /** How the values were adopted: the mean of the stratum's tests, or typed. */
  source: z.enum(['mean', 'manual']).default('manual'),
  n: z.number().int().min(0).optional(),
})
export type Compressibility = z.infer<typeof CompressibilitySchema>

export const ModelStratumSchema = z.object({
  code: z.string().min(1).max(16),
  name: z.string().min(1).max(120),
  thickness: z.number().gt(0, { message: 'must be thicker than 0 m' }).max(500),
  unitWeight: z.number().min(5).max(30),
  unitWeightSaturated: z.number().min(5).max(30),
  compressible: z.boolean(),
  compressibility: CompressibilitySchema.optional(),
  trend: StratumTrendSchema.optional(),
  /** CPT cone factor k in σ'p = k·qnet for this stratum (Mayne 1995; default 0.33). */
  cptFactor: z.number().gt(0).max(2).default(0.33),
})
export type ModelStratum = z.infer<typeof ModelStratumSchema>

export const SiteModelDefinitionSchema = z.object({
  schemaVersion: z.literal(SITE_MODEL_SCHEMA_VERSION),
  surcharge: z.number().min(0).max(10_000).default(0),
  gammaW: z.number().min(9).max(10.5).default(9.81),
  groundwater: z.object({
    waterTableDepth: z.number().min(0).max(500),
    piezometers: z.array(z.object({ depth: z.number().min(0).max(500), porePressure: z.number().min(-100).max(10_000) })).max(100).default([]),
  }),
  strata: z.array(ModelStratumSchema).min(1, { message: 'needs at least one stratum' }).max(50),
  /** Reviewer flags that were in force when the version was saved. */
  flagsInForce: z.array(z.object({ flagId: z.string(), targetType: z.string(), targetId: z.string(), verdict: z.string() })).max(10_000).default([]),
}).meta({ id: 'SiteModelDefinition' })
export type SiteModelDefinition = z.infer<typeof SiteModelDefinitionSchema>

/** Depth of each stratum's top and bottom, from the thicknesses. */
export function stratumBounds(def: Pick<SiteModelDefinition, 'strata'>): { top: number, bottom: number }[] {
  let top = 0
  return def.strata.map((s) => {
    const b = { top, bottom: top + s.thickness }
    top = b.bottom
    return b
  })
}
