// `npm run bench` entry: runs every benchmark, prints a table and rewrites the
// measured sections of docs/performance.md.
import { cpus } from 'node:os'
import { resolve } from 'node:path'
import { execFileSync } from 'node:child_process'
import { runApiBench } from './api.bench'
import { replaceDocSection } from './doc'
import { BENCHES, type BenchRow } from './engine.bench'
import { lighthouseSection } from './lighthouse.bench'
import { runPointLogReportBench } from './point-log-report.bench'

function runInFreshProcess(name: string): BenchRow[] {
  const out = execFileSync(process.execPath, ['--import', 'tsx', resolve(import.meta.dirname, 'one.ts'), name], { encoding: 'utf8' })
  return JSON.parse(out.trim().split('\n').pop()!) as BenchRow[]
}

const fmt = (ms: number) => (ms < 10 ? ms.toFixed(2) : ms.toFixed(1))

async function main() {
  const rows: BenchRow[] = Object.keys(BENCHES).flatMap(runInFreshProcess)
  const api = await runApiBench()
  const reports = await runPointLogReportBench()
  const lines = [
    `Measured ${new Date().toISOString().slice(0, 10)} on ${cpus().length} × ${cpus()[0]?.model ?? 'CPU'}, Node ${process.version}.`,
    '',
    '| benchmark | Pastload (ms) | baseline (ms) | ratio | goal | met |',
    '|---|---:|---:|---:|---:|:-:|',
    ...rows.map(r => `| ${r.name}${r.note ? ` (${r.note})` : ''} | ${fmt(r.ours)} | ${fmt(r.baseline)} | ${r.ratio.toFixed(2)}× | ≤ ${r.goal}× | ${r.ratio <= r.goal ? 'yes' : 'no'} |`),
    '',
    '| API benchmark | median (ms) | p95 (ms) | calls | goal | met |',
    '|---|---:|---:|---:|---:|:-:|',
    `| POST /api/calc/settlement, 10 layers, 400 sublayers, loopback | ${fmt(api.median)} | ${fmt(api.p95)} | ${api.calls} | median ≤ 5 ms | ${api.median <= 5 ? 'yes' : 'no'} |`,
    `| POST /api/calc/settlement?sublayers=false, the same body without the rows | ${fmt(api.lean.median)} | ${fmt(api.lean.p95)} | ${api.calls} | median ≤ 5 ms | ${api.lean.median <= 5 ? 'yes' : 'no'} |`,
    `| POST /api/calc/settlement?sublayers=false with 20 000 Monte Carlo realisations inline (8 layers × 5 varying parameters, 80 sublayers) | ${fmt(api.probabilistic.median)} | ${fmt(api.probabilistic.p95)} | 15 | median ≤ 1500 ms | ${api.probabilistic.median <= 1500 ? 'yes' : 'no'} |`,
    '',
    '| report benchmark (PDF, loopback) | pages | median (ms) | p95 (ms) | calls | goal | met |',
    '|---|---:|---:|---:|---:|---:|:-:|',
    ...api.reports.map(r => `| ${r.name} | ${r.pages} | ${fmt(r.median)} | ${fmt(r.p95)} | ${r.calls} | median ≤ ${r.goalMs} ms | ${r.median <= r.goalMs ? 'yes' : 'no'} |`),
    '',
    '| import benchmark | Pastload (ms) | floor (ms) | ratio | goal | met |',
    '|---|---:|---:|---:|---:|:-:|',
    `| CPT CSV, ${api.import.rows.toLocaleString('en')} rows (${(api.import.bytes / 1048576).toFixed(1)} MB): upload + check + write over HTTP vs papaparse + COPY | ${fmt(api.import.ours)} | ${fmt(api.import.floor)} | ${api.import.ratio.toFixed(2)}× | ≤ 2× | ${api.import.ratio <= 2 ? 'yes' : 'no'} |`,
    '',
    '| browser benchmark (Chromium, no GPU) | median (ms) | p95 (ms) | goal | met |',
    '|---|---:|---:|---:|:-:|',
    `| stress canvas, ${api.browser.canvas.points.toLocaleString('en')} points: frame time during pan/zoom (${api.browser.canvas.frames} frames) | ${fmt(api.browser.canvas.frameMedianMs)} | ${fmt(api.browser.canvas.frameP95Ms)} | p95 ≤ 20 ms | ${api.browser.canvas.frameP95Ms <= 20 ? 'yes' : 'no'} |`,
    `| stress canvas: dense-layer redraw | – | ${fmt(api.browser.canvas.drawP95Ms)} | – | – |`,
    `| stress canvas: water-table edit → redrawn σ'v0 curve (${api.browser.canvas.edits} edits, includes the 60 ms debounce) | ${fmt(api.browser.canvas.editToCurveMedianMs)} | ${fmt(api.browser.canvas.editToCurveP95Ms)} | ≤ 150 ms | ${api.browser.canvas.editToCurveMedianMs <= 150 ? 'yes' : 'no'} |`,
    `| point page: CPT plot of 3 000 rows, draw after data arrives (${api.browser.cptDrawMs.length} loads) | ${fmt([...api.browser.cptDrawMs].sort((a, b) => a - b)[Math.floor(api.browser.cptDrawMs.length / 2)]!)} | ${fmt(Math.max(...api.browser.cptDrawMs))} (max) | < 200 ms | ${Math.max(...api.browser.cptDrawMs) < 200 ? 'yes' : 'no'} |`,
    '',
    '| report benchmark (server time) | median (ms) | p95 (ms) | pages | runs | goal | met |',
    '|---|---:|---:|---:|---:|---:|:-:|',
    ...reports.map(r => `| ${r.name} | ${fmt(r.median)} | ${fmt(r.p95)} | ${r.pages} | ${r.runs} | ≤ ${r.goal} ms | ${r.median <= r.goal ? 'yes' : 'no'} |`),
  ]
  const table = lines.join('\n')
  console.log(`\n${table}\n`)
  replaceDocSection('engine', table)
  const pagesTable = lighthouseSection(api.lighthouse)
  console.log(`\n${pagesTable}\n`)
  replaceDocSection('lighthouse', pagesTable)
}

main().catch((err: unknown) => {
  console.error(err)
  process.exit(1)
})
