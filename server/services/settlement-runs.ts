import { and, count, desc, eq, getTableColumns, inArray, sql, type SQL } from 'drizzle-orm'
import { buildStressModel, createStressEvaluator } from '#shared/geotech/stress'
import type { CreateSettlementRun, SettlementRunQuery } from '#shared/schemas/settlement-runs'
import { checkRunInput, gridAxes, resolveLoads, type RunComputeInput } from '#shared/settlement-run/compute'
import { isTreated } from '#shared/settlement-run/treatment'
import { ModelIncompleteError, toSettlementLayers, toStressInput } from '#shared/site-model/convert'
import { groupThousands } from '#shared/text/count'
import type { RunPointDetail, ServerRunModel, ServerSettlementRun, ServerSettlementRunList, ServerSettlementRunSummary, ServerSettlementRunView, RunResultsSummary } from '#shared/types/settlement-runs'
import { useDb } from '~~/server/db/client'
import { settlementRunPoints, settlementRuns, users } from '~~/server/db/schema'
import { runEngine } from '~~/server/utils/engine'
import { logServerError } from '~~/server/utils/error-log'
import { recordAudit } from './audit'
import { notFound, unprocessableError } from './http-errors'
import { publishLiveEvent } from './live-events'
import { requireModel, requireVersion } from './model-versions'
import { executeRun, failRun } from './settlement-run-execution'
import { runScatterData } from './settlement-run-scatter'
import { RUN_PROBABILISTIC_WORK } from '#shared/schemas/settlement-run-limits'
import { gridNodeRealizations, unknownScatterStrata, type RunScatterData } from '#shared/settlement-run/probabilistic'

/**
 * Settlement runs of a project: create (the model version's definition copied in, the input
 * checked, then computed at once when small or handed to the job queue), read, list with the
 * headline figures, one point's sublayer table, delete by the creator.
 */

type RunRow = typeof settlementRuns.$inferSelect

/** Runs up to this many estimated sublayer evaluations (points × sublayers, no grid) are computed in the request. */
export const INLINE_SUBLAYER_LIMIT = 2500
/** A named point of a treated run counts as this many plain ones against that limit. */
export const TREATED_POINT_WEIGHT = 4

/** Hands a run to the job queue; set by the job service when it starts (else runs are computed inline). */
let enqueue: ((runId: string) => Promise<void>) | null = null
export function setRunEnqueuer(fn: ((runId: string) => Promise<void>) | null): void {
  enqueue = fn
}

/** Sublayers one point needs, estimated from the compressible strata and the sublayer thickness. */
export function estimatedSublayers(input: Pick<RunComputeInput, 'definition' | 'options'>): number {
  return input.definition.strata.reduce((n, s) => n + (s.compressible ? Math.max(1, Math.ceil(s.thickness / input.options.maxSublayerThickness)) : 0), 0)
}

/** How many grid points a run's grid has (0 without a grid). */
export function gridPointCount(input: Pick<RunComputeInput, 'loads' | 'grid'>): number {
  if (!input.grid) return 0
  const axes = gridAxes(resolveLoads(input.loads), input.grid)
  return axes ? axes.xs.length * axes.ys.length : 0
}

/** Refuses (422) a run this site or this model cannot compute: off-site loads, too large a grid, missing compressibility, σ'v0 ≤ 0. */
function assertRunnable(input: RunComputeInput): void {
  const problem = checkRunInput(input)
  if (problem) throw unprocessableError(problem.message, { code: problem.code, ...(problem.path ? { path: problem.path } : {}) })
  runEngine(() => {
    const stress = toStressInput(input.definition)
    buildStressModel(stress)
    const evaluate = createStressEvaluator(stress)
    try {
      toSettlementLayers(input.definition, z => evaluate(z).effectiveStress, { maxThickness: input.options.maxSublayerThickness })
    }
    catch (err) {
      if (err instanceof ModelIncompleteError) throw unprocessableError(`Version cannot be used for settlement: ${err.message}`, { code: 'model-incomplete' })
      throw err
    }
  })
}

async function runModelOf(projectId: string, modelId: string, version: number) {
  const model = await requireModel(projectId, modelId)
  const v = await requireVersion(modelId, version)
  const [approver] = v.status === 'approved' && v.decidedBy
    ? await useDb().select({ name: users.displayName }).from(users).where(eq(users.id, v.decidedBy))
    : []
  const runModel: ServerRunModel = {
    modelId: model.id,
    modelName: model.name,
    version: v.version,
    status: v.status,
    approvedBy: v.status === 'approved' ? (approver?.name ?? null) : null,
    approvedAt: v.status === 'approved' ? (v.decidedAt ?? null) : null,
  }
  return { runModel, definition: v.definition }
}

/**
 * Refuses (422) a probabilistic run that names a stratum the version lacks (or one not compressible),
 * or asks for more work than a job does: the named points' realisations × sublayers, or a grid
 * whose nodes cannot have even the fewest realisations within the grid's budget.
 */
function assertProbabilisticRunnable(input: RunComputeInput): void {
  const p = input.options.probabilistic
  if (!p) return
  const unknown = unknownScatterStrata(input.definition, p)
  if (unknown.length > 0) {
    throw unprocessableError(unknown.map(u => u.message).join(' '), {
      code: 'stratum-unknown',
      issues: unknown.map(u => ({ path: `options.probabilistic.layers.${u.code}`, message: u.message })),
    })
  }
  const sublayers = estimatedSublayers(input)
  const work = input.points.length * p.realizations * sublayers
  const w = RUN_PROBABILISTIC_WORK
  if (work > w.points) {
    throw unprocessableError(`${p.realizations} realisations at ${input.points.length} points of about ${sublayers} sublayers are ${groupThousands(work, ',')} realisation-sublayers; a run may ask for at most ${groupThousands(w.points, ',')}. Use fewer realisations or points, or thicker sublayers.`, { code: 'too-much-work', path: ['options', 'probabilistic', 'realizations'] })
  }
  const nodes = gridPointCount(input)
  if (nodes > 0 && gridNodeRealizations(p.realizations, nodes, sublayers) === 0) {
    throw unprocessableError(`The grid's ${nodes} nodes of about ${sublayers} sublayers cannot have ${w.gridNodeMinimum} realisations each within ${groupThousands(w.grid, ',')} realisation-sublayers. Use a larger grid spacing or thicker sublayers, or leave out the grid.`, { code: 'too-much-work', path: ['grid', 'spacing'] })
  }
}

/** Creates a run: 404 for a model or version not of this project, 422 for a run that cannot be computed here. */
export async function createSettlementRun(projectId: string, userId: string, body: CreateSettlementRun): Promise<{ run: { id: string, status: ServerSettlementRun['status'] } }> {
  const { runModel, definition } = await runModelOf(projectId, body.model.modelId, body.model.version)
  const input: RunComputeInput = { definition, loads: body.loads, points: body.points, grid: body.grid ?? null, options: body.options }
  assertRunnable(input)
  assertProbabilisticRunnable(input)
  // "From the data": the COVs and σ'p fits as they stand now, stored with the run so a rerun of the job draws the same.
  const probabilistic = body.options.probabilistic
  const scatter: RunScatterData | null = probabilistic?.fromData ? await runScatterData(projectId, definition, body.options.drains) : null
  const row = await useDb().transaction(async (tx) => {
    const [r] = await tx.insert(settlementRuns).values({
      projectId,
      name: body.name,
      model: runModel,
      definition,
      loads: body.loads,
      points: body.points,
      grid: body.grid ?? null,
      options: body.options,
      scatter,
      status: 'queued',
      createdBy: userId,
    }).returning()
    if (!r) throw new Error('the run row was not written')
    await recordAudit({ actorId: userId, projectId, action: 'create', entity: 'settlement-run', entityId: r.id, after: { name: body.name, model: { modelId: runModel.modelId, version: runModel.version } } }, tx)
    await publishLiveEvent({ type: 'run.changed', projectId, entityId: r.id }, tx)
    return r
  })
  // A treated point (schedule, removal, drains) costs several plain ones: its time rate is a superposition.
  const weight = isTreated(input.loads, input.options.drains) ? TREATED_POINT_WEIGHT : 1
  // A probabilistic run always goes to the queue (computed here only when this process has none).
  const small = !probabilistic && !input.grid && weight * input.points.length * estimatedSublayers(input) <= INLINE_SUBLAYER_LIMIT
  if (small || !enqueue) {
    const status = await executeRun(row.id)
    return { run: { id: row.id, status: status ?? 'queued' } }
  }
  try {
    await enqueue(row.id)
  }
  catch (err) {
    logServerError('settlement run could not be queued', err)
    await failRun(row.id, projectId, 'The run could not be queued for a worker. Try again; if it fails again, tell the site administrator.', 'queue-unavailable')
    return { run: { id: row.id, status: 'failed' } }
  }
  return { run: { id: row.id, status: 'queued' } }
}

const { results: runResults, ...runColumns } = getTableColumns(settlementRuns)
/** The results as stored. */
const wholeResults = sql<RunRow['results']>`${runResults}`
/**
 * The results with each point's time curve taken out in the database, so the curves (most of a finished run's
 * results) are neither read nor sent; the points keep their order.
 */
const resultsWithoutCurves = sql<RunResultsSummary | null>`case when ${runResults} is null then null else jsonb_set(${runResults}, '{points}', coalesce((select jsonb_agg(e.p - 'curve' order by e.n) from jsonb_array_elements(${runResults}->'points') with ordinality as e(p, n)), '[]'::jsonb)) end`

/** A run of the project with its creator's name; its results read whole, or as `results` says. */
async function requireRun(projectId: string, runId: string): Promise<RunRow & { creatorName: string | null }>
async function requireRun<R>(projectId: string, runId: string, results: SQL<R>): Promise<Omit<RunRow, 'results'> & { results: R, creatorName: string | null }>
async function requireRun(projectId: string, runId: string, results: SQL<unknown> = wholeResults): Promise<Omit<RunRow, 'results'> & { results: unknown, creatorName: string | null }> {
  const [r] = await useDb().select({ ...runColumns, results, creatorName: users.displayName }).from(settlementRuns)
    .leftJoin(users, eq(users.id, settlementRuns.createdBy))
    .where(and(eq(settlementRuns.id, runId), eq(settlementRuns.projectId, projectId)))
  if (!r) notFound('Settlement run')
  return r
}

/** A run row as the API answers it; `R` is what its results hold (whole, or without the points' time curves). */
function toRun<R>(r: Omit<RunRow, 'results'> & { results: R | null, creatorName: string | null }): Omit<ServerSettlementRun, 'results'> & { results: R | null } {
  return {
    id: r.id,
    name: r.name,
    status: r.status,
    progress: r.progress,
    error: r.errorMessage ? { message: r.errorMessage, code: r.errorCode } : null,
    model: r.model,
    loads: r.loads,
    points: r.points,
    grid: r.grid ?? null,
    options: r.options,
    createdBy: r.createdBy ? { id: r.createdBy, name: r.creatorName ?? '' } : null,
    createdAt: r.createdAt,
    startedAt: r.startedAt,
    finishedAt: r.finishedAt,
    results: r.status === 'finished' ? r.results ?? null : null,
  }
}

/** One run; with `curves` 'none' its points' results leave out their time curves. */
export async function getSettlementRun(projectId: string, runId: string, curves?: 'all'): Promise<{ run: ServerSettlementRun }>
export async function getSettlementRun(projectId: string, runId: string, curves: SettlementRunQuery['curves']): Promise<{ run: ServerSettlementRun | ServerSettlementRunView }>
export async function getSettlementRun(projectId: string, runId: string, curves: SettlementRunQuery['curves'] = 'all'): Promise<{ run: ServerSettlementRun | ServerSettlementRunView }> {
  return { run: curves === 'none' ? toRun(await requireRun(projectId, runId, resultsWithoutCurves)) : toRun(await requireRun(projectId, runId)) }
}

/** The project's runs, newest first, with their headline figures (read from the results in the database, not loaded whole). */
export async function listSettlementRuns(projectId: string, page: { limit: number, offset: number }): Promise<ServerSettlementRunList> {
  const db = useDb()
  const r = settlementRuns
  const rows = await db.select({
    id: r.id, name: r.name, status: r.status, progress: r.progress, model: r.model, createdBy: r.createdBy, creatorName: users.displayName,
    createdAt: r.createdAt, finishedAt: r.finishedAt, loads: r.loads, points: r.points, grid: r.grid,
    maximum: sql<{ settlement: number, x: number, y: number, label: string | null } | null>`${r.results}->'maximum'`,
    t90: sql<number | null>`(select max((p->>'t90')::float8) from jsonb_array_elements(${r.results}->'points') p)`,
    angular: sql<number | null>`(${r.results}->'grid'->>'maxAngularDistortion')::float8`,
  }).from(r).leftJoin(users, eq(users.id, r.createdBy))
    .where(eq(r.projectId, projectId))
    .orderBy(desc(r.createdAt), desc(r.id))
    .limit(page.limit).offset(page.offset)
  const [total] = await db.select({ n: count() }).from(r).where(eq(r.projectId, projectId))
  const runs: ServerSettlementRunSummary[] = rows.map(row => ({
    id: row.id,
    name: row.name,
    status: row.status,
    progress: row.progress,
    model: row.model,
    createdBy: row.createdBy ? { id: row.createdBy, name: row.creatorName ?? '' } : null,
    createdAt: row.createdAt,
    finishedAt: row.finishedAt,
    loadCount: row.loads.length,
    pointCount: row.points.length,
    gridPoints: gridPointCount({ loads: row.loads, grid: row.grid ?? null }),
    headline: row.status === 'finished' && row.maximum
      ? {
          maxSettlement: row.maximum.settlement,
          maxAt: { x: row.maximum.x, y: row.maximum.y, label: row.maximum.label },
          t90: row.t90 === null ? null : Number(row.t90),
          maxAngularDistortion: row.angular === null ? null : Number(row.angular),
        }
      : null,
  }))
  return { runs, total: total?.n ?? 0 }
}

/** One named point's sublayer table: 404 beyond the run's points, 409 until the run has finished. */
export async function settlementRunPoint(projectId: string, runId: string, index: number): Promise<{ point: RunPointDetail }> {
  const run = await requireRun(projectId, runId)
  if (index >= run.points.length) notFound(`Point ${index}`)
  if (run.status !== 'finished') {
    throw createError({
      statusCode: 409,
      statusMessage: 'Conflict',
      message: run.status === 'failed' ? 'The run failed: it has no point results.' : run.status === 'cancelled' ? 'The run was cancelled: it has no point results.' : `The run is ${run.status}: point results are ready when it has finished.`,
      data: { status: run.status, progress: run.progress },
    })
  }
  const [p] = await useDb().select({ detail: settlementRunPoints.detail }).from(settlementRunPoints)
    .where(and(eq(settlementRunPoints.runId, runId), eq(settlementRunPoints.index, index)))
  if (!p) notFound(`Point ${index}`)
  return { point: p.detail }
}

/** Deletes a run: only the person who made it (403 for anyone else). */
export async function deleteSettlementRun(projectId: string, userId: string, runId: string): Promise<void> {
  const run = await requireRun(projectId, runId)
  if (run.createdBy !== userId) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Only the person who made this run can delete it.' })
  }
  await useDb().transaction(async (tx) => {
    const [gone] = await tx.delete(settlementRuns).where(and(eq(settlementRuns.id, runId), eq(settlementRuns.projectId, projectId))).returning({ id: settlementRuns.id })
    if (!gone) notFound('Settlement run')
    await recordAudit({ actorId: userId, projectId, action: 'delete', entity: 'settlement-run', entityId: runId, before: { name: run.name, status: run.status, model: { modelId: run.model.modelId, version: run.model.version } } }, tx)
    await publishLiveEvent({ type: 'run.changed', projectId, entityId: runId }, tx)
  })
}

/**
 * Cancels a queued or running run: 409 for a run already finished, failed or cancelled (for anyone
 * who may run settlements: the state is no secret), else the run's creator or a project owner (403
 * for anyone else). The worker stops at its next progress write and
 * never writes results (they are written only to a run still queued or running).
 */
export async function cancelSettlementRun(projectId: string, user: { id: string, role: string }, runId: string): Promise<{ run: { id: string, status: ServerSettlementRun['status'] } }> {
  const run = await requireRun(projectId, runId)
  const ended = (status: string) => createError({ statusCode: 409, statusMessage: 'Conflict', message: `The run is ${status}: only a queued or running run can be cancelled.`, data: { status } })
  if (run.status !== 'queued' && run.status !== 'running') throw ended(run.status)
  if (run.createdBy !== user.id && user.role !== 'owner') {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Only the person who made this run or a project owner can cancel it.' })
  }
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(settlementRuns)
      .set({ status: 'cancelled', finishedAt: new Date() })
      .where(and(eq(settlementRuns.id, runId), eq(settlementRuns.projectId, projectId), inArray(settlementRuns.status, ['queued', 'running'])))
      .returning({ id: settlementRuns.id, status: settlementRuns.status })
    if (!row) {
      // Finished (or failed) between the read and the update.
      const [now] = await tx.select({ status: settlementRuns.status }).from(settlementRuns).where(eq(settlementRuns.id, runId))
      throw ended(now?.status ?? 'gone')
    }
    await recordAudit({ actorId: user.id, projectId, action: 'update', entity: 'settlement-run', entityId: runId, before: { status: run.status }, after: { status: 'cancelled' } }, tx)
    await publishLiveEvent({ type: 'run.changed', projectId, entityId: runId }, tx)
    return { run: { id: row.id, status: row.status } }
  })
}

/** The run row for the export (404 for another project's run). */
export async function settlementRunForExport(projectId: string, runId: string): Promise<{ run: ServerSettlementRun, details: RunPointDetail[] }> {
  const run = toRun(await requireRun(projectId, runId))
  const details = run.status === 'finished'
    ? (await useDb().select({ detail: settlementRunPoints.detail }).from(settlementRunPoints).where(eq(settlementRunPoints.runId, runId)).orderBy(settlementRunPoints.index)).map(p => p.detail)
    : []
  return { run, details }
}
