// A report rendered in a worker thread of the bounded pool in server/services/reports/render-worker.ts, so a
// long report (a run with many named points runs to hundreds of pages) does not hold up the app's other
// requests. This file is the entry of a bundle: the build (nuxt.config.ts, `compiled` hook) bundles it with the
// TypeScript it imports into `.output/server/workers/report-render.bundle.mjs`; pdfmake stays a package (its
// font metrics are files).
// Task: { kind: 'settlement-run' | 'model-version', input, port? }. The document is built here (the drawings),
// then `{ stage: 'writing' }` is posted on `port` and the PDF written. Answer: { pdf: Uint8Array, pages }.
import { modelVersionDocument } from '#shared/reports/model-version'
import { settlementRunReport } from '#shared/reports/settlement-run'
import { renderReport } from '../services/reports/render.ts'

export default async function renderTask({ kind, input, port }) {
  try {
    const doc = kind === 'model-version' ? modelVersionDocument(input) : settlementRunReport(input)
    port?.postMessage({ stage: 'writing' })
    const { pdf, pages } = await renderReport(doc)
    return { pdf: new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength), pages }
  }
  finally {
    port?.close()
  }
}
