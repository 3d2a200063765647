// A settlement-run report rendered in a worker thread, so a long report (a run with many named points runs to
// hundreds of pages) does not hold up the app's other requests. This file is the entry of a bundle: the build
// (nuxt.config.ts, `compiled` hook) bundles it with the TypeScript it imports into
// `.output/server/workers/report-render.bundle.mjs`; pdfmake stays a package (its font metrics are files).
// In: workerData.input (SettlementRunReportInput). Out: { type: 'done', pdf, pages } or { type: 'error', message }.
import { parentPort, workerData } from 'node:worker_threads'
import { settlementRunReport } from '../../shared/reports/settlement-run.ts'
import { renderReport } from '../services/reports/render.ts'

try {
  const { pdf, pages } = await renderReport(settlementRunReport(workerData.input))
  parentPort.postMessage({ type: 'done', pdf: new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength), pages })
}
catch (err) {
  parentPort.postMessage({ type: 'error', message: err instanceof Error ? err.message : String(err) })
}
