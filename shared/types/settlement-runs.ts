/**
 * Settlement runs: what the routes under `/api/projects/{projectId}/settlement-runs` answer.
 * SI throughout (m, kPa, years; `degree` 0–1). `Server…` is what a service returns (dates as
 * `Date`), the plain name what the page reads (`Serialize<…>`).
 */
import type { SublayerResult } from '../geotech/settlement'
import type { DrainPattern, RunGrid, RunLoad, RunOptions, RunPoint, RunScatterVariable } from '../schemas/settlement-runs'
import type { Distribution } from '../probabilistic/monte-carlo'
import type { Histogram } from '../probabilistic/summary'
import type { VersionStatus } from './models'
import type { Serialize } from './serialize'

export const RUN_STATUSES = ['queued', 'running', 'finished', 'failed', 'cancelled'] as const
export type RunStatus = (typeof RUN_STATUSES)[number]

/** The site-model version a run used, as it stood when the run was made. */
export interface ServerRunModel {
  modelId: string
  modelName: string
  version: number
  /** The version's status at run time ('approved', or anything else: not approved). */
  status: VersionStatus
  approvedBy: string | null
  approvedAt: Date | null
}

export interface RunPersonRef { id: string, name: string }

/** One point's time–settlement: at the designer's years, and a dense log-spaced curve for the plot. */
export interface RunTimePoint { years: number, degree: number, settlement: number }
export interface RunTimeCurve {
  /** Log-spaced times, years. */
  years: number[]
  /** Primary consolidation settlement, m, at each time. */
  primary: number[]
  /** Secondary compression, m (0 until each layer's 95 % primary). */
  secondary: number[]
  /** primary + secondary, m. */
  total: number[]
  /** Primary settlement of each stratum (its own drainage path), m. */
  layers: { name: string, settlement: number[] }[]
  /** Primary settlement without the drains, m, at each time (only when the run has drains). */
  withoutDrains?: number[]
  /** Δσ at the ground surface under this point, kPa, at each time (the loads in place then). */
  surfaceLoad?: number[]
}

/**
 * Monte Carlo final primary settlement at one point (m), from `options.probabilistic`.
 * `exceedanceCurve` gives P(settlement > s) at increasing s (for the curve and a limit typed on the page).
 */
export interface RunPointProbabilistic extends Distribution {
  realizations: number
  /** Settlement at the adopted values (m): the deterministic result. */
  deterministic: number
  histogram: Histogram
  exceedanceCurve: { settlement: number[], probability: number[] }
  /** Probability of exceeding the run's `limit`. */
  exceedance?: { limit: number, probability: number }
  /** Years to 90 % of primary settlement, when every compressible stratum has cv. */
  t90?: Distribution
  /** By |rank correlation| with the settlement, largest first. */
  sensitivity: { stratum: string, variable: RunScatterVariable, rankCorrelation: number }[]
  warnings: string[]
}

/** Where a scattered parameter's COV came from: the stratum's tests, a stated default (an assumption), or typed by the engineer. */
export type RunScatterSource = 'data' | 'default' | 'entered'

export interface RunVariableScatter {
  variable: RunScatterVariable
  cov: number
  source: RunScatterSource
  /** Tests behind a COV from the data (0 otherwise). */
  n: number
  correlationLength?: number
  /** σ'p only: whole trend lines drawn from the fit's covariance instead of a COV. */
  trend?: boolean
}

/** The scatter of one compressible stratum, as the run used it (or as the data give it, before a run). */
export interface RunStratumScatter {
  code: string
  name: string
  variables: RunVariableScatter[]
}

/** GET …/settlement-runs/scatter: the COVs "from the data" of a model version's compressible strata. */
export interface RunScatterReply { strata: RunStratumScatter[] }

/** The probabilistic set-up a run used (on `results.probabilistic`). */
export interface RunProbabilisticSetup {
  realizations: number
  seed: number
  ccE0Correlation: number
  limit: number | null
  fromData: boolean
  strata: RunStratumScatter[]
  warnings: string[]
  /** Worker threads the realisations were split across. */
  threads: number
  computeMs: number
}

/** One named point's result (`results.points[]`). */
export interface RunPointResult {
  label: string
  x: number
  y: number
  /** Final primary consolidation settlement, m. */
  settlement: number
  /** By stratum, m. */
  layers: { name: string, settlement: number }[]
  /**
   * Years to 50 % / 90 % of primary settlement (the final primary under the loads in place at
   * the end); null where no cv or no settlement. With drains, the drained figure.
   */
  t50: number | null
  t90: number | null
  /** The same without the drains (only when the run has drains). */
  t50WithoutDrains?: number | null
  t90WithoutDrains?: number | null
  /** Rebound at the removal of the load(s) taken off, m, positive upward (only when a load is removed). */
  rebound?: number
  /** Primary settlement still to come under the permanent loads after removal, m (only when a load is removed). */
  residualAfterRemoval?: number
  /** When the (last) load was removed, years (only when a load is removed). */
  removedAt?: number
  /** At the options' years. */
  time: RunTimePoint[]
  /** Secondary compression over the design life, m (null when no stratum has Cα). */
  secondary: number | null
  curve: RunTimeCurve | null
  /** Total with every sublayer halved, and the relative change. */
  convergence: { halved: number, relativeChange: number } | null
  /** Δσ at the ground surface under this point, kPa. */
  surfaceStressIncrease: number
  warnings: string[]
  probabilistic?: RunPointProbabilistic
}

/** A grid pair and its difference: `a` and `b` are plan points (m). */
export interface RunGridPair { a: { x: number, y: number }, b: { x: number, y: number }, value: number }

export interface RunGridResult {
  /** Column and row coordinates, m. */
  xs: number[]
  ys: number[]
  /** Row-major: settlement[j][i] at (xs[i], ys[j]), m. */
  settlement: number[][]
  /** Largest settlement difference between neighbouring grid points (along x, y or a diagonal), m. */
  maxDifferential: number
  /** Largest differential / distance between neighbouring grid points. */
  maxAngularDistortion: number
  worstDifferential: RunGridPair | null
  worstAngularDistortion: RunGridPair | null
  /** The options' limit and whether the worst pair exceeds it. */
  angularDistortionLimit: number
  exceedsLimit: boolean
  /** P50 and P95 of final primary settlement per grid node (m), with the realisations used per node. */
  probabilistic?: { realizations: number, p50: number[][], p95: number[][] }
}

/** The drain design a run used and what it means for each drained stratum (`results.drains`). */
export interface RunDrainDesign {
  pattern: DrainPattern
  /** m. */
  spacing: number
  /** Equivalent drain diameter dw, m. */
  diameter: number
  /** De = 1.05 s (triangular) or 1.128 s (square), m. */
  influenceDiameter: number
  /** Hansbo's μ (smear and, with qw, well resistance). */
  mu: number
  /** Each drained stratum: cv and ch (m²/yr) and its vertical drainage path (m). */
  strata: { name: string, cv: number, ch: number, drainagePath: number }[]
}

export interface RunResults {
  points: RunPointResult[]
  /** Only when the run has drains. */
  drains?: RunDrainDesign
  probabilistic?: RunProbabilisticSetup
  grid?: RunGridResult
  /** The largest settlement over the named points and the grid. */
  maximum: { settlement: number, x: number, y: number, label: string | null }
  warnings: string[]
  caution: string
  /** Worker time, ms, and sublayers computed. */
  stats: { computeMs: number, sublayers: number }
}

/** One sublayer row of a point's table (`GET …/points/{index}`): the engine's own sublayer result. */
export type RunSublayerRow = SublayerResult

export interface RunPointDetail extends RunPointResult {
  index: number
  sublayers: RunSublayerRow[]
}

export interface ServerSettlementRun {
  id: string
  name: string
  status: RunStatus
  /** 0–1. */
  progress: number
  error: { message: string, code: string | null } | null
  model: ServerRunModel
  loads: RunLoad[]
  points: RunPoint[]
  grid: RunGrid | null
  options: RunOptions
  createdBy: RunPersonRef | null
  createdAt: Date
  startedAt: Date | null
  finishedAt: Date | null
  results: RunResults | null
}
export type SettlementRun = Serialize<ServerSettlementRun>

/** A point's results without its time curves (a run's results page reads the curves of the point it shows with that point's detail). */
export type RunPointSummary = Omit<RunPointResult, 'curve'>
/** A run's results with every point's time curves left out: most of a finished run's reply is those curves. */
export type RunResultsSummary = Omit<RunResults, 'points'> & { points: RunPointSummary[] }
/** A run as its results page holds it: the reply of `GET …/settlement-runs/{runId}?curves=none`. */
export type ServerSettlementRunView = Omit<ServerSettlementRun, 'results'> & { results: RunResultsSummary | null }
export type SettlementRunView = Serialize<ServerSettlementRunView>

/** A row of the project's run list, with its headline figures once finished. */
export interface ServerSettlementRunSummary {
  id: string
  name: string
  status: RunStatus
  progress: number
  model: ServerRunModel
  createdBy: RunPersonRef | null
  createdAt: Date
  finishedAt: Date | null
  loadCount: number
  pointCount: number
  gridPoints: number
  headline: {
    maxSettlement: number
    maxAt: { x: number, y: number, label: string | null }
    /** Longest t90 over the named points, years. */
    t90: number | null
    maxAngularDistortion: number | null
  } | null
}
export type SettlementRunSummary = Serialize<ServerSettlementRunSummary>

export interface ServerSettlementRunList { runs: ServerSettlementRunSummary[], total: number }
export type SettlementRunList = Serialize<ServerSettlementRunList>
