/**
 * The investigation data model as plain objects, shared by the demo generator,
 * the file importers (CSV/XLSX/AGS4), the exporters and the database layer.
 * SI internal units: depths and coordinates in m, stresses and pressures in kPa,
 * unit weights in kN/m³, water content and limits in %. Dates are ISO strings
 * (`YYYY-MM-DD` for dates, full ISO 8601 for date-times).
 */

export const POINT_KINDS = ['borehole', 'cpt', 'test-pit', 'piezometer'] as const
export type PointKind = (typeof POINT_KINDS)[number]

export const SAMPLE_TYPES = ['thin-walled-tube', 'piston', 'block', 'bulk', 'spt-split-spoon', 'core'] as const
export type SampleType = (typeof SAMPLE_TYPES)[number]

export const GROUNDWATER_KINDS = ['strike', 'standing', 'piezometer'] as const
export type GroundwaterKind = (typeof GROUNDWATER_KINDS)[number]

export const OEDOMETER_TEST_TYPES = ['incremental', 'crs'] as const
export type OedometerTestType = (typeof OEDOMETER_TEST_TYPES)[number]

export interface StratumRecord {
  code: string
  name: string
  description: string
  /** Key into the palette of shared/strata/appearance.ts. */
  colour: string
  /** Key into the pattern set of shared/strata/appearance.ts. */
  pattern: string
  unitWeight: number
  unitWeightSaturated: number
  displayOrder: number
}

export interface LogIntervalRecord {
  top: number
  bottom: number
  description: string
  /** ASTM D2487/D2488 group symbol, or null when not classified. */
  uscs: string | null
  stratumCode: string | null
  moisture: string | null
  consistency: string | null
}

export interface IndexTestRecord {
  waterContent: number | null
  liquidLimit: number | null
  plasticLimit: number | null
  bulkUnitWeight: number | null
}

export interface OedometerStageRecord {
  /** Vertical effective stress at the end of the stage, kPa. */
  stress: number
  voidRatio: number
}

export interface OedometerTestRecord {
  testType: OedometerTestType
  /** Initial specimen height, m. */
  specimenHeight: number
  initialWaterContent: number | null
  specificGravity: number | null
  e0: number
  stages: OedometerStageRecord[]
  remarks: string
}

export interface SampleRecord {
  identifier: string
  top: number
  bottom: number
  type: SampleType
  /** Recovery, %. */
  recovery: number | null
  remarks: string
  index: IndexTestRecord | null
  oedometer: OedometerTestRecord | null
}

/**
 * One SPT (shared/investigation/spt-blows.ts reads and writes its increments). Without
 * `penetrations` the blows are three counts per 150 mm: seating drive, then the two
 * halves of the test drive.
 */
export interface SptRecord {
  depth: number
  /** Blows of each increment, seating drive first. */
  blows: number[]
  /** Blows of the test drive: N when `penetration` is null. */
  n: number
  /** Penetration of each increment, mm, in the order of `blows`. */
  penetrations?: number[]
  /** How many increments belong to the seating drive (0: not recorded). */
  seating?: number
  /** Penetration of the test drive when it stopped short of 300 mm (a refusal); null or absent for a full drive. */
  penetration?: number | null
}

export interface GroundwaterRecord {
  kind: GroundwaterKind
  observedAt: string
  /** Depth below ground of the water level (strike, standing level), m. */
  depth: number | null
  /** Pore pressure (piezometer), kPa. */
  pressure: number | null
  remarks: string
}

export interface CptRecord {
  /** Cone area ratio a. */
  areaRatio: number
  depth: number[]
  /** Cone resistance qc, kPa. */
  qc: number[]
  /** Sleeve friction fs, kPa. */
  fs: number[]
  /** Pore pressure behind the cone u2, kPa. */
  u2: number[]
}

export interface VaneRecord {
  depth: number
  /** Peak field vane strength su,FV, kPa. */
  peak: number
  /** Remoulded strength, kPa. */
  remoulded: number | null
}

export interface PointRecord {
  identifier: string
  kind: PointKind
  easting: number
  northing: number
  groundElevation: number
  finalDepth: number
  startedOn: string | null
  endedOn: string | null
  method: string
  loggedBy: string
  remarks: string
  intervals: LogIntervalRecord[]
  samples: SampleRecord[]
  spt: SptRecord[]
  groundwater: GroundwaterRecord[]
  cpt: CptRecord | null
  vane: VaneRecord[]
}

export interface ProjectRecord {
  jobNumber: string
  name: string
  client: string
}

export interface InvestigationRecord {
  project: ProjectRecord
  strata: StratumRecord[]
  points: PointRecord[]
}
