// `npm run bench -- --lighthouse`: only the Lighthouse step, against a fresh server on the bench
// database (or against PASTLOAD_BENCH_URL when set: a server already running with the demo seed).
// Prints the table and rewrites the Lighthouse section of docs/performance.md.
import { loadavg } from 'node:os'
import { startServer } from '../helpers/server'
import { lighthouseSection, runLighthouseBench } from './lighthouse.bench'
import { replaceDocSection } from './doc'

async function main() {
  const given = process.env.PASTLOAD_BENCH_URL
  const server = given ? null : await startServer({ PASTLOAD_SEED: 'demo' })
  try {
    // A server the bench started has just migrated and seeded its database: the measuring starts once the machine
    // has settled from that (the 1-minute load average at 1.2 or under, two minutes at most), not in its wake.
    if (server) await settled(1.2, 120_000)
    const rows = await runLighthouseBench(given ?? server!.url)
    const table = lighthouseSection(rows)
    console.log(`\n${table}\n`)
    // A run of some pages only is a developer's measurement: the documented table keeps every page.
    if (!process.env.PASTLOAD_LIGHTHOUSE_PAGES) replaceDocSection('lighthouse', table)
  }
  finally {
    await server?.stop()
  }
}

async function settled(load: number, atMostMs: number): Promise<void> {
  const until = Date.now() + atMostMs
  while (loadavg()[0]! > load && Date.now() < until) await new Promise(resolve => setTimeout(resolve, 5_000))
  console.info(`Measuring at a load average of ${loadavg()[0]!.toFixed(2)}.`)
}

main().catch((err: unknown) => {
  console.error(err)
  process.exit(1)
})
