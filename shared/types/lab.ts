/**
 * Replies of the laboratory and σ'p routes. `Server…` is what a service or
 * route returns, the plain name what the page reads (dates as ISO strings).
 */
import type { CompressionIndexCheck } from '#shared/geotech/insitu'
import type { OedometerInterpretation, OedometerResult } from '#shared/geotech/oedometer'
import type { SecondaryResult, TaylorResult } from '#shared/lab/time-curve'
import type { PreconsolidationPoint, PreconsolidationSource } from '#shared/schemas/lab'
import type { OedometerStageJson, oedometerTests, preconsolidationAdoptions } from '~~/server/db/schema'
import type { PointKind, SampleType } from '#shared/investigation/types'
import type { VersionStatus } from './models'
import type { Serialize } from './serialize'

/** One loading stage as entered, with the void ratio it converts to. */
export type OedometerStage = OedometerStageJson

export type ServerOedometerTestRow = typeof oedometerTests.$inferSelect

/** The stress model σ'v0 is read from. */
export interface StressModelInfo {
  /** A saved version of the design model (the version in force), none (σ'v0 unavailable), or a definition sent with the request. */
  source: 'version' | 'none' | 'given'
  modelId: string | null
  modelName: string | null
  /** The version in force and where it stands in review; null unless `source` is 'version'. */
  version: number | null
  status: VersionStatus | null
  /** How σ'v0 was obtained, in words for the page. */
  description: string
}

/** σv, u and σ'v0 at a sample's mid-depth from the stress model in force. */
export interface InsituAtSample {
  depth: number
  effectiveStress: number | null
  totalStress: number | null
  porePressure: number | null
  /** The model's stratum band at the sample depth. */
  modelStratum: string | null
}

/** A test as the API returns it: the row, where it came from, and the e0 check (`testJson`). */
export type ServerOedometerTest = ServerOedometerTestRow & {
  sample: { id: string, identifier: string, top: number, bottom: number, type: SampleType }
  point: { id: string, identifier: string, kind: PointKind }
  depth: number
  e0Check: { fromWaterContent: number | null, saturation: number | null }
}
export type OedometerTest = Serialize<ServerOedometerTest>

/** An adoption of σ'p with the adopter's name (`adoptionHistory`). */
export type ServerAdoptionRow = typeof preconsolidationAdoptions.$inferSelect & { adoptedByName: string | null }
export type AdoptionRow = Serialize<ServerAdoptionRow>

/** GET …/tests/oedometer/:testId */
export interface ServerOedometerTestReply { test: ServerOedometerTest, adoption: ServerAdoptionRow | null }
export type OedometerTestReply = Serialize<ServerOedometerTestReply>

/** GET …/tests/oedometer/:testId/adoptions */
export interface ServerAdoptionHistoryReply { adoption: ServerAdoptionRow | null, history: ServerAdoptionRow[] }
export type AdoptionHistoryReply = Serialize<ServerAdoptionHistoryReply>

/** The list's live reading of a curve, or the engine's reason when it cannot be read. */
export interface OedometerReading {
  casagrande: number | null
  deltaEOverE0: number | null
  qualityClass: string | null
  cc: number | null
  cr: number | null
  cv: number | null
  calpha: number | null
  error: string | null
}

/** One test of GET …/tests/oedometer. */
export type ServerOedometerListItem = Omit<ServerOedometerTest, 'stages'> & {
  stageCount: number
  stratumCode: string | null
  effectiveStress: number | null
  reading: OedometerReading
  adoption: ServerAdoptionRow | null
}
export type OedometerListItem = Serialize<ServerOedometerListItem>

/** GET …/tests/oedometer */
export interface ServerOedometerList { tests: ServerOedometerListItem[], total: number, limit: number, offset: number, stressModel: StressModelInfo }
export type OedometerList = Serialize<ServerOedometerList>

/** cv and Cα of one stage with time readings. */
export interface StageTimeAnalysis {
  /** 0-based index of the stage in the test. */
  stage: number
  stress: number
  readings: number
  /** Drainage path (half the mean specimen height over the stage, double drainage), mm. */
  drainagePath: number
  ok: boolean
  reason: string | null
  taylor: TaylorResult | null
  secondary: SecondaryResult | null
  notes: string[]
}

/** Median cv and Cα of a range of stages. */
export interface TimeRange { cv: number | null, calpha: number | null, stages: number }
export interface TimeSummary { virgin: TimeRange, recompression: TimeRange }

/** The liquid-limit check on Cc. */
export interface CcCheck extends CompressionIndexCheck {
  liquidLimit: number
  sampleId: string
  sampleIdentifier: string
  sameSample: boolean
  reference: string
}

/** One σ'p construction with OCR and POP at σ'v0. */
export type MethodResult = OedometerResult & { ocr: number | null, pop: number | null }

/** GET …/tests/oedometer/:testId/interpretation */
export interface ServerOedometerInterpretationReply extends Omit<OedometerInterpretation, 'results' | 'sampleQuality'> {
  test: ServerOedometerTest
  stressModel: StressModelInfo & InsituAtSample
  methods: MethodResult[]
  sampleQuality: NonNullable<OedometerInterpretation['sampleQuality']> | null
  timeCurves: {
    method: 'taylor-sqrt-t'
    reference: string
    stages: StageTimeAnalysis[]
    summary: TimeSummary
    calphaOverCc: number | null
  }
  ccCheck: CcCheck | null
  adoption: ServerAdoptionRow | null
  history: ServerAdoptionRow[]
  caution: string
}
export type OedometerInterpretationReply = Serialize<ServerOedometerInterpretationReply>

/** One σ'p point as the σ'p routes send it. */
export type PreconsolidationPointRow = PreconsolidationPoint

/** Every finite CPT row as compact arrays, for the canvas's dense layer. */
export interface DenseCpt {
  pointId: string
  pointIdentifier: string
  depth: number[]
  preconsolidation: number[]
  effectiveStress: (number | null)[]
  /** Index into `strata` of the reply, −1 where none. */
  stratum: number[]
}

/** A sounding's behaviour index Ic (Robertson 2009) through the same stresses, median per 0.1 m, for the canvas's guide. */
export interface CptBehaviourTrace {
  pointId: string
  pointIdentifier: string
  depth: number[]
  ic: number[]
}

/** `allPreconsolidationPoints`: the points of every source, with the dense CPT rows (and Ic) when asked. */
export interface ServerPreconsolidationPoints {
  points: PreconsolidationPoint<Date>[]
  counts: Record<PreconsolidationSource, number>
  vaneStratumPi: Record<string, number>
  warnings: string[]
  /** Strata codes whose "derive σ'p from CPT and vane" switch is off: no CPT or vane points there. */
  notDerivedIn: string[]
  dense?: { strata: string[], cpt: DenseCpt[] }
  /** With the dense rows: each sounding's Ic, in every stratum (switch or not). */
  behaviour?: CptBehaviourTrace[]
}

/** GET …/preconsolidation-points and POST …/preconsolidation-points/evaluate */
export interface ServerPreconsolidationPointsReply extends ServerPreconsolidationPoints {
  spacing: number
  stressModel: StressModelInfo
  caution: string
}
export type PreconsolidationPointsReply = Serialize<ServerPreconsolidationPointsReply>
