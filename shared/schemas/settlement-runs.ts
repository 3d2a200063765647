import { z } from 'zod'
import { int, str, UuidSchema } from './common'
import { DRAIN_PATTERNS, RUN_DRAIN_DEFAULTS, RUN_LIMITS, RUN_OPTION_DEFAULTS, RUN_PROBABILISTIC_DEFAULTS, RUN_PROBABILISTIC_LIMITS } from './settlement-run-limits'

// The bounds and defaults need no zod: they live in settlement-run-limits.ts (the run pages import them from
// there, so a results page's first load carries no zod) and are exported from here too.
export { DRAIN_PATTERNS, MAX_GRID_POINTS, RUN_DRAIN_DEFAULTS, RUN_LIMITS, RUN_OPTION_DEFAULTS, RUN_PROBABILISTIC_DEFAULTS, RUN_PROBABILISTIC_LIMITS, RUN_PROBABILISTIC_WORK, RUN_SCATTER_DEFAULT_COV, RUN_SCATTER_MIN_TESTS, RUN_SCATTER_VARIABLES, SITE_EXTENT } from './settlement-run-limits'
export type { DrainPattern, RunScatterVariable } from './settlement-run-limits'

/**
 * Settlement runs (`/api/projects/{projectId}/settlement-runs`): the request a designer's
 * workspace sends, SI on the wire (m, kPa, kN/m³, degrees, years). Shape errors and values
 * beyond the plausibility bounds below are 400; a well-formed run the site cannot take (a load
 * beyond ±5 km of the site origin, a grid of more than 10,000 points, a version without
 * compressibility, σ'v0 ≤ 0) is refused by the service with 422 and the plain reason.
 */

const L = RUN_LIMITS
function num(what: string, min: number, max: number, unit = '') {
  const u = unit ? ` ${unit}` : ''
  return z.number({ error: `${what} must be a number` })
    .min(min, { message: `must be at least ${min}${u}` })
    .max(max, { message: `must be at most ${max}${u}` })
}
const coord = num('A coordinate', -L.coordinate, L.coordinate, 'm')
const size = num('A size', 0, L.size, 'm').refine(v => v > 0, { message: 'must be greater than 0 m' })
const pressure = num('A pressure', -L.pressure, L.pressure, 'kPa')
const rotation = num('A rotation', -360, 360, '°')
const unitWeight = num('A unit weight', L.unitWeight[0], L.unitWeight[1], 'kN/m³')
const label = str(L.label).trim().max(L.label)

/** A fill given as thickness × unit weight instead of a pressure. */
export const FillSchema = z.object({
  thickness: num('The fill thickness', 0, L.height, 'm'),
  unitWeight,
})

/**
 * A pressure, or a fill whose thickness × unit weight is the pressure: exactly one of the two.
 * The service resolves a fill to its pressure before the engine sees it.
 */
const pressureOrFill = {
  pressure: pressure.optional(),
  fill: FillSchema.optional(),
}
function exactlyOnePressure(load: { pressure?: number, fill?: unknown }, ctx: z.RefinementCtx) {
  if ((load.pressure === undefined) === (load.fill === undefined)) {
    ctx.addIssue({ code: 'custom', path: ['pressure'], message: 'give a pressure or a fill (thickness and unit weight), not both' })
  }
}

/**
 * One construction stage of a load: from `start` over `duration` (years from the run's time
 * zero; 0 = placed at once) the stage adds `fraction` of the load's full pressure or height.
 */
export const RunStageSchema = z.object({
  start: num('A stage start', L.stageTime[0], L.stageTime[1], 'years'),
  duration: num('A stage duration', L.stageTime[0], L.stageTime[1], 'years'),
  fraction: num('A stage fraction', 0, 1).refine(v => v > 0, { message: 'must be greater than 0' }),
})
export type RunStage = z.infer<typeof RunStageSchema>

/**
 * A load's schedule: `stages` (1–12; fractions sum to 1, checked by the service, 422) — when
 * left out, the whole load is placed at time 0 — and `removeAt` (years) for a surcharge taken
 * off at that time.
 */
const schedule = {
  stages: z.array(RunStageSchema).min(L.stages[0], { message: `needs at least ${L.stages[0]} stage` }).max(L.stages[1], { message: `may have at most ${L.stages[1]} stages` }).optional(),
  removeAt: num('The removal time', L.stageTime[0], L.stageTime[1], 'years').refine(v => v > 0, { message: 'must be greater than 0 years' }).optional(),
}

const common = { label: label.optional(), ...schedule }

export const UniformLoadSchema = z.object({ type: z.literal('uniform'), ...common, ...pressureOrFill })
export const RectangleLoadSchema = z.object({
  type: z.literal('rectangle'), ...common, x: coord, y: coord, width: size, length: size, rotation: rotation.default(0), ...pressureOrFill,
})
export const CircleLoadSchema = z.object({ type: z.literal('circle'), ...common, x: coord, y: coord, radius: size, ...pressureOrFill })
export const EmbankmentLoadSchema = z.object({
  type: z.literal('embankment'),
  ...common,
  x: coord,
  y: coord,
  crestWidth: size,
  crestLength: size,
  height: num('The height', 0, L.height, 'm').refine(v => v > 0, { message: 'must be greater than 0 m' }),
  /** n of an n:1 (horizontal : vertical) side slope, on all four sides; 0 for vertical sides. */
  sideSlope: num('The side slope', L.sideSlope[0], L.sideSlope[1]),
  unitWeight,
  rotation: rotation.default(0),
  ...schedule,
})

export const RunLoadSchema = z.discriminatedUnion('type', [
  UniformLoadSchema.superRefine(exactlyOnePressure),
  RectangleLoadSchema.superRefine(exactlyOnePressure),
  CircleLoadSchema.superRefine(exactlyOnePressure),
  EmbankmentLoadSchema,
])
export type RunLoadInput = z.input<typeof RunLoadSchema>
export type RunLoad = z.infer<typeof RunLoadSchema>

export const RunPointSchema = z.object({
  label: label.min(1, { message: 'is required' }),
  x: coord,
  y: coord,
  /** The investigation point it was picked from, if any. */
  pointId: UuidSchema.optional(),
})
export type RunPoint = z.infer<typeof RunPointSchema>

export const RunGridSchema = z.object({
  spacing: num('The grid spacing', L.gridSpacing[0], L.gridSpacing[1], 'm'),
  /** Distance beyond the loads' footprint the grid reaches, m. */
  margin: num('The grid margin', L.gridMargin[0], L.gridMargin[1], 'm').default(0),
})
export type RunGrid = z.infer<typeof RunGridSchema>


/**
 * Prefabricated vertical drains through the named strata (stratum codes of the model version;
 * an unknown code is refused with 422). Spacing and diameter in m, discharge capacity qw in
 * m³/yr (left out: no well resistance). A spacing not greater than the drain diameter is 422.
 */
export const RunDrainsSchema = z.object({
  strata: z.array(str(16).trim().min(1, { message: 'is required' }).max(16)).min(1, { message: 'name at least one stratum' }).max(L.drainStrata),
  pattern: z.enum(DRAIN_PATTERNS, { error: 'must be triangular or square' }).default(RUN_DRAIN_DEFAULTS.pattern),
  spacing: num('The drain spacing', L.drainSpacing[0], L.drainSpacing[1], 'm'),
  diameter: num('The drain diameter', L.drainDiameter[0], L.drainDiameter[1], 'm').default(RUN_DRAIN_DEFAULTS.diameter),
  smearRatio: num('The smear ratio', L.smearRatio[0], L.smearRatio[1]).default(RUN_DRAIN_DEFAULTS.smearRatio),
  permeabilityRatio: num('The permeability ratio', L.permeabilityRatio[0], L.permeabilityRatio[1]).default(RUN_DRAIN_DEFAULTS.permeabilityRatio),
  chRatio: num('The ch/cv ratio', L.chRatio[0], L.chRatio[1]).default(RUN_DRAIN_DEFAULTS.chRatio),
  dischargeCapacity: num('The discharge capacity', L.dischargeCapacity[0], L.dischargeCapacity[1], 'm³/yr').optional(),
})
export type RunDrainsInput = z.input<typeof RunDrainsSchema>
export type RunDrains = z.infer<typeof RunDrainsSchema>

const P = RUN_PROBABILISTIC_LIMITS
/** One scattered parameter of a stratum: its COV about the adopted value, optionally a random field along depth. */
export const RunVariationSchema = z.object({
  cov: num('A coefficient of variation', 0, P.cov),
  /** Scale of fluctuation θ (m) of a 1-D random field (exponential autocorrelation); left out: one value per realisation. */
  correlationLength: num('The correlation length', P.correlationLength[0], P.correlationLength[1], 'm').optional(),
}).strict()
export type RunVariation = z.infer<typeof RunVariationSchema>

/**
 * What scatters in one stratum (keyed by stratum code). An entered COV wins over "from the data".
 * `preconsolidation` scales σ'p lognormally about the model; with `fromData` and no entry, a stratum
 * whose σ'p is a fitted trend draws whole trend lines from the fit's covariance instead.
 */
export const RunStratumVariationSchema = z.object({
  cc: RunVariationSchema.optional(),
  cr: RunVariationSchema.optional(),
  e0: RunVariationSchema.optional(),
  cv: RunVariationSchema.optional(),
  ch: RunVariationSchema.optional(),
  preconsolidation: RunVariationSchema.optional(),
}).strict()
export type RunStratumVariation = z.infer<typeof RunStratumVariationSchema>

/**
 * `options.probabilistic`: Monte Carlo settlement at every named point (and P50/P95 over the grid).
 * `fromData` fills each COV not entered from the stratum's interpreted tests (n ≥ 3; else a stated
 * default, marked as an assumption) and σ'p from the trend fit's covariance.
 */
export const RunProbabilisticSchema = z.object({
  realizations: int(P.realizations[0], P.realizations[1]).default(RUN_PROBABILISTIC_DEFAULTS.realizations),
  seed: int(0, P.seed).default(RUN_PROBABILISTIC_DEFAULTS.seed),
  fromData: z.boolean().default(false),
  layers: z.record(str(16).trim().min(1).max(16), RunStratumVariationSchema)
    .refine(r => Object.keys(r).length <= P.strata, { message: `may name at most ${P.strata} strata` })
    .default({}),
  ccE0Correlation: num('The Cc–e0 correlation', -1, 1).default(RUN_PROBABILISTIC_DEFAULTS.ccE0Correlation),
  /** Settlement limit, m: each point reports the probability of exceeding it. */
  limit: num('The settlement limit', 0, P.limit, 'm').optional(),
}).strict()
export type RunProbabilisticInput = z.input<typeof RunProbabilisticSchema>
export type RunProbabilistic = z.infer<typeof RunProbabilisticSchema>

export const RunOptionsSchema = z.object({
  maxSublayerThickness: num('The sublayer thickness', L.sublayer[0], L.sublayer[1], 'm').default(RUN_OPTION_DEFAULTS.maxSublayerThickness),
  years: z.array(num('A time', 0, L.maxYears, 'years').refine(v => v > 0, { message: 'must be greater than 0 years' })).max(L.years).default(RUN_OPTION_DEFAULTS.years),
  designLife: num('The design life', 0, L.maxYears, 'years').refine(v => v > 0, { message: 'must be greater than 0 years' }).default(RUN_OPTION_DEFAULTS.designLife),
  angularDistortionLimit: num('The angular distortion limit', 0, 0.1).refine(v => v > 0, { message: 'must be greater than 0' }).default(RUN_OPTION_DEFAULTS.angularDistortionLimit),
  drains: RunDrainsSchema.optional(),
  probabilistic: RunProbabilisticSchema.optional(),
})
export type RunOptions = z.infer<typeof RunOptionsSchema>

export const CreateSettlementRunSchema = z.object({
  name: str(L.name).trim().min(1, { message: 'is required' }).max(L.name),
  model: z.object({ modelId: UuidSchema, version: int(1) }),
  loads: z.array(RunLoadSchema).min(1, { message: 'needs at least one load' }).max(L.loads),
  points: z.array(RunPointSchema).max(L.points).default([]),
  grid: RunGridSchema.optional(),
  options: RunOptionsSchema.default(RunOptionsSchema.parse({})),
}).superRefine((run, ctx) => {
  if (run.points.length === 0 && !run.grid) ctx.addIssue({ code: 'custom', path: ['points'], message: 'name at least one point or ask for a grid' })
})
export type CreateSettlementRun = z.infer<typeof CreateSettlementRunSchema>

export const SettlementRunParamsSchema = z.object({ projectId: UuidSchema, runId: UuidSchema })
export const SettlementRunPointParamsSchema = SettlementRunParamsSchema.extend({ index: z.coerce.number().int().min(0).max(L.points - 1) })
/** Query of `GET …/settlement-runs/scatter`: the model version whose tests give the COVs "from the data". */
export const RunScatterQuerySchema = z.object({ modelId: UuidSchema, version: z.coerce.number().int().min(1).max(100_000) })
/**
 * Query of `GET …/settlement-runs/{runId}`: `curves=none` leaves out each point's time curves (most of a finished
 * run's reply), as a run's results page reads it; the page reads the curves of the point it shows with that point.
 */
export const SettlementRunQuerySchema = z.object({ curves: z.enum(['all', 'none']).default('all') })
export type SettlementRunQuery = z.infer<typeof SettlementRunQuerySchema>
export const SettlementRunExportQuerySchema = z.object({ format: z.enum(['xlsx', 'json']) })
export const SettlementRunListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(100),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
})
