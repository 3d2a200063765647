// `npm run bench -- --lighthouse`: only the Lighthouse step, against a fresh server on the bench
// database (or against PASTLOAD_BENCH_URL when set: a server already running with the demo seed).
// Prints the table and rewrites the Lighthouse section of docs/performance.md.
import { startServer } from '../helpers/server'
import { lighthouseSection, runLighthouseBench } from './lighthouse.bench'
import { replaceDocSection } from './doc'

async function main() {
  const given = process.env.PASTLOAD_BENCH_URL
  const server = given ? null : await startServer({ PASTLOAD_SEED: 'demo' })
  try {
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

main().catch((err: unknown) => {
  console.error(err)
  process.exit(1)
})
