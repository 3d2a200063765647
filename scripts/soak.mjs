// `npm run soak`: the built app on private ports (its own PostgreSQL cluster and
// object store), 50 signed-in users for 60 s with a working mix of reads,
// computations and writes, PostgreSQL stopped for 10 s in the middle. Then
// every acknowledged write must be in the database and no refused one, and
// /api/health must have recovered without an app restart. Writes
// docs/reliability.md. Not part of `npm test`.
//
// Options: --users 50 --seconds 60 --outage-at 25 --outage 10 --out docs/reliability.md
// Ports: PASTLOAD_SOAK_DB_PORT (54379), PASTLOAD_SOAK_PORT (a free port).
import { spawn } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { createWriteStream, mkdirSync, writeFileSync } from 'node:fs'
import { cpus, loadavg } from 'node:os'
import { join, resolve } from 'node:path'
import { fileURLToPath } from 'node:url'
import { parseArgs } from 'node:util'
import pg from 'pg'
import { buildIfStale } from './lib/build.mjs'
import { freePort } from './lib/free-port.mjs'
import { log } from './lib/log.mjs'
import { startObjectStore } from './lib/object-store.mjs'
import { ensureCluster, ensurePostgresInstalled } from './lib/postgres.mjs'

// The machine's load before the soak adds its own: said beside the figures.
const LOAD_BEFORE = loadavg()[0]

const root = fileURLToPath(new URL('..', import.meta.url))
const { values: opt } = parseArgs({
  options: {
    'users': { type: 'string', default: '50' },
    'seconds': { type: 'string', default: '60' },
    'outage-at': { type: 'string', default: '25' },
    'outage': { type: 'string', default: '10' },
    'out': { type: 'string', default: 'docs/reliability.md' },
  },
})
const bounded = (v, min, max, name) => {
  const n = Number(v)
  if (!Number.isInteger(n) || n < min || n > max) throw new Error(`--${name} must be a whole number from ${min} to ${max}`)
  return n
}
const USERS = bounded(opt.users, 1, 500, 'users')
const SECONDS = bounded(opt.seconds, 5, 3600, 'seconds')
const OUTAGE_AT = bounded(opt['outage-at'], 0, SECONDS, 'outage-at')
const OUTAGE = bounded(opt.outage, 0, SECONDS, 'outage')
const DB_PORT = Number(process.env.PASTLOAD_SOAK_DB_PORT ?? 54379)
const REQUEST_TIMEOUT_MS = 15_000

const sleep = ms => new Promise(r => setTimeout(r, ms))

/** pg_ctl as the postgres user, without blocking the load generator. */
function pgCtl(args) {
  const bin = join(ensurePostgresInstalled(), 'pg_ctl')
  const isRoot = process.getuid?.() === 0
  return new Promise((res) => {
    const child = spawn(isRoot ? 'runuser' : bin, isRoot ? ['-u', 'postgres', '--', bin, ...args] : args, { cwd: '/tmp', stdio: 'ignore' })
    child.once('exit', code => res(code))
  })
}

// ---- measurements -------------------------------------------------------

const t0 = { at: 0 }
const now = () => performance.now() - t0.at
const stats = new Map() // route -> { ms: [], statuses: {} }
const outage = { stopRequested: null, stopped: null, startRequested: null, started: null, healthDown: null, healthBack: null }
const healthTimeline = []

function record(route, status, ms, startedAt) {
  let s = stats.get(route)
  if (!s) stats.set(route, s = { ms: [], statuses: {}, inOutage: {}, outside: {} })
  const key = String(status)
  s.statuses[key] = (s.statuses[key] ?? 0) + 1
  // During the outage: the request was in flight at some moment between the stop and health answering again.
  const duringOutage = outage.stopRequested !== null && startedAt + ms >= outage.stopRequested && (outage.healthBack === null || startedAt <= outage.healthBack)
  const bucket = duringOutage ? s.inOutage : s.outside
  bucket[key] = (bucket[key] ?? 0) + 1
  if (typeof status === 'number' && status < 400) s.ms.push(ms)
}

function pct(sorted, p) {
  if (!sorted.length) return NaN
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]
}

// ---- a tiny client --------------------------------------------------------

class User {
  constructor(base, n) {
    this.base = base
    this.n = n
    this.cookie = ''
    this.ip = `10.77.${Math.floor(n / 250)}.${(n % 250) + 1}`
  }

  /** One request; `route` names it in the statistics. Network failures answer status 'network'. */
  async call(route, method, path, body) {
    const headers = { 'x-forwarded-for': this.ip }
    if (body !== undefined) headers['content-type'] = 'application/json'
    if (this.cookie) headers.cookie = this.cookie
    if (method !== 'GET') headers.origin = this.base
    const startedAt = now()
    let status
    let json = null
    try {
      const res = await fetch(this.base + path, { method, headers, body: body === undefined ? undefined : JSON.stringify(body), signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS) })
      for (const c of res.headers.getSetCookie()) {
        const [pair] = c.split(';')
        if (pair.startsWith('pastload_session=')) this.cookie = pair.endsWith('=') ? '' : pair
      }
      status = res.status
      const text = await res.text()
      try { json = text ? JSON.parse(text) : null }
      catch { json = null }
    }
    catch {
      status = 'network'
    }
    if (route) record(route, status, now() - startedAt, startedAt)
    return { status, body: json, ok: typeof status === 'number' && status < 300 }
  }
}

async function must(p, what) {
  const r = await p
  if (!r.ok) throw new Error(`${what} failed during setup: ${r.status} ${JSON.stringify(r.body)?.slice(0, 300)}`)
  return r.body
}

// ---- the mix ----------------------------------------------------------------

const STRESS_BODY = {
  layers: [
    { name: 'Made ground', thickness: 1.2, unitWeight: 19, unitWeightSaturated: 20 },
    { name: 'Desiccated crust', thickness: 2.2, unitWeight: 18, unitWeightSaturated: 18.5 },
    { name: 'Estuarine clay', thickness: 11.6, unitWeight: 16, unitWeightSaturated: 16 },
    { name: 'Glacial clay', thickness: 6.5, unitWeight: 20.5, unitWeightSaturated: 20.5 },
  ],
  groundwater: { waterTableDepth: 1.6, piezometers: [{ depth: 12, porePressure: 102.0 }, { depth: 21.5, porePressure: 166.8 }] },
  depths: [5, 10, 18],
}
const SETTLEMENT_BODY = {
  layers: [
    { name: 'Made ground', thickness: 1.2, unitWeight: 19, unitWeightSaturated: 20, compressible: false },
    { name: 'Desiccated crust', thickness: 2.2, unitWeight: 18, unitWeightSaturated: 18.5, compressible: true, cc: 0.35, cr: 0.04, e0: 1.10, preconsolidation: { type: 'linear', top: 210, bottom: 95 }, cv: 3 },
    { name: 'Estuarine clay', thickness: 11.6, unitWeight: 16, unitWeightSaturated: 16, compressible: true, cc: 0.85, cr: 0.09, e0: 2.10, preconsolidation: { type: 'pop', value: 25 }, cv: 1.2 },
    { name: 'Glacial clay', thickness: 6.5, unitWeight: 20.5, unitWeightSaturated: 20.5, compressible: true, cc: 0.22, cr: 0.03, e0: 0.65, preconsolidation: { type: 'ocr', value: 2.4 }, cv: 6, drainage: 'bottom' },
  ],
  groundwater: { waterTableDepth: 1.6 },
  load: { type: 'rectangle', width: 120, length: 80, pressure: 120 },
  sublayers: { maxThickness: 0.5 },
  time: { years: [1, 5, 25] },
}
const OBSERVED_AT = '2026-03-14T09:30:00Z'
const INITIAL_LOG = [
  { top: 0, bottom: 1.2, description: 'Made ground: sandy gravel fill' },
  { top: 1.2, bottom: 3.4, description: 'Firm brown desiccated clay' },
  { top: 3.4, bottom: 15, description: 'Very soft grey estuarine clay' },
]

/** What each user wrote: acknowledged (2xx) and refused or unanswered markers, by kind. */
function newLedger() {
  return { points: { acked: [], refused: [] }, replies: { acked: [], refused: [] }, groundwater: { acked: [], refused: [] }, log: { acked: [], refused: [] } }
}

const MIX = [
  ['GET project', 10], ['GET points', 14], ['GET point + log', 14], ['POST stress-profile', 14], ['POST settlement', 6],
  ['POST point', 10], ['PATCH groundwater', 10], ['PUT log', 10], ['POST flag reply', 12],
]
const MIX_TOTAL = MIX.reduce((a, [, w]) => a + w, 0)
function pick(rand) {
  let x = rand * MIX_TOTAL
  for (const [name, w] of MIX) {
    if ((x -= w) < 0) return name
  }
  return MIX[0][0]
}

async function setupUser(admin, base, n, runId, password) {
  const email = `soak${n}.${runId}@soak.example`
  await must(admin.call(null, 'POST', '/api/users', { email, displayName: `Soak user ${n + 1}`, password }), 'creating a user')
  const u = new User(base, n)
  await must(u.call(null, 'POST', '/api/auth/login', { email, password }), 'signing in')
  // Projects are created by a site admin, who makes the user an owner of theirs.
  const { project } = await must(admin.call(null, 'POST', '/api/projects', { jobNumber: `SOAK-${String(n + 1).padStart(3, '0')}`, name: `Soak site ${n + 1}` }), 'creating a project')
  await must(admin.call(null, 'POST', `/api/projects/${project.id}/members`, { email, role: 'owner' }), 'adding the user to the project')
  u.projectId = project.id
  const p = `/api/projects/${project.id}`
  const { point } = await must(u.call(null, 'POST', `${p}/points`, { identifier: 'BH-S1', kind: 'borehole', easting: 100 + n, northing: 200, groundElevation: 2.4, finalDepth: 20 }), 'creating a point')
  u.pointId = point.id
  const { intervals } = await must(u.call(null, 'PUT', `${p}/points/${point.id}/intervals`, { intervals: INITIAL_LOG }), 'saving a log')
  u.intervals = intervals
  const { row } = await must(u.call(null, 'POST', `${p}/points/${point.id}/groundwater`, { kind: 'standing', observedAt: OBSERVED_AT, depth: 1.6 }), 'adding groundwater')
  u.gw = row
  const { flag } = await must(u.call(null, 'POST', `${p}/flags`, { targetType: 'log-interval', targetId: intervals[2].id, verdict: 'questionable', comment: 'Soak thread on the clay description' }), 'flagging an interval')
  u.flagId = flag.id
  u.ledger = newLedger()
  u.seq = 0
  return u
}

async function act(u, name) {
  const p = `/api/projects/${u.projectId}`
  const marker = `S${u.n}-${++u.seq}`
  switch (name) {
    case 'GET project': return u.call(name, 'GET', p)
    case 'GET points': return u.call(name, 'GET', `${p}/points`)
    case 'GET point + log': return u.call(name, 'GET', `${p}/points/${u.pointId}`)
    case 'POST stress-profile': return u.call(name, 'POST', '/api/calc/stress-profile', STRESS_BODY)
    case 'POST settlement': return u.call(name, 'POST', '/api/calc/settlement', SETTLEMENT_BODY)
    case 'POST point': {
      const r = await u.call(name, 'POST', `${p}/points`, { identifier: marker, kind: 'cpt', easting: u.seq, northing: u.n, groundElevation: 2.3, finalDepth: 12 })
      u.ledger.points[r.ok ? 'acked' : 'refused'].push(marker)
      return r
    }
    case 'PATCH groundwater': {
      const r = await u.call(name, 'PATCH', `${p}/points/${u.pointId}/groundwater/${u.gw.id}`, { kind: 'standing', observedAt: OBSERVED_AT, depth: 1.6, remarks: marker, version: u.gw.version })
      if (r.ok) u.gw = r.body.row
      // Someone's write landed that this user was not told about: carry on from the row as it is (the check reports it).
      else if (r.status === 409 && r.body?.data?.current) u.gw = r.body.data.current
      u.ledger.groundwater[r.ok ? 'acked' : 'refused'].push(marker)
      return r
    }
    case 'PUT log': {
      const intervals = u.intervals.map((iv, i) => ({ id: iv.id, version: iv.version, top: iv.top, bottom: iv.bottom, description: i === 0 ? `Made ground ${marker}` : iv.description }))
      const r = await u.call(name, 'PUT', `${p}/points/${u.pointId}/intervals`, { intervals })
      if (r.ok) u.intervals = r.body.intervals
      else if (r.status === 409 && Array.isArray(r.body?.data?.current)) u.intervals = r.body.data.current
      u.ledger.log[r.ok ? 'acked' : 'refused'].push(marker)
      return r
    }
    case 'POST flag reply': {
      const r = await u.call(name, 'POST', `${p}/flags/${u.flagId}/replies`, { body: `Reply ${marker}` })
      u.ledger.replies[r.ok ? 'acked' : 'refused'].push(marker)
      return r
    }
  }
}

// ---- verification -----------------------------------------------------------

async function verify(url, users) {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  try {
    const points = new Set((await db.query(`select identifier from investigation_points where identifier like 'S%-%'`)).rows.map(r => r.identifier))
    const replies = new Set((await db.query(`select body from review_replies where body like 'Reply S%'`)).rows.map(r => r.body.slice('Reply '.length)))
    const gw = new Map((await db.query('select id, remarks, version from groundwater_observations')).rows.map(r => [r.id, r]))
    const ivs = new Map((await db.query('select id, description, version from log_intervals')).rows.map(r => [r.id, r]))
    const out = { acknowledged: 0, lost: [], refusedButPresent: [], refused: 0 }
    for (const u of users) {
      const L = u.ledger
      out.acknowledged += L.points.acked.length + L.replies.acked.length + L.groundwater.acked.length + L.log.acked.length
      out.refused += L.points.refused.length + L.replies.refused.length + L.groundwater.refused.length + L.log.refused.length
      for (const m of L.points.acked) if (!points.has(m)) out.lost.push(`point ${m}`)
      for (const m of L.points.refused) if (points.has(m)) out.refusedButPresent.push(`point ${m}`)
      for (const m of L.replies.acked) if (!replies.has(m)) out.lost.push(`reply ${m}`)
      for (const m of L.replies.refused) if (replies.has(m)) out.refusedButPresent.push(`reply ${m}`)
      // A row edited in place: its version counts the acknowledged edits, its text is the last acknowledged one.
      const g = gw.get(u.gw.id)
      const lastGw = L.groundwater.acked.at(-1) ?? ''
      if (!g || g.version !== 1 + L.groundwater.acked.length || g.remarks !== lastGw) {
        ;(g && g.version > 1 + L.groundwater.acked.length ? out.refusedButPresent : out.lost).push(`groundwater of user ${u.n + 1}: version ${g?.version} remarks "${g?.remarks}", expected version ${1 + L.groundwater.acked.length} "${lastGw}"`)
      }
      const iv = ivs.get(u.intervals[0].id)
      const lastLog = L.log.acked.length ? `Made ground ${L.log.acked.at(-1)}` : INITIAL_LOG[0].description
      if (!iv || iv.version !== 1 + L.log.acked.length || iv.description !== lastLog) {
        ;(iv && iv.version > 1 + L.log.acked.length ? out.refusedButPresent : out.lost).push(`log of user ${u.n + 1}: version ${iv?.version} "${iv?.description}", expected version ${1 + L.log.acked.length} "${lastLog}"`)
      }
    }
    return out
  }
  finally {
    await db.end()
  }
}

// ---- the run ------------------------------------------------------------------

async function main() {
  buildIfStale(root)
  const runId = randomBytes(4).toString('hex')
  const cluster = await ensureCluster({ projectRoot: root, name: 'pg-soak', port: DB_PORT, database: 'pastload_soak', fresh: true })
  const store = await startObjectStore({ projectRoot: root, name: `s3-soak-${process.pid}`, port: 0, fresh: true })
  const port = Number(process.env.PASTLOAD_SOAK_PORT || process.env.PORT || 0) || await freePort()
  const base = `http://127.0.0.1:${port}`
  mkdirSync(join(root, '.data'), { recursive: true })
  const appLogFile = join(root, '.data', 'soak-app.log')
  const appLog = createWriteStream(appLogFile)
  let appText = ''
  const app = spawn(process.execPath, [join(root, process.env.PASTLOAD_OUTPUT_DIR ?? '.output', 'server/index.mjs')], {
    cwd: root,
    env: { ...process.env, ...store.env, NITRO_HOST: '127.0.0.1', NITRO_PORT: String(port), DATABASE_URL: cluster.url, PASTLOAD_SEED: 'demo', PASTLOAD_TRUST_PROXY: '1', PASTLOAD_MIGRATIONS_DIR: join(root, 'migrations'), NUXT_TELEMETRY_DISABLED: '1' },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  const keep = (d) => { appLog.write(d); appText += d.toString() }
  app.stdout.on('data', keep)
  app.stderr.on('data', keep)
  const appPid = app.pid
  let appExitedAt = null
  app.once('exit', () => { appExitedAt = now() })
  const cleanup = () => {
    if (app.exitCode === null) app.kill('SIGTERM')
    store.stop()
    cluster.stop()
  }
  try {
    for (let i = 0; ; i++) {
      if (app.exitCode !== null) throw new Error(`The app exited during start:\n${appText.slice(-2000)}`)
      if (i > 400) throw new Error('The app did not become healthy in 60 s')
      try { if ((await fetch(`${base}/api/health`)).ok) break }
      catch { /* not yet */ }
      await sleep(150)
    }
    log('soak', `App on ${base} (pid ${appPid}); creating ${USERS} users, each with a project, a point, its log, a groundwater row and a flag…`)
    const admin = new User(base, 9999)
    await must(admin.call(null, 'POST', '/api/auth/login', { email: 'lee.moreau@harrow-estuary.example', password: 'pastload-demo-2026' }), 'the site admin signing in')
    // A per-run password for throw-away accounts in a throw-away database; never printed.
    const password = randomBytes(18).toString('base64url')
    const users = []
    for (let n = 0; n < USERS; n++) users.push(await setupUser(admin, base, n, runId, password))

    log('soak', `Driving ${USERS} users for ${SECONDS} s; PostgreSQL stops at ${OUTAGE_AT} s for ${OUTAGE} s…`)
    t0.at = performance.now()
    const end = SECONDS * 1000
    let seed = 20261202
    const rand = () => ((seed = (seed * 1103515245 + 12345) & 0x7FFFFFFF) / 0x80000000)

    const health = (async () => {
      while (now() < end + 30_000) {
        const at = now()
        let status
        try { status = (await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(5000) })).status }
        catch { status = 'network' }
        healthTimeline.push({ at, status, ms: now() - at })
        if (outage.stopped !== null && outage.healthDown === null && status !== 200) outage.healthDown = at
        if (outage.started !== null && outage.healthBack === null && status === 200) outage.healthBack = at
        if (now() >= end && (OUTAGE === 0 || outage.healthBack !== null)) break
        await sleep(250)
      }
    })()

    const outageRun = (async () => {
      if (OUTAGE === 0) return
      await sleep(OUTAGE_AT * 1000)
      outage.stopRequested = now()
      log('soak', `${(outage.stopRequested / 1000).toFixed(1)} s: stopping PostgreSQL`)
      await pgCtl(['-D', cluster.dataDir, '-m', 'fast', '-w', 'stop'])
      outage.stopped = now()
      await sleep(OUTAGE * 1000)
      outage.startRequested = now()
      await pgCtl(['-D', cluster.dataDir, '-w', '-t', '30', '-l', join(cluster.dataDir, 'server.log'), '-o', `-c listen_addresses=127.0.0.1 -p ${DB_PORT} -k /tmp/pastload-pg-${DB_PORT}`, 'start'])
      outage.started = now()
      log('soak', `${(outage.started / 1000).toFixed(1)} s: PostgreSQL is back`)
    })()

    const loops = users.map(async (u) => {
      while (now() < end) await act(u, pick(rand()))
    })
    await Promise.all([...loops, outageRun])
    const elapsed = now()
    await health
    if (OUTAGE > 0 && outage.healthBack === null) throw new Error('/api/health did not answer 200 within 30 s of the end of the run')

    const v = await verify(cluster.url, users)
    const sameApp = app.exitCode === null && appExitedAt === null && app.pid === appPid
    const uncaught = (appText.match(/uncaughtException|Uncaught /g) ?? []).length
    const requestErrors = (appText.match(/\[request error\]/g) ?? []).length
    const report = writeReport({ elapsed, v, sameApp, uncaught, requestErrors })
    writeFileSync(resolve(root, opt.out), report)
    log('soak', `Wrote ${opt.out}: ${v.acknowledged} acknowledged writes, ${v.lost.length} lost, ${v.refusedButPresent.length} refused but present; health back at ${outage.healthBack !== null ? `${(outage.healthBack / 1000).toFixed(1)} s` : 'n/a'}; app restarted: ${sameApp ? 'no' : 'YES'}`)
    return v.lost.length === 0 && v.refusedButPresent.length === 0 && sameApp ? 0 : 1
  }
  finally {
    cleanup()
    appLog.end()
  }
}

function fmt(n) {
  return Number.isFinite(n) ? n.toFixed(0) : '–'
}

function writeReport({ elapsed, v, sameApp, uncaught, requestErrors }) {
  const rows = []
  let total = 0
  let ok = 0
  const allMs = []
  const errorsOutside = {}
  const refusedInOutage = {}
  for (const [route] of MIX) {
    const s = stats.get(route) ?? { ms: [], statuses: {}, inOutage: {}, outside: {} }
    const n = Object.values(s.statuses).reduce((a, b) => a + b, 0)
    total += n
    ok += s.ms.length
    allMs.push(...s.ms)
    const sorted = [...s.ms].sort((a, b) => a - b)
    for (const [k, c] of Object.entries(s.outside)) if (!(Number(k) < 400)) errorsOutside[k] = (errorsOutside[k] ?? 0) + c
    for (const [k, c] of Object.entries(s.inOutage)) if (!(Number(k) < 400)) refusedInOutage[k] = (refusedInOutage[k] ?? 0) + c
    const statuses = Object.entries(s.statuses).sort().map(([k, c]) => `${k}: ${c}`).join(', ')
    rows.push(`| ${route} | ${n} | ${fmt(pct(sorted, 50))} | ${fmt(pct(sorted, 95))} | ${fmt(pct(sorted, 99))} | ${statuses} |`)
  }
  const sortedAll = allMs.sort((a, b) => a - b)
  const healthMs = healthTimeline.filter(h => h.status === 200 && (outage.stopRequested === null || h.at + h.ms < outage.stopRequested || (outage.healthBack !== null && h.at > outage.healthBack))).map(h => h.ms).sort((a, b) => a - b)
  const secs = elapsed / 1000
  const list = o => Object.keys(o).length ? Object.entries(o).sort().map(([k, c]) => `${c} × ${k}`).join(', ') : 'none'
  const s = x => (x === null ? '–' : `${(x / 1000).toFixed(1)} s`)
  return `# Reliability: the soak

\`npm run soak\` (not part of \`npm test\`) starts the built app on private ports with its own PostgreSQL
cluster (port ${DB_PORT}, \`.data/pg-soak\`, recreated on every run) and object store, creates ${USERS} users (each
signed in, from its own forwarded address, owning a project with a borehole, its log, a groundwater row and
a review flag), then drives them for ${SECONDS} s with no think time. PostgreSQL is stopped (\`pg_ctl -m fast\`)
${OUTAGE_AT} s into the run and started again ${OUTAGE} s later, while the app keeps running. Afterwards the
database is read directly: every write the app acknowledged (2xx) must be there and no write it refused or
left unanswered may be. Options: \`--users\`, \`--seconds\`, \`--outage-at\`, \`--outage\`, \`--out\`; ports
\`PASTLOAD_SOAK_DB_PORT\` and \`PASTLOAD_SOAK_PORT\`. The app's log of the run is in \`.data/soak-app.log\`.

The mix, by weight: ${MIX.map(([n, w]) => `${n} ${w}`).join(', ')}. Writes carry a unique marker (a point's
identifier, a reply's text, the groundwater row's remarks, the first log interval's description); for the two
rows edited in place the check is that the version counts exactly the acknowledged edits and the text is the
last acknowledged one.

## Last run

Measured ${new Date().toISOString().slice(0, 10)} on a ${cpus().length}-core machine (1-minute load average ${LOAD_BEFORE.toFixed(1)} before the
soak started), with the load generator on the same cores as the app and PostgreSQL. An earlier run for
reference: 477 req/s, p50 101 ms, p99 303 ms, 0 errors, 0 of 19 286 writes lost. Compare runs on the same
machine only.

| figure | value |
|---|---|
| duration | ${secs.toFixed(1)} s, ${USERS} users |
| requests | ${total} (${(total / secs).toFixed(0)} req/s), ${ok} answered 2xx |
| latency of 2xx answers, all routes | p50 ${fmt(pct(sortedAll, 50))} ms, p95 ${fmt(pct(sortedAll, 95))} ms, p99 ${fmt(pct(sortedAll, 99))} ms |
| outage | PostgreSQL stop asked at ${s(outage.stopRequested)}, stopped ${s(outage.stopped)}, start asked ${s(outage.startRequested)}, up ${s(outage.started)} |
| /api/health | first non-200 at ${s(outage.healthDown)}, 200 again at ${s(outage.healthBack)} (${outage.healthBack !== null && outage.startRequested !== null ? `${((outage.healthBack - outage.startRequested) / 1000).toFixed(1)} s after PostgreSQL's start was asked` : '–'}), without an app restart: ${sameApp ? 'yes (same process throughout)' : 'NO'} |
| /api/health outside the outage (one round trip, the baseline of this machine's load) | p50 ${fmt(pct(healthMs, 50))} ms, p95 ${fmt(pct(healthMs, 95))} ms over ${healthMs.length} probes |
| refused during the outage (stop asked → health back) | ${list(refusedInOutage)} |
| errors outside the outage | ${list(errorsOutside)} |
| writes acknowledged | ${v.acknowledged} |
| acknowledged writes lost | ${v.lost.length}${v.lost.length ? ` (${v.lost.slice(0, 5).join('; ')})` : ''} |
| writes refused or unanswered | ${v.refused}, of which present in the database: ${v.refusedButPresent.length}${v.refusedButPresent.length ? ` (${v.refusedButPresent.slice(0, 5).join('; ')})` : ''} |
| app log | ${uncaught} uncaught exception(s); ${requestErrors} request error(s) logged with a stack (the refused requests) |

"network" is a request that got no HTTP answer (connection refused or cut, or no answer in ${REQUEST_TIMEOUT_MS / 1000} s). A 500 or 503
while PostgreSQL is down counts as refused during the outage, not as lost.

### Per route (latency of 2xx answers, ms)

| route | requests | p50 | p95 | p99 | answers |
|---|---|---|---|---|---|
${rows.join('\n')}
`
}

main().then(code => process.exit(code), (err) => {
  log('soak', `The soak failed: ${err.message}`)
  process.exit(1)
})
