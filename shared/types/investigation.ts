/**
 * Replies of the logging routes (points, strata, log, samples, in-situ rows).
 * Rows come from the Drizzle schema; `Server…` is what a service returns, the
 * plain name what the page reads (dates as ISO strings).
 */
import type { ProjectRole } from '#shared/auth/roles'
import type { Gap } from '#shared/investigation/intervals'
import type { CptDerivationDefault } from '#shared/strata/cpt-derivation'
import type {
  cptSoundings, groundwaterObservations, indexTests, investigationPoints, logIntervals, samples, sptResults, strata, vaneReadings,
} from '~~/server/db/schema'
import type { Serialize } from './serialize'

export type ServerPointRow = typeof investigationPoints.$inferSelect
export type ServerStratumRow = typeof strata.$inferSelect
export type ServerIntervalRow = typeof logIntervals.$inferSelect
export type ServerSampleRow = typeof samples.$inferSelect
export type ServerIndexTestRow = typeof indexTests.$inferSelect
export type ServerSptRow = typeof sptResults.$inferSelect
export type ServerGroundwaterRow = typeof groundwaterObservations.$inferSelect
export type ServerVaneRow = typeof vaneReadings.$inferSelect
type ServerCptRow = typeof cptSoundings.$inferSelect

export type PointRow = Serialize<ServerPointRow>
export type StratumRow = Serialize<ServerStratumRow>
export type IntervalRow = Serialize<ServerIntervalRow>
export type IndexTestRow = Serialize<ServerIndexTestRow>
export type SptRow = Serialize<ServerSptRow>
export type GroundwaterRow = Serialize<ServerGroundwaterRow>
export type VaneRow = Serialize<ServerVaneRow>

/** A stretch of a hole with no log interval. */
export type DepthRange = Gap

/** A sample with its index tests (null when none were entered). */
export type ServerLoggedSample = ServerSampleRow & { index: ServerIndexTestRow | null }
export type SampleRow = Serialize<ServerLoggedSample>

/** The CPT sounding's header, without its arrays. */
export type CptSummary = Pick<ServerCptRow, 'id' | 'areaRatio' | 'count' | 'version'>

/** Everything logged at one point except the CPT arrays (`pointDetail`). */
export interface ServerPointContents {
  point: ServerPointRow
  intervals: ServerIntervalRow[]
  gaps: DepthRange[]
  samples: ServerLoggedSample[]
  spt: ServerSptRow[]
  groundwater: ServerGroundwaterRow[]
  vane: ServerVaneRow[]
  cpt: CptSummary | null
}

/** GET …/points/:pointId */
export type ServerPointDetail = ServerPointContents & { role: ProjectRole }
export type PointDetail = Serialize<ServerPointDetail>

/** GET …/points/:pointId/cpt: the whole sounding as parallel arrays (kPa, m). */
export type CptSounding = Pick<ServerCptRow, 'areaRatio' | 'count' | 'depth' | 'qc' | 'fs' | 'u2' | 'version'>

/** One row of GET …/points. */
export type ServerPointListItem = ServerPointRow & { cptCount: number }
export type PointListItem = Serialize<ServerPointListItem>

/** GET …/points: one page. */
export interface ServerPointPage { points: ServerPointListItem[], total: number, limit: number, offset: number }
export type PointPage = Serialize<ServerPointPage>

/** Whether σ'p is derived from CPT and vane in a stratum: the default from its logged symbols and the switch in force. */
export interface StratumCptDerivation {
  stratumId: string
  code: string
  default: CptDerivationDefault
  /** The stored override (null follows the default). */
  override: boolean | null
  on: boolean
}

/** GET …/strata */
export interface ServerStrataReply { strata: ServerStratumRow[], cptDerivation: StratumCptDerivation[] }
export type StrataReply = Serialize<ServerStrataReply>

/** PUT …/points/:pointId/intervals: the log as saved, with its gaps. */
export interface ServerLogReply { intervals: ServerIntervalRow[], gaps: DepthRange[] }
export type LogReply = Serialize<ServerLogReply>

/** A ground area on the site plan (site grid, m). */
export interface PlanExtent { minX: number, maxX: number, minY: number, maxY: number }

/** The site plan's current view, for drawing over it: ground → screen pixels and back. */
export interface PlanView {
  x: (easting: number) => number
  y: (northing: number) => number
  invert: (px: number, py: number) => { x: number, y: number }
  /** Screen pixels per metre of ground (the same both ways). */
  pxPerMetre: number
  width: number
  height: number
}
