import { and, eq, inArray, sql } from 'drizzle-orm'
import { isError } from 'h3'
import { issueRequestOf } from '#shared/reports/issue-request'
import type { ReportStage } from '#shared/types/reports'
import { useDb } from '~~/server/db/client'
import { issuedReports } from '~~/server/db/schema'
import { publishLiveEvent } from '~~/server/services/live-events'
import { runJobSettingsFromEnv, startRunQueue, type RunJobSettings } from '~~/server/services/settlement-run-jobs'
import { deleteObject } from '~~/server/services/storage'
import { logServerError } from '~~/server/utils/error-log'
import { recordIssued, ReportNoLongerWanted, setReportEnqueuer, setReportRunner, storePdf } from './issued'
import { buildReport } from './registry'

/**
 * Long reports made by a job on the same pg-boss queue database as settlement runs (queue `report-issue`). The
 * job claims the queued row (`running`, one more attempt), builds the report with the letter it holds, writing
 * each step to the row and announcing it as `report.changed` — gathering the data, drawing the plots, writing
 * the PDF (both in the worker pool, `render-worker.ts`), storing it — then stores the PDF and completes the row
 * (`issued`, with its attachment, SHA-256 and audit entries) in one transaction, or marks it `failed` with a
 * plain reason. A row no longer queued or running is left alone, so a retried job does no harm; a worker that
 * died leaves the job to pg-boss, which starts it again after its expiry (at most MAX_REPORT_ATTEMPTS starts).
 */

export const REPORT_QUEUE = 'report-issue'
export const MAX_REPORT_ATTEMPTS = 3

/** How far along each step is, for the progress bar. */
export const STAGE_PROGRESS: Record<ReportStage, number> = { gathering: 0.05, drawing: 0.3, writing: 0.6, storing: 0.9 }

type Row = typeof issuedReports.$inferSelect

async function claim(reportId: string): Promise<Row | null> {
  return useDb().transaction(async (tx) => {
    const [row] = await tx.update(issuedReports)
      .set({ status: 'running', attempts: sql`${issuedReports.attempts} + 1`, stage: 'gathering', progress: STAGE_PROGRESS.gathering })
      .where(and(eq(issuedReports.id, reportId), inArray(issuedReports.status, ['queued', 'running'])))
      .returning()
    if (!row) return null
    await publishLiveEvent({ type: 'report.changed', projectId: row.projectId, entityId: row.id }, tx)
    return row
  })
}

async function writeStage(row: Row, stage: ReportStage): Promise<void> {
  await useDb().transaction(async (tx) => {
    const [u] = await tx.update(issuedReports).set({ stage, progress: STAGE_PROGRESS[stage] })
      .where(and(eq(issuedReports.id, row.id), eq(issuedReports.status, 'running')))
      .returning({ id: issuedReports.id })
    if (u) await publishLiveEvent({ type: 'report.changed', projectId: row.projectId, entityId: row.id }, tx)
  })
}

async function fail(row: Row, message: string, code: string): Promise<void> {
  await useDb().transaction(async (tx) => {
    const [u] = await tx.update(issuedReports).set({ status: 'failed', stage: null, errorMessage: message, errorCode: code })
      .where(and(eq(issuedReports.id, row.id), inArray(issuedReports.status, ['queued', 'running'])))
      .returning({ id: issuedReports.id })
    if (u) await publishLiveEvent({ type: 'report.changed', projectId: row.projectId, entityId: row.id }, tx)
  })
}

const RECORD_WORDS: Record<Row['kind'], string> = { 'settlement-run': 'run', 'model-version': 'site-model version', 'point-log': 'point' }

/** What a failed report tells the issuer: the builder's own 404 / 422 words, or a general one for a fault. */
export function describeReportError(err: unknown, kind: Row['kind']): { message: string, code: string } {
  if (isError(err) && err.statusCode === 404) return { message: `The ${RECORD_WORDS[kind]} this report is of no longer exists: it was deleted before the report was made.`, code: 'record-gone' }
  if (isError(err) && err.statusCode === 422) {
    const code = (err.data as { code?: unknown } | undefined)?.code
    return { message: err.message, code: typeof code === 'string' ? code : 'unprocessable' }
  }
  if (isError(err) && err.statusCode === 503) return { message: `${err.message} Issue the report again to try once more.`, code: 'busy' }
  logServerError('issued report could not be made', err)
  return { message: 'The report could not be made because of a fault in the server. Issue it again; if it fails again, tell the site administrator.', code: 'fault' }
}

/** Makes one queued report; the final status, or null when there was nothing to do. */
export async function executeReportJob(reportId: string): Promise<'issued' | 'failed' | null> {
  const row = await claim(reportId)
  if (!row) return null
  if (row.attempts > MAX_REPORT_ATTEMPTS) {
    await fail(row, `The report stopped ${MAX_REPORT_ATTEMPTS} times before it was stored (a worker was stopped or ran out of time). Issue it again, or ask the site administrator to check the workers.`, 'attempts-exhausted')
    return 'failed'
  }
  const req = issueRequestOf(row.kind, { id: row.sourceId, version: row.sourceVersion, options: row.sourceOptions })
  if (!req) {
    await fail(row, 'The record this report is of cannot be read back from the issued list.', 'bad-source')
    return 'failed'
  }
  let pending: Promise<void> = Promise.resolve()
  const onStage = (stage: ReportStage) => {
    pending = pending.then(() => writeStage(row, stage)).catch(err => logServerError('report progress write failed', err))
  }
  let stored: { objectKey: string, sha256: string } | null = null
  try {
    const build = await buildReport({ projectId: row.projectId, issue: { revision: row.revision, issuedBy: { name: row.issuedByName, date: row.issuedAt.toISOString().slice(0, 10) } }, onStage }, req)
    onStage('storing')
    await pending
    stored = await storePdf(row.projectId, build.pdf)
    const put = stored
    await useDb().transaction(tx => recordIssued(tx, { projectId: row.projectId, issuer: { id: row.issuedBy, name: row.issuedByName }, issuedAt: row.issuedAt, build, stored: put, revision: row.revision, target: { runningId: row.id } }))
    return 'issued'
  }
  catch (err) {
    await pending
    if (stored) await Promise.allSettled([deleteObject(stored.objectKey)])
    if (err instanceof ReportNoLongerWanted) return null
    const { message, code } = describeReportError(err, row.kind)
    await fail(row, message, code)
    return 'failed'
  }
}

/** Lets issuing hand long reports to the queue (started on first use), and makes them here when there is none. */
export function registerReportQueue(settings: RunJobSettings = runJobSettingsFromEnv()): void {
  setReportRunner(executeReportJob)
  setReportEnqueuer(async (reportId) => {
    const b = await startReportQueue(settings)
    await b.send(REPORT_QUEUE, { reportId }, { expireInSeconds: settings.expirySeconds, retryLimit: MAX_REPORT_ATTEMPTS, retryDelay: 1 })
  })
}

let created = false
/** The queue on the settlement runs' pg-boss (one per process). */
async function startReportQueue(settings: RunJobSettings) {
  const b = await startRunQueue(settings)
  if (!created) {
    await b.createQueue(REPORT_QUEUE, { name: REPORT_QUEUE, expireInSeconds: settings.expirySeconds, retryLimit: MAX_REPORT_ATTEMPTS, retryDelay: 1 })
    created = true
  }
  return b
}

let working = false
/** Takes report jobs in this process, one at a time (the pool renders up to PASTLOAD_REPORT_WORKERS at once across callers). */
export async function startReportWorker(settings: RunJobSettings = runJobSettingsFromEnv()): Promise<void> {
  const b = await startReportQueue(settings)
  if (working) return
  working = true
  await b.work<{ reportId: string }>(REPORT_QUEUE, { batchSize: 1, pollingIntervalSeconds: 1 }, async (jobs) => {
    for (const job of jobs) {
      const status = await executeReportJob(job.data.reportId)
      console.info(`[pastload:reports] report ${job.data.reportId}: ${status ?? 'nothing to do'}`)
    }
  })
  console.info(`[pastload:reports] report worker started (schema ${settings.schema})`)
}

/** Forgets the queue (the settlement runs' plugin stops pg-boss itself). */
export function stopReportQueue(): void {
  setReportEnqueuer(null)
  working = false
  created = false
}
