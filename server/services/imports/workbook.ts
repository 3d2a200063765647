import { unzipSync } from 'fflate'
import { Piscina } from 'piscina'
import { WORKBOOK_UNPACKED_LIMIT, workbookTooLarge } from '#shared/imports/limits'
import { findWorkerScript } from '~~/server/utils/worker-script'
import type { Cell } from './files'

/**
 * Workbooks are read off the request thread: first their ZIP directory is
 * summed (a small file can unpack to hundreds of megabytes), then a worker of a
 * small pool parses the sheet with a row bound, a memory ceiling and a time
 * limit, so one file can neither stall the server nor grow it without bound.
 */

const WORKER_FILE = 'read-workbook.mjs'
/** Workbooks read at once; more wait in a short queue, beyond it the server is busy (503). */
const THREADS = 2
const QUEUE = 16
const READ_TIMEOUT_MS = 60_000
/** A worker's JavaScript heap; a 50 MB sheet reads well within it. */
const WORKER_HEAP_MB = 1024

export class WorkbookRefusal extends Error {
  constructor(message: string, readonly status: 422 | 503, readonly code: string) {
    super(message)
  }
}

/** The unpacked size of every part of a ZIP file, from its central directory (nothing is unpacked). */
export function unpackedSize(buf: Uint8Array): number {
  let total = 0
  unzipSync(buf, {
    filter(file) {
      total += file.originalSize
      return false
    },
  })
  return total
}

/** Throws the limit's message when the workbook unpacks beyond it; a broken ZIP is left to the reader's own message. */
export function checkUnpackedSize(buf: Uint8Array, filename: string): void {
  let size: number
  try {
    size = unpackedSize(buf)
  }
  catch {
    return
  }
  if (size > WORKBOOK_UNPACKED_LIMIT) throw workbookTooLarge(filename, size)
}

/** The worker script: next to the built server (`.output/server/workers/`) or in the sources (`server/workers/`). */
function workerPath(): string {
  const found = findWorkerScript(WORKER_FILE, { sources: true })
  if (!found) throw new Error(`The workbook reader (${WORKER_FILE}) is missing from the server build.`)
  return found
}

let pool: Piscina | null = null

function workbookPool(): Piscina {
  pool ??= new Piscina({
    filename: workerPath(),
    minThreads: 0,
    maxThreads: THREADS,
    maxQueue: QUEUE,
    idleTimeout: 30_000,
    resourceLimits: { maxOldGenerationSizeMb: WORKER_HEAP_MB },
  })
  return pool
}

export interface WorkbookGrid {
  sheets: string[]
  sheet: string
  grid: Cell[][]
  /** The chosen sheet has `sheetRows` rows or more; only those were read. */
  truncated: boolean
}

type WorkerAnswer = WorkbookGrid | { refusal: 'unreadable' | 'no-such-sheet' | 'no-sheets', sheets?: string[] }

/** Reads one sheet (the first unless named), at most `sheetRows` rows of it, in the pool. */
export async function readWorkbookGrid(buf: Uint8Array, filename: string, sheet: string | undefined, sheetRows: number): Promise<WorkbookGrid> {
  checkUnpackedSize(buf, filename)
  const workers = workbookPool()
  let answer: WorkerAnswer
  try {
    // The bytes are copied to the worker (at most the 25 MB upload limit).
    answer = await workers.run({ data: buf, sheet, sheetRows }, { signal: AbortSignal.timeout(READ_TIMEOUT_MS) }) as WorkerAnswer
  }
  catch (err) {
    throw refusalOf(err, filename)
  }
  if ('refusal' in answer) {
    if (answer.refusal === 'no-such-sheet') throw new WorkbookRefusal(`${filename} has no sheet named "${sheet}".`, 422, 'no-such-sheet')
    if (answer.refusal === 'no-sheets') throw new WorkbookRefusal(`${filename} has no sheets.`, 422, 'empty-file')
    throw new WorkbookRefusal(`${filename} could not be read as an Excel workbook.`, 422, 'wrong-type')
  }
  return answer
}

function refusalOf(err: unknown, filename: string): WorkbookRefusal {
  const name = err instanceof Error ? err.name : ''
  const code = err && typeof err === 'object' && 'code' in err ? String(err.code) : ''
  const message = err instanceof Error ? err.message : ''
  if (name === 'AbortError' || name === 'TimeoutError') return new WorkbookRefusal(`${filename} took longer than ${READ_TIMEOUT_MS / 1000} s to read; split it or save the sheet you need as CSV.`, 422, 'workbook-too-slow')
  if (code === 'ERR_WORKER_OUT_OF_MEMORY') return new WorkbookRefusal(`${filename} needs more memory to read than an import may use; split it or save the sheet you need as CSV.`, 422, 'workbook-too-large')
  if (/queue is at limit/i.test(message)) return new WorkbookRefusal('The server is reading other workbooks; try again in a minute.', 503, 'busy')
  return new WorkbookRefusal(`${filename} could not be read as an Excel workbook.`, 422, 'wrong-type')
}
