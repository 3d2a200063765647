import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { Worker } from 'node:worker_threads'
import { settlementRunReport, type SettlementRunReportInput } from '#shared/reports/settlement-run'
import { renderReport } from './render'

/**
 * The settlement-run report rendered off the request loop: in a worker thread running the bundled
 * `workers/report-render.bundle.mjs` next to the built server, or in this thread when there is no bundle
 * (development, unit tests).
 */

function workerScript(): string | null {
  let dir = dirname(fileURLToPath(import.meta.url))
  for (let i = 0; i < 6; i++) {
    const candidate = join(dir, 'workers', 'report-render.bundle.mjs')
    if (existsSync(candidate)) return candidate
    const up = dirname(dir)
    if (up === dir) break
    dir = up
  }
  return null
}

export function renderSettlementRunReport(input: SettlementRunReportInput): Promise<{ pdf: Buffer, pages: number }> {
  const script = workerScript()
  if (!script) return renderReport(settlementRunReport(input))
  return new Promise((resolve, reject) => {
    const w = new Worker(script, { workerData: { input } })
    let settled = false
    w.on('message', (m: { type: 'done', pdf: Uint8Array, pages: number } | { type: 'error', message: string }) => {
      settled = true
      if (m.type === 'done') resolve({ pdf: Buffer.from(m.pdf.buffer, m.pdf.byteOffset, m.pdf.byteLength), pages: m.pages })
      else reject(new Error(`the report could not be rendered: ${m.message}`))
      void w.terminate()
    })
    w.on('error', (err: Error) => {
      if (!settled) reject(err)
      settled = true
    })
    w.on('exit', (code) => {
      if (!settled) reject(new Error(`the report worker thread stopped (exit code ${code})`))
      settled = true
    })
  })
}
