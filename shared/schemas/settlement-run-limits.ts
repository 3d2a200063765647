/**
 * Settlement runs' bounds and defaults, without the schema library: the request's shape is
 * checked by the zod schemas in settlement-runs.ts, which export these too.
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
  /** Construction stages per load. */
  stages: [1, 12],
  /** Stage start, duration and removal time, years from the run's time zero. */
  stageTime: [0, 100],
  /** Fractions must sum to 1 within this tolerance (422 beyond). */
  fractionTolerance: 1e-6,
  /** Strata one drain pattern may pass through. */
  drainStrata: 20,
  /** Drain spacing, m. */
  drainSpacing: [0.3, 10],
  /** Equivalent drain diameter dw, m. */
  drainDiameter: [0.01, 0.5],
  /** Smear zone ratio ds/dw, –. */
  smearRatio: [1, 20],
  /** kh/ks inside the smear zone, –. */
  permeabilityRatio: [1, 50],
  /** ch/cv, –. */
  chRatio: [0.1, 20],
  /** Discharge capacity qw, m³/yr. */
  dischargeCapacity: [1, 10_000],
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

/**
 * Defaults of a run's prefabricated vertical drains (`options.drains`).
 * - `diameter`: equivalent diameter dw = (a + b)/2 of a 100 mm × 4 mm band = 0.052 m
 *   (Hansbo 1979's perimeter-equivalent form).
 * - `smearRatio` ds/dw = 3 and `permeabilityRatio` kh/ks = 3: common practice for mandrel-driven
 *   band drains in soft clay; site trials should set them.
 * - `chRatio` ch/cv = 1 (no credit for horizontal layering): common practice as a cautious default.
 */
export const RUN_DRAIN_DEFAULTS = {
  pattern: 'triangular' as const,
  /** (a + b)/2 = (0.100 + 0.004)/2 m. */
  diameter: 0.052,
  smearRatio: 3,
  permeabilityRatio: 3,
  chRatio: 1,
}

export const DRAIN_PATTERNS = ['triangular', 'square'] as const
export type DrainPattern = (typeof DRAIN_PATTERNS)[number]

/** The parameters a probabilistic run scatters per stratum (σ'p is `preconsolidation`). */
export const RUN_SCATTER_VARIABLES = ['cc', 'cr', 'e0', 'cv', 'ch', 'preconsolidation'] as const
export type RunScatterVariable = (typeof RUN_SCATTER_VARIABLES)[number]

/**
 * Bounds of `options.probabilistic`: realisations 100 – 100 000, a COV of at most 2 (soil
 * parameters scatter with COVs well below 1; more is a typing error: common practice), a
 * correlation length of 0.1 – 100 m, a settlement limit of at most 10 m, at most 50 strata.
 */
export const RUN_PROBABILISTIC_LIMITS = {
  realizations: [100, 100_000],
  cov: 2,
  correlationLength: [0.1, 100],
  seed: 2_147_483_647,
  strata: 50,
  limit: 10,
} as const

/** Defaults of `options.probabilistic`; the Cc–e0 correlation of 0.5 is common practice. */
export const RUN_PROBABILISTIC_DEFAULTS = {
  realizations: 5000,
  seed: 1,
  ccE0Correlation: 0.5,
}

/**
 * COVs assumed "from the data" when a stratum has fewer than `RUN_SCATTER_MIN_TESTS` usable tests:
 * mid-range values of the published ranges for clays (Duncan 2000, Table 1: Cc 10–37 %, σ'p
 * 10–35 %, cv 33–68 %; Phoon & Kulhawy 1999 for e0; Cr taken a little above Cc and ch as cv:
 * common practice). Each one is marked as an assumption wherever it is used.
 */
export const RUN_SCATTER_DEFAULT_COV: Readonly<Record<RunScatterVariable, number>> = {
  cc: 0.25,
  cr: 0.3,
  e0: 0.15,
  cv: 0.5,
  ch: 0.5,
  preconsolidation: 0.2,
}
/** Fewest usable tests for a COV from the data (a sample sd of two says little: common practice). */
export const RUN_SCATTER_MIN_TESTS = 3

/**
 * Work a probabilistic run may ask for, in realisation-sublayers (one realisation of one sublayer):
 * the named points' realisations × sublayers at most `points`, and the grid at most `grid`, where
 * each grid node gets `gridNodeRealizations` (or fewer, down to `gridNodeMinimum`, to stay within the
 * budget). The bench (`runProbabilistic`) draws 2·10⁶ realisation-sublayers in about 0.3 s on one core,
 * so even the largest run stays well inside the job's expiry (15 minutes by default) on a busy machine.
 */
export const RUN_PROBABILISTIC_WORK = {
  points: 200_000_000,
  grid: 40_000_000,
  gridNodeRealizations: 1000,
  gridNodeMinimum: 100,
} as const
