import { z } from 'zod'
import { GROUNDWATER_KINDS, POINT_KINDS, SAMPLE_TYPES } from '../investigation/types'
import { USCS_GROUP_SYMBOLS } from '../geotech/plasticity'
import { SPT_TEXT_MAX, sptFromInput } from '../investigation/spt-blows'
import { int, INT32_MAX, IsoDateSchema, IsoDateTimeSchema, str, UuidSchema } from './common'

/**
 * Shapes of the logging API (points, intervals, samples, index tests, SPT,
 * groundwater, CPT, vane, strata). Shared by the forms and the routes. Every
 * update carries the `version` the client read: a stale one is 409.
 */

const depth = (what: string) => z.number({ error: `${what} must be a number` }).min(0, { message: `${what} must be 0 m or deeper` }).max(500, { message: `${what} must be at most 500 m` })
const text = (max = 2000) => str().trim().max(max)
const isoDate = IsoDateSchema
/** Plan coordinates, m: grid coordinates of a projected system stay within 10⁸ m (common practice). */
const coordinate = z.number().min(-1e8, { message: 'must be at least −100 000 000 m' }).max(1e8, { message: 'must be at most 100 000 000 m' })
/** CPT readings (kPa): a cone reads at most a few hundred MPa; 10⁶ kPa keeps a slipped unit out (common practice). */
const cptReading = z.number().min(-1e6).max(1e6)

export const VersionSchema = z.object({ version: int(1) })

export const UscsSchema = z.enum(USCS_GROUP_SYMBOLS, { error: 'is not an ASTM D2487 group symbol' })

export const StratumInputSchema = z.object({
  code: str().trim().min(1, { message: 'is required' }).max(16).regex(/^[A-Za-z0-9_-]+$/, { message: 'may use letters, digits, - and _' }),
  name: str().trim().min(1, { message: 'is required' }).max(120),
  description: text().default(''),
  colour: str().min(1).max(40),
  pattern: str().min(1).max(40),
  unitWeight: z.number().min(5, { message: 'must be at least 5 kN/m³' }).max(30, { message: 'must be at most 30 kN/m³' }),
  unitWeightSaturated: z.number().min(5, { message: 'must be at least 5 kN/m³' }).max(30, { message: 'must be at most 30 kN/m³' }),
  displayOrder: int(0, 10_000).default(0),
})
export const StratumUpdateSchema = StratumInputSchema.partial().extend(VersionSchema.shape)
/** "Derive σ'p from CPT and vane" in a stratum (an interpretation choice): true or false overrides the default from the logged symbols, null follows it. */
export const StratumCptDerivationSchema = z.object({ cptDerivation: z.boolean().nullable() }).extend(VersionSchema.shape)

export const PointInputSchema = z.object({
  identifier: str().trim().min(1, { message: 'is required' }).max(40).regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, { message: 'may use letters, digits and . _ / -' }),
  kind: z.enum(POINT_KINDS),
  easting: coordinate,
  northing: coordinate,
  groundElevation: z.number().min(-1000).max(9000),
  finalDepth: z.number().positive({ message: 'must be deeper than 0 m' }).max(500),
  startedOn: isoDate.nullable().default(null),
  endedOn: isoDate.nullable().default(null),
  method: text(200).default(''),
  loggedBy: text(120).default(''),
  remarks: text().default(''),
}).refine(p => !p.startedOn || !p.endedOn || p.endedOn >= p.startedOn, { path: ['endedOn'], message: 'must not be before the start date' })
export const PointUpdateSchema = z.object({
  identifier: PointInputSchema.shape.identifier.optional(),
  kind: z.enum(POINT_KINDS).optional(),
  easting: coordinate.optional(),
  northing: coordinate.optional(),
  groundElevation: z.number().min(-1000).max(9000).optional(),
  finalDepth: z.number().positive({ message: 'must be deeper than 0 m' }).max(500).optional(),
  startedOn: isoDate.nullable().optional(),
  endedOn: isoDate.nullable().optional(),
  method: text(200).optional(),
  loggedBy: text(120).optional(),
  remarks: text().optional(),
  version: int(1),
})

export const PointListQuerySchema = z.object({
  q: str().trim().max(60).optional(),
  kind: z.enum(POINT_KINDS).optional(),
  limit: z.coerce.number().int().min(1).max(500).default(200),
  offset: z.coerce.number().int().min(0).max(INT32_MAX).default(0),
})

export const IntervalInputSchema = z.object({
  top: depth('Top'),
  bottom: depth('Bottom'),
  description: text().default(''),
  uscs: UscsSchema.nullable().default(null),
  stratumId: UuidSchema.nullable().default(null),
  moisture: text(60).nullable().default(null),
  consistency: text(60).nullable().default(null),
})

/** The whole log of a hole, saved at once: rows with an id update, rows without are new, missing ones are deleted. */
export const LogReplaceSchema = z.object({
  intervals: z.array(IntervalInputSchema.extend({ id: UuidSchema.optional(), version: int(1).optional() })).max(2000),
})

export const IndexTestInputSchema = z.object({
  waterContent: z.number().min(0).max(1000).nullable().default(null),
  liquidLimit: z.number().min(0).max(1000).nullable().default(null),
  plasticLimit: z.number().min(0).max(1000).nullable().default(null),
  bulkUnitWeight: z.number().min(5).max(30).nullable().default(null),
}).refine(t => t.liquidLimit === null || t.plasticLimit === null || t.plasticLimit <= t.liquidLimit, { path: ['plasticLimit'], message: 'must not exceed the liquid limit' })

export const SampleInputSchema = z.object({
  identifier: str().trim().min(1, { message: 'is required' }).max(40),
  top: depth('Top'),
  bottom: depth('Bottom'),
  type: z.enum(SAMPLE_TYPES),
  recovery: z.number().min(0).max(100).nullable().default(null),
  remarks: text().default(''),
}).refine(s => s.bottom >= s.top, { path: ['bottom'], message: 'must not be above the top' })
export const SampleUpdateSchema = z.object({
  identifier: str().trim().min(1).max(40).optional(),
  top: depth('Top').optional(),
  bottom: depth('Bottom').optional(),
  type: z.enum(SAMPLE_TYPES).optional(),
  recovery: z.number().min(0).max(100).nullable().optional(),
  remarks: text().optional(),
  version: int(1),
})

const SptShape = z.object({
  depth: depth('Depth'),
  /**
   * The blows as written on the log ("2 3 / 4 5 6 7", "25/75 50/40", "50/100mm"; see
   * shared/investigation/spt-blows.ts), or three counts per 150 mm (seating, then the
   * two halves of the test drive) with `penetration`.
   */
  blows: z.union([str(SPT_TEXT_MAX), z.tuple([int(0, 500), int(0, 500), int(0, 500)])], { error: 'Blows must be written as counted, for example 2 3 / 4 5 6 7' }),
  /** With three counts only: mm of the 300 mm test drive achieved when the test stopped short (a refusal); null for a full drive. */
  penetration: int(1, 299).nullable().default(null),
})
/** The blows read as a test: a text that cannot be read is an issue on `blows` in plain words. */
function readableBlows(s: { blows: string | readonly number[], penetration: number | null }, ctx: z.RefinementCtx) {
  const read = sptFromInput(s.blows, s.penetration)
  if (!read.ok) ctx.addIssue({ code: 'custom', path: ['blows'], message: read.error })
}
export const SptInputSchema = SptShape.superRefine(readableBlows)

export const GroundwaterInputSchema = z.object({
  kind: z.enum(GROUNDWATER_KINDS),
  observedAt: IsoDateTimeSchema,
  depth: depth('Depth').nullable().default(null),
  pressure: z.number().min(-100).max(10_000).nullable().default(null),
  remarks: text().default(''),
}).refine(g => g.depth !== null || g.pressure !== null, { path: ['depth'], message: 'give a depth or a pressure' })

export const CptInputSchema = z.object({
  areaRatio: z.number().gt(0, { message: 'must be above 0' }).max(1, { message: 'must be at most 1' }),
  depth: z.array(z.number().min(0).max(500)).min(2).max(500_000),
  qc: z.array(cptReading).max(500_000),
  fs: z.array(cptReading).max(500_000),
  u2: z.array(cptReading).max(500_000),
}).refine(c => c.qc.length === c.depth.length && c.fs.length === c.depth.length && c.u2.length === c.depth.length, { path: ['qc'], message: 'depth, qc, fs and u2 must have the same length' })

export const VaneInputSchema = z.object({
  depth: depth('Depth'),
  peak: z.number().positive({ message: 'must be above 0 kPa' }).max(1000, { message: 'must be at most 1000 kPa' }),
  remoulded: z.number().min(0, { message: 'must be 0 kPa or more' }).max(1000, { message: 'must be at most 1000 kPa' }).nullable().default(null),
})

export type PointInput = z.infer<typeof PointInputSchema>
export type IntervalInput = z.infer<typeof IntervalInputSchema>
export type SampleInput = z.infer<typeof SampleInputSchema>
export type GroundwaterInput = z.infer<typeof GroundwaterInputSchema>
export type StratumInput = z.infer<typeof StratumInputSchema>

/** Route bodies of the updates: the row's fields and the `version` the client read (stale: 409). */
export const SptUpdateSchema = SptShape.extend(VersionSchema.shape).superRefine(readableBlows)
export const GroundwaterUpdateSchema = z.intersection(GroundwaterInputSchema, VersionSchema)
export const VaneUpdateSchema = VaneInputSchema.extend(VersionSchema.shape)
/** An index test is created on the first save (no version yet) and updated with it afterwards. */
export const IndexTestSaveSchema = z.intersection(IndexTestInputSchema, z.object({ version: int(1).optional() }))
/** A CPT sounding replaced whole: send `version` when one exists. */
export const CptSaveSchema = z.intersection(CptInputSchema, z.object({ version: int(1).optional() }))

/** Route params of a point and of the rows, samples and strata beneath it. */
export const PointParamsSchema = z.object({ projectId: UuidSchema, pointId: UuidSchema })
export const SampleParamsSchema = PointParamsSchema.extend({ sampleId: UuidSchema })
export const StratumParamsSchema = z.object({ projectId: UuidSchema, stratumId: UuidSchema })
/** A row that belongs to a point (SPT, groundwater, vane) by its `rowId`. */
export const PointRowParamsSchema = PointParamsSchema.extend({ rowId: UuidSchema })
