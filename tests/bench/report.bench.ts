// Report speed: the settlement-run report (document + pdfmake rendering with its SVG plots) against the bare
// sheet rendered with the same number of pages of plain text lines, pdfmake's floor for that length.
import { performance } from 'node:perf_hooks'
import type { Content } from 'pdfmake/interfaces'
import { settlementRunReport, type SettlementRunReportInput } from '../../shared/reports/settlement-run'
import { reportDocument } from '../../shared/reports/sheet'
import { computeRun } from '../../shared/settlement-run/compute'
import type { RunLoad, RunOptions } from '../../shared/schemas/settlement-runs'
import { renderReport } from '../../server/services/reports/render'
import { scenarioDefinition } from '../helpers/scenario-definition'
import type { BenchRow } from './engine.bench'

async function bestOf(fn: () => Promise<unknown>, reps: number): Promise<number> {
  let ms = Infinity
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now()
    await fn()
    ms = Math.min(ms, performance.now() - t0)
  }
  return ms
}

/** The demo yard's stockpile run: an embankment, three named points, a 4 m grid. */
export async function runReportBench(): Promise<BenchRow> {
  const options: RunOptions = { maxSublayerThickness: 0.5, years: [1, 5, 50], designLife: 50, angularDistortionLimit: 1 / 500 }
  const loads: RunLoad[] = [{ type: 'embankment', label: 'Stockpile', x: 0, y: 0, crestWidth: 20, crestLength: 28, height: 3, sideSlope: 2, unitWeight: 20, rotation: 0 }]
  const points = [{ label: 'Crest', x: 0, y: 0 }, { label: 'Toe', x: 16, y: 0 }, { label: 'Gate', x: 30, y: 10 }]
  const grid = { spacing: 4, margin: 8 }
  const out = computeRun({ definition: scenarioDefinition(), loads, points, grid, options })
  const input: SettlementRunReportInput = {
    project: { name: 'Trent Wharf yard', jobNumber: 'TRN-0417', client: 'Harbour Board', unitSystem: 'SI' },
    run: {
      id: 'bench', name: 'Stockpile on the yard', status: 'finished', progress: 1, error: null,
      model: { modelId: 'bench', modelName: 'Yard model', version: 1, status: 'approved', approvedBy: 'Reviewer', approvedAt: new Date('2026-11-20') },
      loads, points, grid, options, createdBy: null, createdAt: new Date('2026-12-01'), startedAt: null, finishedAt: new Date('2026-12-01'),
      results: out.results,
    },
    details: out.details,
    issue: { revision: 'A', issuedBy: { name: 'Designer', date: '2026-12-03' } },
  }
  const ours = () => renderReport(settlementRunReport(input))
  const { pages } = await ours()
  const lines: Content[] = Array.from({ length: pages * 52 }, (_, i) => ({ text: `Line ${i + 1}` }))
  const floor = () => renderReport(reportDocument({ project: input.project, title: 'Settlement run', subject: 'Floor', revision: 'A', units: 'SI', approvedRecord: true }, lines))
  const floorPages = (await floor()).pages
  await ours()
  await floor()
  let o = Infinity
  let b = Infinity
  for (let r = 0; r < 5; r++) {
    o = Math.min(o, await bestOf(ours, 1))
    b = Math.min(b, await bestOf(floor, 1))
  }
  return { name: `settlement-run report, ${pages} pages (3 named points, plan with contours, 6 plots)`, ours: o, baseline: b, ratio: o / b, goal: 4, note: `baseline: the sheet with ${floorPages} pages of text lines` }
}
