// Import of a 200 000-row CPT CSV through the real HTTP path (upload, then
// commit) against the bare floor measured in the same run: parsing the same
// file with the same parser (papaparse) plus a PostgreSQL COPY of the rows.
import { performance } from 'node:perf_hooks'
import { pipeline } from 'node:stream/promises'
import { Readable } from 'node:stream'
import Papa from 'papaparse'
import pg from 'pg'
import { from as copyFrom } from 'pg-copy-streams'
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../shared/demo/scenario'

export function cptCsv(rows: number): string {
  const lines = ['Depth (m),qc (kPa),fs (kPa),u2 (kPa)']
  for (let i = 0; i < rows; i++) {
    const z = (i + 1) * 0.0001
    lines.push(`${z.toFixed(4)},${(300 + 40 * z + (i % 7)).toFixed(1)},${(6 + 0.2 * z).toFixed(2)},${(9.81 * z + (i % 5)).toFixed(2)}`)
  }
  return `${lines.join('\n')}\n`
}

async function floor(csv: string, databaseUrl: string): Promise<number> {
  const client = new pg.Client({ connectionString: databaseUrl })
  await client.connect()
  try {
    await client.query('create temporary table bench_cpt (depth double precision, qc double precision, fs double precision, u2 double precision)')
    const t0 = performance.now()
    const parsed = Papa.parse<string[]>(csv, { skipEmptyLines: false })
    const body = parsed.data.slice(1).filter(r => r.length === 4).map(r => r.join('\t')).join('\n')
    await pipeline(Readable.from([body]), client.query(copyFrom('copy bench_cpt from stdin')))
    const ms = performance.now() - t0
    const { rows } = await client.query<{ n: string }>('select count(*) as n from bench_cpt')
    if (Number(rows[0]!.n) !== parsed.data.length - 2) throw new Error(`floor copied ${rows[0]!.n} rows`)
    await client.query('drop table bench_cpt')
    return ms
  }
  finally {
    await client.end()
  }
}

export async function runImportBench(serverUrl: string, databaseUrl: string, rows = 200_000, reps = 3) {
  const owner = DEMO_PEOPLE.find(p => p.role === 'owner')!
  const login = await fetch(`${serverUrl}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': serverUrl }, body: JSON.stringify({ email: owner.email, password: DEMO_PASSWORD }) })
  const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const h = { 'content-type': 'application/json', 'origin': serverUrl, cookie }
  const proj = await (await fetch(`${serverUrl}/api/projects`, { method: 'POST', headers: h, body: JSON.stringify({ jobNumber: `BENCH-${Date.now().toString(36)}`, name: 'Import benchmark' }) })).json() as { project: { id: string } }
  const base = `${serverUrl}/api/projects/${proj.project.id}`
  const point = await (await fetch(`${base}/points`, { method: 'POST', headers: h, body: JSON.stringify({ identifier: 'CPT-B1', kind: 'cpt', easting: 0, northing: 0, groundElevation: 0, finalDepth: 25 }) })).json() as { point: { id: string } }
  const csv = cptCsv(rows)
  const mapping = { depth: 'Depth (m)', qc: 'qc (kPa)', fs: 'fs (kPa)', u2: 'u2 (kPa)' }
  let ours = Infinity
  let bare = Infinity
  for (let r = 0; r < reps; r++) {
    const t0 = performance.now()
    const form = new FormData()
    form.append('file', new Blob([csv], { type: 'text/csv' }), 'cpt.csv')
    const up = await fetch(`${base}/imports`, { method: 'POST', body: form, headers: { origin: serverUrl, cookie } })
    const { importId } = await up.json() as { importId: string }
    const done = await fetch(`${base}/imports/${importId}/commit`, { method: 'POST', headers: h, body: JSON.stringify({ target: 'cpt', mapping, pointId: point.point.id, areaRatio: 0.8 }) })
    if (!done.ok) throw new Error(`bench import failed: ${done.status} ${await done.text()}`)
    ours = Math.min(ours, performance.now() - t0)
    bare = Math.min(bare, await floor(csv, databaseUrl))
  }
  return { rows, bytes: csv.length, ours, floor: bare, ratio: ours / bare }
}
