import { MessageChannel } from 'node:worker_threads'
import { Piscina } from 'piscina'
import type { TDocumentDefinitions } from 'pdfmake/interfaces'
import { modelVersionDocument, type ModelVersionReportData } from '#shared/reports/model-version'
import { settlementRunReport, type SettlementRunReportInput } from '#shared/reports/settlement-run'
import type { ReportStage } from '#shared/types/reports'
import { findWorkerScript } from '~~/server/utils/worker-script'
import { renderReport } from './render'

/**
 * Long reports rendered off the request loop, in a bounded pool of worker threads (piscina) running the bundled
 * `workers/report-render.bundle.mjs` next to the built server: at most PASTLOAD_REPORT_WORKERS threads (default
 * 2) render at once, more wait in a short queue (beyond it: 503, busy), and a thread left idle for 30 s stops.
 * Without the bundle (development, unit tests) the report is rendered in this thread.
 */

export type PooledReport =
  | { kind: 'settlement-run', input: SettlementRunReportInput }
  | { kind: 'model-version', input: ModelVersionReportData }

const WORKER_FILE = 'report-render.bundle.mjs'
/** Reports waiting for a thread; beyond this the server answers busy. */
const QUEUE = 32
const IDLE_MS = 30_000
/** A thread's JavaScript heap: a report of hundreds of pages fits well within it. */
const WORKER_HEAP_MB = 1024

/** PASTLOAD_REPORT_WORKERS: a whole number from 1 to 16, else 2. */
export function reportWorkerCount(env: NodeJS.ProcessEnv = process.env): number {
  const n = Number(env.PASTLOAD_REPORT_WORKERS)
  return Number.isInteger(n) && n >= 1 && n <= 16 ? n : 2
}

let pool: Piscina | null = null

function reportPool(file: string): Piscina {
  pool ??= new Piscina({
    filename: file,
    minThreads: 0,
    maxThreads: reportWorkerCount(),
    maxQueue: QUEUE,
    idleTimeout: IDLE_MS,
    resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB },
  })
  return pool
}

function documentOf(task: PooledReport): TDocumentDefinitions {
  return task.kind === 'model-version' ? modelVersionDocument(task.input) : settlementRunReport(task.input)
}

/**
 * Renders a report in the pool (or in this thread without the bundle). `onStage` hears 'writing' once the
 * drawings are done and the PDF is being written.
 */
export async function renderPooledReport(task: PooledReport, onStage?: (stage: ReportStage) => void): Promise<{ pdf: Buffer, pages: number }> {
  const file = findWorkerScript(WORKER_FILE)
  if (!file) {
    const doc = documentOf(task)
    onStage?.('writing')
    return renderReport(doc)
  }
  const { port1, port2 } = new MessageChannel()
  port1.on('message', (m: { stage?: ReportStage }) => {
    if (m.stage) onStage?.(m.stage)
  })
  try {
    // The port is moved to the thread (piscina's transfer-list type follows the DOM's MessagePort).
    const opts = { transferList: [port2] } as unknown as NonNullable<Parameters<Piscina['run']>[1]>
    const out = await reportPool(file).run({ ...task, port: port2 }, opts) as { pdf: Uint8Array, pages: number }
    return { pdf: Buffer.from(out.pdf.buffer, out.pdf.byteOffset, out.pdf.byteLength), pages: out.pages }
  }
  catch (err) {
    if (err instanceof Error && /queue is at limit/i.test(err.message)) {
      throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'The server is making other reports; try again in a minute.', data: { code: 'busy' } })
    }
    throw err
  }
  finally {
    port1.close()
  }
}

/** The settlement-run report, rendered in the pool (a run with many named points makes hundreds of pages). */
export function renderSettlementRunReport(input: SettlementRunReportInput, onStage?: (stage: ReportStage) => void): Promise<{ pdf: Buffer, pages: number }> {
  return renderPooledReport({ kind: 'settlement-run', input }, onStage)
}

/** Stops the pool's threads (server close). */
export async function closeReportPool(): Promise<void> {
  const p = pool
  pool = null
  await p?.destroy()
}
