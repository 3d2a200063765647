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

/**
 * Median and p95 latency of `POST /api/calc/settlement` with 20 000 realisations inline (the most the
 * route answers at once): the ten-layer body with Cc, Cr, e0, cv and σ'p varying in every compressible
 * layer, without the sublayer rows, after 2 warm-up calls.
 */
export async function measureCalcSettlementProbabilistic(url: string, cookie: string, calls: number): Promise<{ median: number, p95: number }> {
  const base = tenLayerSettlementBody()
  const all = { cc: { cov: 0.3 }, cr: { cov: 0.3 }, e0: { cov: 0.1 }, cv: { cov: 0.5 }, preconsolidation: { cov: 0.2 } }
  const layers = Object.fromEntries(base.layers.filter(l => l.compressible).map(l => [l.name, all]))
  // 0.25 m sublayers: 8 layers × 10 = 80 sublayers, a usual profile for the compute API.
  const body = JSON.stringify({ ...base, sublayers: { maxThickness: 0.25 }, probabilistic: { realizations: 20_000, seed: 1, layers } })
  const call = async () => {
    const r = await fetch(`${url}/api/calc/settlement?sublayers=false`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': url, cookie }, body })
    const json = await r.json() as { probabilistic?: { realizations: number } }
    if (!r.ok || json.probabilistic?.realizations !== 20_000) throw new Error(`probabilistic bench call failed: ${r.status}`)
  }
  const { median, p95 } = await timeCalls(call, { warmup: 2, calls })
  return { median, p95 }
}

export async function runApiBench(calls = 300): Promise<{ median: number, p95: number, lean: { median: number, p95: number }, probabilistic: { median: number, p95: number }, calls: number, import: Awaited<ReturnType<typeof runImportBench>>, browser: Awaited<ReturnType<typeof runBrowserBench>>, lighthouse: Awaited<ReturnType<typeof runLighthouseBench>>, reports: ReportBenchRow[] }> {
  const server = await startServer({ PASTLOAD_SEED: 'demo' })
  try {
    const cookie = await signInDemoDesigner(server.url)
    const full = await measureCalcSettlement(server.url, cookie, calls, true)
    const lean = await measureCalcSettlement(server.url, cookie, calls, false)
    const probabilistic = await measureCalcSettlementProbabilistic(server.url, cookie, 15)
    const reports = [await runModelReportBench(server.url, cookie), await runPointLogHttpBench(server.url, cookie)]
    const imported = await runImportBench(server.url, process.env.DATABASE_URL!)
    const browser = await runBrowserBench(server.url)
    const lighthouse = await runLighthouseBench(server.url)
    return { median: full.median, p95: full.p95, lean, probabilistic, calls, import: imported, browser, lighthouse, reports }
  }
  finally {
    await server.stop()
  }
}
