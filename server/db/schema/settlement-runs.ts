import { index, integer, jsonb, pgEnum, pgTable, primaryKey, real, text, uuid } from 'drizzle-orm/pg-core'
import type { RunGrid, RunLoad, RunOptions, RunPoint } from '#shared/schemas/settlement-runs'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import type { RunScatterData } from '#shared/settlement-run/probabilistic'
import type { RunPointDetail, RunResults, ServerRunModel } from '#shared/types/settlement-runs'
import { createdAt, moment, ownedRow } from './columns'
import { projects } from './projects'
import { namedUser } from './users'

export const settlementRunStatus = pgEnum('settlement_run_status', ['queued', 'running', 'finished', 'failed', 'cancelled'])

/**
 * A settlement run: immutable inputs (the model version's definition copied in, so the run
 * stands even if the model goes), progress while a worker computes it, and results written
 * once, in one transaction, at the end.
 */
export const settlementRuns = pgTable('settlement_runs', {
  ...ownedRow('projectId', () => projects.id),
  name: text().notNull(),
  /** The model version used and its status at run time (`ServerRunModel`). */
  model: jsonb().$type<ServerRunModel>().notNull(),
  /** The version's definition as it was run. */
  definition: jsonb().$type<SiteModelDefinition>().notNull(),
  loads: jsonb().$type<RunLoad[]>().notNull(),
  points: jsonb().$type<RunPoint[]>().notNull(),
  grid: jsonb().$type<RunGrid>(),
  options: jsonb().$type<RunOptions>().notNull(),
  /** A probabilistic run "from the data": the COVs and σ'p fit covariances as they stood when the run was made. */
  scatter: jsonb().$type<RunScatterData>(),
  status: settlementRunStatus().notNull().default('queued'),
  /** 0–1 while running. */
  progress: real().notNull().default(0),
  errorMessage: text(),
  errorCode: text(),
  /** Times a worker started it (a crashed worker's run is started again). */
  attempts: integer().notNull().default(0),
  results: jsonb().$type<RunResults>(),
  createdBy: namedUser(),
  createdAt: createdAt(),
  startedAt: moment(),
  finishedAt: moment(),
}, t => [
  index('settlement_runs_project_idx').on(t.projectId, t.createdAt),
  index('settlement_runs_status_idx').on(t.status),
])

/** One named point's full result (the sublayer table), written with the run's results. */
export const settlementRunPoints = pgTable('settlement_run_points', {
  runId: uuid().notNull().references(() => settlementRuns.id, { onDelete: 'cascade' }),
  index: integer().notNull(),
  detail: jsonb().$type<RunPointDetail>().notNull(),
}, t => [primaryKey({ columns: [t.runId, t.index] })])
