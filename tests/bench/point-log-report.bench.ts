// Report speed: the server's work for a 3-page stress-history log (document built from the point's data,
// drawn and rendered to PDF bytes), median of repeated renders in this process after warm-up.
import { renderReport } from '../../server/services/reports/render'
import { pointLogDocument } from '../../shared/reports/point-log'
import { reportDocument } from '../../shared/reports/sheet'
import { demoLogData } from '../helpers/point-log-data'
import { timeCalls } from './timing'

export interface ReportBenchRow { name: string, median: number, p95: number, runs: number, pages: number, goal: number }

async function timed(runs: number, fn: () => Promise<number>): Promise<{ median: number, p95: number, pages: number }> {
  const { median, p95, last } = await timeCalls(fn, { warmup: 3, calls: runs })
  return { median, p95, pages: last }
}

/** A 24 m borehole at 1:50: three pages of drawing, the key on the last. */
export async function runPointLogReportBench(runs = 20): Promise<ReportBenchRow[]> {
  const data = demoLogData()
  const log = await timed(runs, async () => (await renderReport(pointLogDocument(data, { scale: 50, revision: null }).doc)).pages)
  // The floor: the sheet's header, footer and fonts on three pages with one line each, in the same run.
  const header = { project: data.project, title: 'Stress-history log', subject: data.point.identifier, revision: null, units: data.units, approvedRecord: true }
  const floor = await timed(runs, async () => (await renderReport(reportDocument(header, [{ text: 'a' }, { text: 'b', pageBreak: 'before' }, { text: 'c', pageBreak: 'before' }]))).pages)
  return [
    { name: 'point log, 24 m borehole at 1:50: document, drawing and PDF bytes', ...log, runs, goal: 200 },
    { name: 'floor: the sheet alone, 3 pages of one line', ...floor, runs, goal: 200 },
  ]
}

if (import.meta.url === `file://${process.argv[1]}`) {
  runPointLogReportBench().then(rows => console.log(JSON.stringify(rows))).catch((err: unknown) => {
    console.error(err)
    process.exit(1)
  })
}
