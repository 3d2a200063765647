import { doublePrecision, index, jsonb, pgEnum, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { OEDOMETER_TEST_TYPES } from '#shared/investigation/types'
import type { AdoptionMethod } from '#shared/schemas/lab'
import { moment, ownedRow, timestamps, versioned } from './columns'
import { samples } from './investigation'
import { projects } from './projects'
import { namedUser } from './users'

export const oedometerTestType = pgEnum('oedometer_test_type', OEDOMETER_TEST_TYPES)
export const stageConvention = pgEnum('stage_convention', ['void-ratio', 'strain', 'dial'])

/** One loading stage as entered, with the void ratio it converts to. */
export interface OedometerStageJson {
  /** Vertical effective stress at the end of the stage, kPa. */
  stress: number
  /** The value as entered in the test's convention (e, strain %, or dial mm). */
  entered: number
  /** Void ratio at the end of the stage, converted from `entered`. */
  voidRatio: number
  /** Optional time–settlement readings of the stage (minutes, dial mm). */
  readings?: { minutes: number, dial: number }[]
}

/** An oedometer test on a sample: specimen data and stages (unload–reload loops allowed). */
export const oedometerTests = pgTable('oedometer_tests', {
  ...ownedRow('sampleId', () => samples.id),
  label: text().notNull(),
  testType: oedometerTestType().notNull(),
  /** Initial specimen height, mm. */
  specimenHeight: doublePrecision().notNull(),
  initialWaterContent: doublePrecision(),
  specificGravity: doublePrecision(),
  e0: doublePrecision().notNull(),
  convention: stageConvention().notNull(),
  stages: jsonb().$type<OedometerStageJson[]>().notNull(),
  remarks: text().notNull().default(''),
  ...versioned,
  ...timestamps,
}, t => [index('oedometer_tests_sample_idx').on(t.sampleId)])

/**
 * The σ'p an engineer adopted for a test, with the method and a reason. A new
 * adoption supersedes the current one; the earlier rows stay as history.
 */
export const preconsolidationAdoptions = pgTable('preconsolidation_adoptions', {
  ...ownedRow('projectId', () => projects.id),
  oedometerTestId: uuid().notNull().references(() => oedometerTests.id, { onDelete: 'cascade' }),
  /** casagrande | pachecoSilva | work | bilinear | dragged | typed */
  method: text().$type<AdoptionMethod>().notNull(),
  value: doublePrecision().notNull(),
  reason: text().notNull(),
  /** Sample quality at adoption (σ'v0 from the stress model then in force). */
  deltaEOverE0: doublePrecision(),
  qualityClass: text(),
  effectiveStress: doublePrecision(),
  adoptedBy: namedUser(),
  adoptedAt: moment().notNull().defaultNow(),
  supersededAt: moment(),
}, t => [
  index('preconsolidation_adoptions_test_idx').on(t.oedometerTestId, t.adoptedAt),
  index('preconsolidation_adoptions_project_idx').on(t.projectId),
])
