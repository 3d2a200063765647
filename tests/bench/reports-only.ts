// `npm run bench -- --reports`: the report benchmarks alone (the demo's model report and borehole log over
// HTTP against the built server with the demo seeded, then the in-process log and sheet), printed as a table.
import { startServer } from '../helpers/server'
import { runPointLogReportBench } from './point-log-report.bench'
import { runModelReportBench, runPointLogHttpBench, signInDemoDesigner } from './reports.bench'

const fmt = (ms: number) => (ms < 10 ? ms.toFixed(2) : ms.toFixed(1))

async function main() {
  const server = await startServer({ PASTLOAD_SEED: 'demo' })
  try {
    const cookie = await signInDemoDesigner(server.url)
    const http = [await runModelReportBench(server.url, cookie), await runPointLogHttpBench(server.url, cookie)]
    const inProcess = await runPointLogReportBench()
    console.log([
      `Measured ${new Date().toISOString().slice(0, 10)}, Node ${process.version}.`,
      '',
      '| report benchmark (PDF, loopback) | pages | median (ms) | p95 (ms) | calls | goal | met |',
      '|---|---:|---:|---:|---:|---:|:-:|',
      ...http.map(r => `| ${r.name} | ${r.pages} | ${fmt(r.median)} | ${fmt(r.p95)} | ${r.calls} | median ≤ ${r.goalMs} ms | ${r.median <= r.goalMs ? 'yes' : 'no'} |`),
      '',
      '| report benchmark (server time, in process) | median (ms) | p95 (ms) | pages | runs | goal | met |',
      '|---|---:|---:|---:|---:|---:|:-:|',
      ...inProcess.map(r => `| ${r.name} | ${fmt(r.median)} | ${fmt(r.p95)} | ${r.pages} | ${r.runs} | ≤ ${r.goal} ms | ${r.median <= r.goal ? 'yes' : 'no'} |`),
    ].join('\n'))
  }
  finally {
    await server.stop()
  }
}

main().catch((err: unknown) => {
  console.error(err)
  process.exit(1)
})
