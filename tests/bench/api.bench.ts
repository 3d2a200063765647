// Median latency of the compute API on loopback against the built server.
import { startServer } from '../helpers/server'
import { runBrowserBench } from './browser.bench'
import { runImportBench } from './import.bench'
import { runLighthouseBench } from './lighthouse.bench'
import { type ReportBenchRow, runModelReportBench, runPointLogHttpBench, signInDemoDesigner } from './reports.bench'
import { timeCalls } from './timing'

/** A 10-layer profile whose compressible layers make 400 sublayers in all. */
export function tenLayerSettlementBody() {
  const layers = Array.from({ length: 10 }, (_, i) => {
    const compressible = i >= 1 && i <= 8
    return {
      name: `Layer ${i + 1}`,
      thickness: 2.5,
      unitWeight: 18,
      unitWeightSaturated: 18.5,
      compressible,
      ...(compressible ? { cc: 0.5 + 0.02 * i, cr: 0.05, e0: 1.5, preconsolidation: { type: 'pop', value: 20 + i }, cv: 2 } : {}),
    }
  })
  // 8 compressible layers × 2.5 m / 0.05 m = 400 sublayers.
  return { layers, groundwater: { waterTableDepth: 1.6 }, load: { type: 'rectangle', width: 80, length: 120, pressure: 120 }, sublayers: { maxThickness: 0.05 }, time: { years: [0.5, 1, 2, 5, 10] } }
}

/**
 * Median and p95 latency of `POST /api/calc/settlement` with the ten-layer body, with the sublayer
 * rows (the default) or without them (`?sublayers=false`), after 30 warm-up calls.
 */
export async function measureCalcSettlement(url: string, cookie: string, calls: number, sublayers: boolean): Promise<{ median: number, p95: number }> {
  const body = JSON.stringify(tenLayerSettlementBody())
  const path = sublayers ? '/api/calc/settlement' : '/api/calc/settlement?sublayers=false'
  const call = async () => {
    const r = await fetch(`${url}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': url, cookie }, body })
    const json = await r.json() as { sublayers?: unknown[] }
    if (!r.ok || (sublayers ? json.sublayers?.length !== 400 : json.sublayers !== undefined)) throw new Error(`bench call failed: ${r.status}`)
  }
  const { median, p95 } = await timeCalls(call, { warmup: 30, calls })
  return { median, p95 }
}

export async function runApiBench(calls = 300): Promise<{ median: number, p95: number, lean: { median: number, p95: number }, calls: number, import: Awaited<ReturnType<typeof runImportBench>>, browser: Awaited<ReturnType<typeof runBrowserBench>>, lighthouse: Awaited<ReturnType<typeof runLighthouseBench>>, reports: ReportBenchRow[] }> {
  const server = await startServer({ PASTLOAD_SEED: 'demo' })
  try {
    const cookie = await signInDemoDesigner(server.url)
    const full = await measureCalcSettlement(server.url, cookie, calls, true)
    const lean = await measureCalcSettlement(server.url, cookie, calls, false)
    const reports = [await runModelReportBench(server.url, cookie), await runPointLogHttpBench(server.url, cookie)]
    const imported = await runImportBench(server.url, process.env.DATABASE_URL!)
    const browser = await runBrowserBench(server.url)
    const lighthouse = await runLighthouseBench(server.url)
    return { median: full.median, p95: full.p95, lean, calls, import: imported, browser, lighthouse, reports }
  }
  finally {
    await server.stop()
  }
}
