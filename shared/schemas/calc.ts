import { z } from 'zod'
import { int, str } from './common'

/**
 * Request and response shapes of the public compute API (`/api/calc/*`), SI units.
 * These schemas are the contract: the routes validate with them, the OpenAPI
 * document is generated from them, and the engine's input types must accept
 * what they produce. Shape errors and values beyond their plausibility bounds
 * (CALC_LIMITS) are 400; physically impossible values inside them (a zero
 * thickness, e0 ≤ 0, σ'v0 ≤ 0 …) pass the shape check and are refused by the
 * engine with 422 and a plain message.
 */

/**
 * Plausibility bounds of the compute inputs (common practice for soft-ground work,
 * set generously: a value beyond is a unit slip or a typing error, not a soil).
 * They are shape checks (400). The physical limits inside them (a thickness or e0
 * of 0 or less, σ'p below 0, uplift) stay with the engine, which answers 422.
 */
export const CALC_LIMITS = {
  /** Depths, thicknesses and sublayer sizes, m: no log or profile goes deeper than 500 m. */
  length: 500,
  /** Pressures and stresses in the ground, kPa (10 MPa). */
  pressure: 10_000,
  /** Oedometer stage stresses, kPa (the laboratory API's own bound). */
  labStress: 100_000,
  /** Unit weights of soil, kN/m³. */
  unitWeight: [5, 30],
  /** Unit weight of water, kN/m³ (fresh to brackish and saline). */
  gammaW: [9, 10.5],
  /** Compression and recompression indexes. */
  cc: 10,
  cr: 5,
  /** Void ratios. */
  voidRatio: 15,
  /** Coefficient of consolidation, m²/year. */
  cv: 10_000,
  /** Secondary compression index Cα. */
  calpha: 1,
  /** OCR. */
  ocr: 100,
  /** Load dimensions, m, and plan offsets from the load centre, m. */
  loadSize: 10_000,
  offset: 100_000,
  /** Years (times of the time rate, design life). */
  years: 10_000,
} as const

interface Bounds { min?: number, max?: number, unit?: string }

/** A number with its description and plausibility bounds; each bound's message names it. */
function num(description: string, b: Bounds = {}) {
  const unit = b.unit ? ` ${b.unit}` : ''
  let n = z.number({ error: 'must be a number' })
  if (b.min !== undefined) n = n.min(b.min, { message: `must be at least ${b.min}${unit}` })
  if (b.max !== undefined) n = n.max(b.max, { message: `must be at most ${b.max}${unit}` })
  return n.describe(description)
}

const L = CALC_LIMITS
/**
 * A bound on the size only (−max to max): the sign, and any other physical limit
 * (thickness > 0, e0 > 0, σ'p > 0), is the engine's to refuse with 422.
 */
const magnitude = (max: number, unit?: string): Bounds => ({ min: -max, max, unit })
const depthM = magnitude(L.length, 'm')
const pressureKPa = magnitude(L.pressure, 'kPa')
const unitWeight = { min: L.unitWeight[0], max: L.unitWeight[1], unit: 'kN/m³' }

export const CalcLayerSchema = z.object({
  name: str(80).min(1, { message: 'is required' }).describe('Stratum name, echoed in results'),
  thickness: num('Layer thickness, m', magnitude(L.length, 'm')),
  unitWeight: num('Bulk unit weight above the water table, kN/m³', unitWeight),
  unitWeightSaturated: num('Saturated unit weight below the water table, kN/m³', unitWeight),
})

export const PiezometerSchema = z.object({
  depth: num('Depth of the control point, m', depthM),
  porePressure: num('Pore water pressure at that depth, kPa', pressureKPa),
})

export const GroundwaterSchema = z.object({
  waterTableDepth: num('Depth of the water table (u = 0), m', depthM),
  piezometers: z.array(PiezometerSchema).max(200).optional()
    .describe('Piezometric control points: u is linear between them and hydrostatic below the last'),
})

const profileBase = {
  surcharge: num('Uniform surface pressure already in place, kPa (default 0)', pressureKPa).optional(),
  gammaW: num('Unit weight of water, kN/m³ (default 9.81)', { min: L.gammaW[0], max: L.gammaW[1], unit: 'kN/m³' }).optional(),
  groundwater: GroundwaterSchema,
}

export const StressProfileRequestSchema = z.object({
  ...profileBase,
  layers: z.array(CalcLayerSchema).min(1, { message: 'needs at least one layer' }).max(200),
  depths: z.array(num('m', depthM)).max(20_000).optional().describe('Extra depths (m) to report besides the breakpoints'),
}).meta({ id: 'StressProfileRequest' })
export type StressProfileRequest = z.infer<typeof StressProfileRequestSchema>

export const StressPointSchema = z.object({
  depth: z.number(),
  layer: z.string(),
  totalStress: z.number().describe('σv, kPa'),
  porePressure: z.number().describe('u, kPa'),
  effectiveStress: z.number().describe("σ'v0, kPa"),
})

export const StressProfileResponseSchema = z.object({
  points: z.array(StressPointSchema),
  warnings: z.array(z.string()),
}).meta({ id: 'StressProfileResponse' })

export const PreconsolidationModelSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('ocr'), value: num('OCR = σ\'p / σ\'v0', magnitude(L.ocr)) }),
  z.object({ type: z.literal('pop'), value: num('POP = σ\'p − σ\'v0, kPa', pressureKPa) }),
  z.object({ type: z.literal('constant'), value: num('σ\'p, kPa', pressureKPa) }),
  z.object({ type: z.literal('linear'), top: num('σ\'p at the layer top, kPa', pressureKPa), bottom: num('σ\'p at the layer bottom, kPa', pressureKPa) }),
])

export const DrainageSchema = z.enum(['double', 'top', 'bottom'])

export const SettlementLayerSchema = CalcLayerSchema.extend({
  compressible: z.boolean(),
  cc: num('Compression index Cc', magnitude(L.cc)).optional(),
  cr: num('Recompression index Cr', magnitude(L.cr)).optional(),
  e0: num('Initial void ratio e0', magnitude(L.voidRatio)).optional(),
  preconsolidation: PreconsolidationModelSchema.optional(),
  cv: num('Coefficient of consolidation, m²/year', magnitude(L.cv, 'm²/year')).optional(),
  drainage: DrainageSchema.optional().describe('Drained faces of the layer (default double)'),
  calpha: num('Secondary compression index Cα', magnitude(L.calpha)).optional(),
  drainageGroup: str(80).min(1).optional().describe('Consecutive layers with the same group consolidate as one layer of their combined thickness (the group\'s drainage, thickness-weighted harmonic mean of cv): give the slices of one stratum the same group'),
}).superRefine((layer, ctx) => {
  if (!layer.compressible) return
  for (const key of ['cc', 'cr', 'e0', 'preconsolidation'] as const) {
    if (layer[key] === undefined) ctx.addIssue({ code: 'custom', path: [key], message: 'is required for a compressible layer' })
  }
})

const offsetM = magnitude(L.offset, 'm')
const loadSize = magnitude(L.loadSize, 'm')
const at2 = z.object({ x: num('m', offsetM), y: num('m', offsetM) }).describe('Plan point measured from the load centre, m')

export const LoadSchema = z.discriminatedUnion('type', [
  z.object({ type: z.literal('uniform'), pressure: num('kPa', pressureKPa) }),
  z.object({ type: z.literal('rectangle'), width: num('Along x, m', loadSize), length: num('Along y, m', loadSize), pressure: num('kPa', pressureKPa), at: at2.optional() }),
  z.object({ type: z.literal('circle'), radius: num('m', loadSize), pressure: num('kPa', pressureKPa), at: at2.optional() }),
  z.object({ type: z.literal('strip'), width: num('m', loadSize), pressure: num('kPa', pressureKPa), at: z.object({ x: num('m', offsetM) }).optional() }),
])

export const SublayerOptionsSchema = z.union([
  z.object({ maxThickness: z.number().positive({ message: 'must be positive' }).max(L.length, { message: `must be at most ${L.length} m` }) }),
  z.object({ count: int(1, 10_000) }),
])

/** Most layers one settlement request may carry. */
export const MAX_SETTLEMENT_LAYERS = 200

/**
 * Bounds of the probabilistic block: realisations 100 – 100 000 (those above `inline` are refused
 * with 413 and a pointer to settlement runs, as are more than `inlineWork` realisations × sublayers),
 * a COV of at most 2 (common practice: soil parameters
 * scatter with COVs well below 1; more is a typing error), at most 50 named layers.
 */
export const PROBABILISTIC_LIMITS = { realizations: [100, 100_000], inline: 20_000, cov: 2, layers: 50, seed: 2_147_483_647, inlineWork: 40_000_000 } as const
export const PROBABILISTIC_DEFAULTS = { realizations: 5000, seed: 1, ccE0Correlation: 0.5 } as const

const CovSchema = z.object({
  cov: num('Coefficient of variation (sd / mean) of the lognormal parameter, about the layer\'s value as its mean', { min: 0, max: PROBABILISTIC_LIMITS.cov }),
})

export const ProbabilisticLayerSchema = z.object({
  cc: CovSchema.optional(),
  cr: CovSchema.optional(),
  e0: CovSchema.optional(),
  cv: CovSchema.optional(),
  preconsolidation: CovSchema.optional().describe("Scales σ'p of the layer's model lognormally (one factor per realisation)"),
}).strict()

export const ProbabilisticRequestSchema = z.object({
  realizations: int(PROBABILISTIC_LIMITS.realizations[0], PROBABILISTIC_LIMITS.realizations[1]).optional()
    .describe(`Realisations (default ${PROBABILISTIC_DEFAULTS.realizations}); above ${PROBABILISTIC_LIMITS.inline} the answer is 413: use a settlement run`),
  seed: int(0, PROBABILISTIC_LIMITS.seed).optional().describe(`Seed of the random numbers (default ${PROBABILISTIC_DEFAULTS.seed}): the same inputs and seed give the same numbers`),
  layers: z.record(str(80).min(1), ProbabilisticLayerSchema)
    .refine(r => Object.keys(r).length <= PROBABILISTIC_LIMITS.layers, { message: `must name at most ${PROBABILISTIC_LIMITS.layers} layers` })
    .describe('Variation per layer name (layers with the same name share their draws); layers not named do not vary'),
  ccE0Correlation: num('Correlation of Cc and e0 within a layer (default 0.5, common practice)', { min: -1, max: 1 }).optional(),
  limit: num('Settlement limit, m: the answer gives the probability of exceeding it', { min: 0, max: L.length, unit: 'm' }).optional(),
}).strict()
export type ProbabilisticRequest = z.infer<typeof ProbabilisticRequestSchema>

export const SettlementRequestSchema = z.object({
  ...profileBase,
  layers: z.array(SettlementLayerSchema).min(1, { message: 'needs at least one layer' }).max(MAX_SETTLEMENT_LAYERS),
  load: LoadSchema,
  sublayers: SublayerOptionsSchema.optional().describe('Default { maxThickness: 0.25 }'),
  time: z.object({ years: z.array(num('years', { min: 0, max: L.years, unit: 'years' })).min(1).max(1000) }).optional(),
  designLife: z.number().positive().max(L.years, { message: `must be at most ${L.years} years` }).optional().describe('Years after loading for secondary compression'),
  probabilistic: ProbabilisticRequestSchema.optional().describe('Monte Carlo settlement: lognormal Cc, Cr, e0, cv and σ\'p per layer'),
}).meta({ id: 'SettlementRequest' })
export type SettlementRequest = z.infer<typeof SettlementRequestSchema>

/**
 * Query of `POST /api/calc/settlement`: `sublayers=false` (or 0) leaves the sublayer rows out of
 * the answer (totals, layers, time rate and secondary are unchanged); default true.
 */
export const SettlementQuerySchema = z.object({
  sublayers: z.enum(['0', '1', 'true', 'false']).optional().transform(v => v !== '0' && v !== 'false')
    .describe('false (or 0) leaves the sublayer rows out of the answer; default true'),
})

export const SublayerRowSchema = z.object({
  layer: z.string(),
  top: z.number(),
  bottom: z.number(),
  depth: z.number(),
  thickness: z.number(),
  effectiveStress: z.number(),
  stressIncrease: z.number(),
  finalEffectiveStress: z.number(),
  preconsolidation: z.number(),
  finalPreconsolidation: z.number(),
  case: z.enum(['NC', 'OC', 'OC-NC']),
  voidRatioChange: z.number(),
  strain: z.number(),
  compression: z.number().describe('m'),
})

const QuantilesSchema = z.object({ p05: z.number(), p10: z.number(), p50: z.number(), p90: z.number(), p95: z.number() })

export const ProbabilisticResponseSchema = z.object({
  realizations: z.number().int(),
  seed: z.number().int(),
  mean: z.number().describe('m'),
  sd: z.number().describe('Sample standard deviation, m'),
  quantiles: QuantilesSchema.describe('Percentiles of final primary settlement, m (linear between order statistics)'),
  histogram: z.object({ edges: z.array(z.number()), counts: z.array(z.number().int()) }).describe('Equal bins from the least to the greatest settlement, m'),
  exceedance: z.object({ limit: z.number(), probability: z.number() }).optional(),
  t90: z.object({ mean: z.number(), sd: z.number(), quantiles: QuantilesSchema }).optional().describe('Years to 90 % of primary settlement, when every compressible layer has cv'),
  sensitivity: z.array(z.object({ layer: z.string(), variable: z.enum(['cc', 'cr', 'e0', 'cv', 'preconsolidation']), rankCorrelation: z.number() }))
    .describe('Spearman rank correlation of each varying parameter with the settlement, largest first'),
  warnings: z.array(z.string()),
}).meta({ id: 'ProbabilisticSettlement' })

export const SettlementResponseSchema = z.object({
  settlement: z.number().describe('Total primary consolidation settlement, m'),
  convergence: z.object({ halved: z.number(), relativeChange: z.number() }).nullable().describe('Total with every sublayer halved, and the relative change'),
  sublayers: z.array(SublayerRowSchema).optional().describe('Absent when the query asks sublayers=false'),
  layers: z.array(z.object({ name: z.string(), settlement: z.number() })),
  time: z.array(z.object({ years: z.number(), degree: z.number(), settlement: z.number() })).optional(),
  times: z.object({ t50: z.number(), t90: z.number() }).optional(),
  secondary: z.object({
    designLife: z.number(),
    settlement: z.number(),
    layers: z.array(z.object({ name: z.string(), endOfPrimary: z.number(), settlement: z.number() })),
  }).optional(),
  warnings: z.array(z.string()),
  probabilistic: ProbabilisticResponseSchema.optional().describe('Present when the request asks for it'),
  caution: z.string(),
}).meta({ id: 'SettlementResponse' })

export const OEDOMETER_METHOD_NAMES = ['casagrande', 'pachecoSilva', 'work', 'bilinear'] as const

export const PreconsolidationRequestSchema = z.object({
  points: z.array(z.object({ stress: num("σ', kPa", magnitude(L.labStress, 'kPa')), voidRatio: num('e', magnitude(L.voidRatio)) })).min(1).max(500),
  e0: num('Initial void ratio', magnitude(L.voidRatio)).optional(),
  insituStress: num("In-situ σ'v0 of the sample, kPa (for sample quality)", pressureKPa).optional(),
  methods: z.array(z.enum(OEDOMETER_METHOD_NAMES)).min(1).max(4).optional(),
}).meta({ id: 'PreconsolidationRequest' })
export type PreconsolidationRequest = z.infer<typeof PreconsolidationRequestSchema>

export const PreconsolidationResponseSchema = z.object({
  results: z.array(z.object({
    method: z.enum(OEDOMETER_METHOD_NAMES),
    preconsolidation: z.number().describe("σ'p, kPa"),
    construction: z.record(z.string(), z.unknown()).describe('Geometry of the construction, for drawing'),
  })),
  cc: z.number(),
  cr: z.number(),
  sampleQuality: z.object({ deltaEOverE0: z.number(), class: z.string() }).passthrough().optional(),
  warnings: z.array(z.string()),
}).meta({ id: 'PreconsolidationResponse' })

export const TREND_MODEL_NAMES = ['constant', 'linear', 'pop', 'ocr', 'crust', 'auto'] as const

export const TrendFitRequestSchema = z.object({
  model: z.enum(TREND_MODEL_NAMES),
  points: z.array(z.object({
    depth: num('m', depthM),
    preconsolidation: num("σ'p, kPa", pressureKPa),
    effectiveStress: num("σ'v0 at the point, kPa (needed by pop, ocr and crust)", pressureKPa).optional(),
    weight: z.number().positive().max(1e6).optional(),
  })).min(1).max(50_000),
  logSpace: z.boolean().optional().describe("Fit ln σ'p instead of σ'p"),
}).meta({ id: 'TrendFitRequest' })
export type TrendFitRequest = z.infer<typeof TrendFitRequestSchema>

export const TrendFitResponseSchema = z.object({
  model: z.string(),
  parameters: z.record(z.string(), z.number()),
  n: z.number().int(),
  r2: z.number(),
  rmse: z.number(),
  aic: z.number(),
  aicc: z.number().nullable().describe('AICc (Hurvich & Tsai 1989); null when n ≤ k + 1'),
  band: z.array(z.object({ depth: z.number(), lower: z.number(), upper: z.number(), fitted: z.number() })),
  reason: z.string().optional(),
}).passthrough().meta({ id: 'TrendFitResponse' })

export const ApiErrorSchema = z.object({
  statusCode: z.number().int(),
  statusMessage: z.string(),
  message: z.string(),
  data: z.object({
    issues: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
    code: z.string().optional(),
    depth: z.number().optional(),
  }).optional(),
}).meta({ id: 'ApiError' })
