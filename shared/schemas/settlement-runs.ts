import { z } from 'zod'
import { int, str, UuidSchema } from './common'

/**
 * Settlement runs (`/api/projects/{projectId}/settlement-runs`): the request a designer's
 * workspace sends, SI on the wire (m, kPa, kN/m³, degrees, years). Shape errors and values
 * beyond the plausibility bounds below are 400; a well-formed run the site cannot take (a load
 * beyond ±5 km of the site origin, a grid of more than 10,000 points, a version without
 * compressibility, σ'v0 ≤ 0) is refused by the service with 422 and the plain reason.
 */

/** What one run may hold (bounds of the shape, 400 beyond). */
export const RUN_LIMITS = {
  name: 120,
  label: 40,
  loads: 20,
  points: 100,
  years: 50,
  /** Plan coordinates as a shape bound, m; the site's own bound (422) is SITE_EXTENT. */
  coordinate: 1_000_000,
  /** Load dimensions, m. */
  size: 10_000,
  /** Pressures, kPa. */
  pressure: 10_000,
  /** Fill thickness or embankment height, m. */
  height: 100,
  unitWeight: [5, 30],
  /** Side slope n (horizontal : 1 vertical). */
  sideSlope: [0, 20],
  /** Grid spacing and margin, m. */
  gridSpacing: [0.5, 1000],
  gridMargin: [0, 1000],
  sublayer: [0.05, 5],
  maxYears: 1000,
} as const

/** Loads and points must lie within this distance (m) of the site origin, along x and y (422 beyond). */
export const SITE_EXTENT = 5000
/** Most points a grid may have (422 beyond). */
export const MAX_GRID_POINTS = 10_000

/** Defaults a run's options take when the request leaves them out. */
export const RUN_OPTION_DEFAULTS = {
  maxSublayerThickness: 0.25,
  years: [0.25, 0.5, 1, 2, 5, 10, 20, 50] as number[],
  designLife: 50,
  /** 1/500: common practice for a limit of angular distortion; check the project's criteria. */
  angularDistortionLimit: 1 / 500,
}

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

const common = { label: label.optional() }

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

export const RunOptionsSchema = z.object({
  maxSublayerThickness: num('The sublayer thickness', L.sublayer[0], L.sublayer[1], 'm').default(RUN_OPTION_DEFAULTS.maxSublayerThickness),
  years: z.array(num('A time', 0, L.maxYears, 'years').refine(v => v > 0, { message: 'must be greater than 0 years' })).max(L.years).default(RUN_OPTION_DEFAULTS.years),
  designLife: num('The design life', 0, L.maxYears, 'years').refine(v => v > 0, { message: 'must be greater than 0 years' }).default(RUN_OPTION_DEFAULTS.designLife),
  angularDistortionLimit: num('The angular distortion limit', 0, 0.1).refine(v => v > 0, { message: 'must be greater than 0' }).default(RUN_OPTION_DEFAULTS.angularDistortionLimit),
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
export const SettlementRunExportQuerySchema = z.object({ format: z.enum(['xlsx', 'json']) })
export const SettlementRunListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(100),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
})
