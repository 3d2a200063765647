import { sql } from 'drizzle-orm'
import { boolean, check, date, doublePrecision, index, integer, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { GROUNDWATER_KINDS, POINT_KINDS, SAMPLE_TYPES } from '#shared/investigation/types'
import { ownedRow, timestamps, versioned } from './columns'
import { projects } from './projects'

export const pointKind = pgEnum('point_kind', POINT_KINDS)
export const sampleType = pgEnum('sample_type', SAMPLE_TYPES)
export const groundwaterKind = pgEnum('groundwater_kind', GROUNDWATER_KINDS)

/** Project-level geological units, in display order. */
export const strata = pgTable('strata', {
  ...ownedRow('projectId', () => projects.id),
  code: text().notNull(),
  name: text().notNull(),
  description: text().notNull().default(''),
  colour: text().notNull(),
  pattern: text().notNull(),
  unitWeight: doublePrecision().notNull(),
  unitWeightSaturated: doublePrecision().notNull(),
  displayOrder: integer().notNull().default(0),
  /** σ'p derived from CPT and vane in this stratum: null follows the logged USCS symbols (`cptDerivationDefault`). */
  cptDerivation: boolean(),
  ...versioned,
  ...timestamps,
}, t => [
  uniqueIndex('strata_project_code_idx').on(t.projectId, t.code),
])

export const investigationPoints = pgTable('investigation_points', {
  ...ownedRow('projectId', () => projects.id),
  identifier: text().notNull(),
  kind: pointKind().notNull(),
  easting: doublePrecision().notNull(),
  northing: doublePrecision().notNull(),
  groundElevation: doublePrecision().notNull(),
  finalDepth: doublePrecision().notNull(),
  startedOn: date({ mode: 'string' }),
  endedOn: date({ mode: 'string' }),
  method: text().notNull().default(''),
  loggedBy: text().notNull().default(''),
  remarks: text().notNull().default(''),
  ...versioned,
  ...timestamps,
}, t => [
  uniqueIndex('investigation_points_project_identifier_idx').on(t.projectId, t.identifier),
  check('investigation_points_final_depth_positive', sql`${t.finalDepth} > 0`),
])

export const logIntervals = pgTable('log_intervals', {
  ...ownedRow('pointId', () => investigationPoints.id),
  top: doublePrecision().notNull(),
  bottom: doublePrecision().notNull(),
  description: text().notNull().default(''),
  uscs: text(),
  // Deleting a stratum leaves the logged interval, unassigned.
  stratumId: uuid().references(() => strata.id, { onDelete: 'set null' }),
  moisture: text(),
  consistency: text(),
  ...versioned,
  ...timestamps,
}, t => [
  index('log_intervals_point_idx').on(t.pointId, t.top),
  check('log_intervals_top_above_bottom', sql`${t.top} >= 0 and ${t.bottom} > ${t.top}`),
])

export const samples = pgTable('samples', {
  ...ownedRow('pointId', () => investigationPoints.id),
  identifier: text().notNull(),
  top: doublePrecision().notNull(),
  bottom: doublePrecision().notNull(),
  type: sampleType().notNull(),
  recovery: doublePrecision(),
  remarks: text().notNull().default(''),
  ...versioned,
  ...timestamps,
}, t => [
  uniqueIndex('samples_point_identifier_idx').on(t.pointId, t.identifier),
  check('samples_top_above_bottom', sql`${t.top} >= 0 and ${t.bottom} >= ${t.top}`),
])

/** Index tests on a sample (one set per sample). PI is derived, never stored. */
export const indexTests = pgTable('index_tests', {
  ...ownedRow('sampleId', () => samples.id),
  waterContent: doublePrecision(),
  liquidLimit: doublePrecision(),
  plasticLimit: doublePrecision(),
  bulkUnitWeight: doublePrecision(),
  ...versioned,
  ...timestamps,
}, t => [uniqueIndex('index_tests_sample_idx').on(t.sampleId)])

export const sptResults = pgTable('spt_results', {
  ...ownedRow('pointId', () => investigationPoints.id),
  depth: doublePrecision().notNull(),
  /** Blows of each increment, seating drive first (rows without `penetrations`: seating, then the two halves of the test drive, per 150 mm). */
  blows: integer().array().notNull(),
  n: integer().notNull(),
  /** Penetration of the test drive in mm when it stopped short of 300 mm (a refusal, written "blows/penetration mm"); null: full drive. `n` then holds the test drive's blows. */
  penetration: integer(),
  /** Penetration of each increment in mm, in the order of `blows` (seating drive first); null on rows stored as three counts per 150 mm. */
  penetrations: integer().array(),
  /** How many of the increments belong to the seating drive (0: not recorded); null on rows stored as three counts per 150 mm. */
  seating: integer(),
  ...versioned,
  ...timestamps,
}, t => [index('spt_results_point_idx').on(t.pointId, t.depth)])

export const groundwaterObservations = pgTable('groundwater_observations', {
  ...ownedRow('pointId', () => investigationPoints.id),
  kind: groundwaterKind().notNull(),
  observedAt: timestamp({ withTimezone: true, mode: 'string' }).notNull(),
  depth: doublePrecision(),
  pressure: doublePrecision(),
  remarks: text().notNull().default(''),
  ...versioned,
  ...timestamps,
}, t => [
  index('groundwater_point_idx').on(t.pointId, t.observedAt),
  check('groundwater_depth_or_pressure', sql`${t.depth} is not null or ${t.pressure} is not null`),
])

/**
 * One CPT sounding per point, stored as parallel double arrays: a sounding is
 * thousands of rows that are always read whole, so one row reads in one fetch.
 */
export const cptSoundings = pgTable('cpt_soundings', {
  ...ownedRow('pointId', () => investigationPoints.id),
  areaRatio: doublePrecision().notNull(),
  count: integer().notNull(),
  depth: doublePrecision().array().notNull(),
  qc: doublePrecision().array().notNull(),
  fs: doublePrecision().array().notNull(),
  u2: doublePrecision().array().notNull(),
  ...versioned,
  ...timestamps,
}, t => [uniqueIndex('cpt_soundings_point_idx').on(t.pointId)])

/** Field vane readings (peak and remoulded su,FV). */
export const vaneReadings = pgTable('vane_readings', {
  ...ownedRow('pointId', () => investigationPoints.id),
  depth: doublePrecision().notNull(),
  peak: doublePrecision().notNull(),
  remoulded: doublePrecision(),
  ...versioned,
  ...timestamps,
}, t => [index('vane_readings_point_idx').on(t.pointId, t.depth)])

