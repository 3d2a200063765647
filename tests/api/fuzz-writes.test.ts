// Every state-changing route under hostile input: bodies generated from the route's own
// zod schema and the authorization matrix's valid bodies, spoilt with NUL bytes, lone
// surrogates, numbers beyond every column, impossible dates, wrong types, nested junk and
// malformed ids. Each answer must be below 500, and a 4xx must have written nothing
// (no audit entry, no row added, changed or removed).
// Default: 40 bodies per route with a fixed seed; `npm run fuzz` sends more
// (PASTLOAD_FUZZ_RUNS, PASTLOAD_FUZZ_SEED).
import fc from 'fast-check'
import pg from 'pg'
import type { z } from 'zod'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ChangePasswordSchema, CreateTokenSchema, CreateUserSchema, LoginSchema } from '../../shared/schemas/auth'
import { PreconsolidationRequestSchema, SettlementRequestSchema, StressProfileRequestSchema, TrendFitRequestSchema } from '../../shared/schemas/calc'
import { AgsCommitSchema, ImportCommitSchema } from '../../shared/schemas/imports'
import { CptSaveSchema, GroundwaterInputSchema, GroundwaterUpdateSchema, IndexTestSaveSchema, LogReplaceSchema, PointInputSchema, PointUpdateSchema, SampleInputSchema, SampleUpdateSchema, SptInputSchema, SptUpdateSchema, StratumCptDerivationSchema, StratumInputSchema, StratumUpdateSchema, VaneInputSchema, VaneUpdateSchema } from '../../shared/schemas/investigation'
import { AdoptionInputSchema, OedometerTestInputSchema, OedometerTestUpdateSchema, PreconsolidationPointsEvaluateSchema } from '../../shared/schemas/lab'
import { CreateModelSchema, SaveDraftSchema, SaveVersionSchema, SubmitVersionSchema, VersionDecisionSchema } from '../../shared/schemas/models'
import { AddMemberSchema, CreateProjectSchema, UpdateMemberSchema, UpdateProjectSchema } from '../../shared/schemas/projects'
import { InviteSchema } from '../../shared/schemas/people'
import { CreateFlagSchema, ReplySchema, UpdateFlagSchema } from '../../shared/schemas/review'
import { CreateSettlementRunSchema } from '../../shared/schemas/settlement-runs'
import { TINY_PDF } from '../helpers/attach'
import { IssueReportSchema } from '../../shared/schemas/reports'
import { upload } from '../helpers/upload'
import { bodiesOf, mutate, mutation, serialise, type Json } from '../helpers/fuzz'
import { Client, createUser, demoEmail, signIn, TEST_PASSWORD, uniqueEmail } from '../helpers/http'
import type { Ctx, RouteCase } from './matrix/types'

const RUNS = Math.max(1, Number(process.env.PASTLOAD_FUZZ_RUNS ?? 40))
const SEED = Number(process.env.PASTLOAD_FUZZ_SEED ?? 20_261_202)
// Per route: generous, the machine may be shared; a larger `npm run fuzz` scales it.
const TIMEOUT = Math.max(180_000, RUNS * 3000)

// The matrix lists every project route with a way to build a real target and a valid body.
const modules = import.meta.glob<{ ROUTES: RouteCase[] }>('./matrix/*.routes.ts', { eager: true })
const MATRIX_WRITES = Object.keys(modules).sort().flatMap(k => modules[k]!.ROUTES).filter(r => r.method !== 'GET')

/** Each write route's own body schema (routes that read no body are absent: their valid body is mutated). */
const SCHEMAS: Record<string, z.ZodType> = {
  'PATCH /api/projects/:projectId': UpdateProjectSchema,
  'POST /api/projects/:projectId/members': AddMemberSchema,
  'PATCH /api/projects/:projectId/members/:userId': UpdateMemberSchema,
  'POST /api/projects/:projectId/invitations': InviteSchema,
  'POST /api/projects/:projectId/points': PointInputSchema,
  'PATCH /api/projects/:projectId/points/:pointId': PointUpdateSchema,
  'PUT /api/projects/:projectId/points/:pointId/intervals': LogReplaceSchema,
  'POST /api/projects/:projectId/points/:pointId/samples': SampleInputSchema,
  'PATCH /api/projects/:projectId/points/:pointId/samples/:sampleId': SampleUpdateSchema,
  'PUT /api/projects/:projectId/points/:pointId/samples/:sampleId/index-test': IndexTestSaveSchema,
  'POST /api/projects/:projectId/points/:pointId/spt': SptInputSchema,
  'PATCH /api/projects/:projectId/points/:pointId/spt/:rowId': SptUpdateSchema,
  'POST /api/projects/:projectId/points/:pointId/groundwater': GroundwaterInputSchema,
  'PATCH /api/projects/:projectId/points/:pointId/groundwater/:rowId': GroundwaterUpdateSchema,
  'POST /api/projects/:projectId/points/:pointId/vane': VaneInputSchema,
  'PATCH /api/projects/:projectId/points/:pointId/vane/:rowId': VaneUpdateSchema,
  'PUT /api/projects/:projectId/points/:pointId/cpt': CptSaveSchema,
  'POST /api/projects/:projectId/imports/:importId/commit': ImportCommitSchema,
  'POST /api/projects/:projectId/imports/:importId/commit-ags': AgsCommitSchema,
  'POST /api/projects/:projectId/strata': StratumInputSchema,
  'PATCH /api/projects/:projectId/strata/:stratumId': StratumUpdateSchema,
  'PUT /api/projects/:projectId/strata/:stratumId/cpt-derivation': StratumCptDerivationSchema,
  'POST /api/projects/:projectId/models': CreateModelSchema,
  'PUT /api/projects/:projectId/models/:modelId/draft': SaveDraftSchema,
  'POST /api/projects/:projectId/models/:modelId/versions': SaveVersionSchema,
  'POST /api/projects/:projectId/models/:modelId/versions/:version/submit': SubmitVersionSchema,
  'POST /api/projects/:projectId/models/:modelId/versions/:version/decision': VersionDecisionSchema,
  'POST /api/projects/:projectId/flags': CreateFlagSchema,
  'PATCH /api/projects/:projectId/flags/:flagId': UpdateFlagSchema,
  'POST /api/projects/:projectId/flags/:flagId/replies': ReplySchema,
  'POST /api/projects/:projectId/tests/oedometer': OedometerTestInputSchema,
  'PATCH /api/projects/:projectId/tests/oedometer/:testId': OedometerTestUpdateSchema,
  'POST /api/projects/:projectId/tests/oedometer/:testId/adoptions': AdoptionInputSchema,
  'POST /api/projects/:projectId/preconsolidation-points/evaluate': PreconsolidationPointsEvaluateSchema,
  'POST /api/projects/:projectId/settlement-runs': CreateSettlementRunSchema,
  'POST /api/projects/:projectId/reports': IssueReportSchema,
  'POST /api/projects': CreateProjectSchema,
  'POST /api/users': CreateUserSchema,
  'POST /api/account/tokens': CreateTokenSchema,
  'POST /api/account/password': ChangePasswordSchema,
  'POST /api/auth/login': LoginSchema,
  'POST /api/calc/stress-profile': StressProfileRequestSchema,
  'POST /api/calc/settlement': SettlementRequestSchema,
  'POST /api/calc/preconsolidation': PreconsolidationRequestSchema,
  'POST /api/calc/trend-fit': TrendFitRequestSchema,
}

interface Target { client: Client, path: string, body: Json }

interface FuzzRoute {
  method: RouteCase['method']
  path: string
  /** multipart: the body's string fields go as form fields beside a file. */
  multipart?: 'attachment' | 'import'
  /** A real target and a valid body; built again after a 2xx (the target may be gone or newer). */
  prepare: () => Promise<Target>
}

const CALC_BODIES: Record<string, Json> = {
  '/api/calc/stress-profile': { groundwater: { waterTableDepth: 1.5 }, layers: [{ name: 'Clay', thickness: 8, unitWeight: 17, unitWeightSaturated: 17.5 }] },
  '/api/calc/settlement': {
    groundwater: { waterTableDepth: 1 },
    layers: [{ name: 'Clay', thickness: 6, unitWeight: 16, unitWeightSaturated: 16.5, compressible: true, cc: 0.8, cr: 0.08, e0: 2, preconsolidation: { type: 'pop', value: 20 }, cv: 2 }],
    load: { type: 'uniform', pressure: 50 },
    time: { years: [1, 5] },
    probabilistic: { realizations: 200, seed: 3, layers: { Clay: { cc: { cov: 0.3 }, e0: { cov: 0.1 }, cv: { cov: 0.4 } } } },
  },
  '/api/calc/preconsolidation': { points: [{ stress: 10, voidRatio: 2.05 }, { stress: 20, voidRatio: 2.03 }, { stress: 40, voidRatio: 2.0 }, { stress: 80, voidRatio: 1.9 }, { stress: 160, voidRatio: 1.65 }, { stress: 320, voidRatio: 1.4 }], e0: 2.1 },
  '/api/calc/trend-fit': { model: 'linear', points: [{ depth: 2, preconsolidation: 40 }, { depth: 4, preconsolidation: 50 }, { depth: 6, preconsolidation: 62 }] },
}

// Tables the fuzz must not see changed by a 4xx. Sessions and sign-in attempts change on
// every sign-in by design; the migration journal never changes.
const UNWATCHED = new Set(['sessions', 'login_throttle', '__drizzle_migrations'])

async function fingerprintQuery(db: pg.Client): Promise<string> {
  const { rows } = await db.query<{ table_name: string, columns: string[] }>(
    `SELECT table_name, array_agg(column_name::text) AS columns FROM information_schema.columns
      WHERE table_schema = 'public' GROUP BY table_name ORDER BY table_name`)
  const parts = rows.filter(r => !UNWATCHED.has(r.table_name)).map((r) => {
    const cols = new Set(r.columns)
    const t = `"${r.table_name}"`
    const bits = ['count(*)::text']
    if (cols.has('updated_at')) bits.push('coalesce(max(updated_at)::text, \'\')')
    if (cols.has('version')) bits.push('coalesce(sum(version)::text, \'\')')
    if (cols.has('revoked_at')) bits.push('count(revoked_at)::text')
    if (cols.has('superseded_at')) bits.push('count(superseded_at)::text')
    if (cols.has('id') && r.table_name === 'audit_events') bits.push('coalesce(max(id)::text, \'\')')
    return `(SELECT '${r.table_name}=' || ${bits.join(` || ':' || `)} FROM ${t})`
  })
  return `SELECT ${parts.join(` || ' ' || `)} AS fp`
}

/** Waits (up to 3 minutes) until no settlement run and no issued report is queued or being made. */
async function waitForQuietQueues(db: pg.Client): Promise<void> {
  const busy = async () => (await db.query<{ n: number }>(
    `SELECT (SELECT count(*) FROM settlement_runs WHERE status IN ('queued', 'running'))::int
          + (SELECT count(*) FROM issued_reports WHERE status IN ('queued', 'running'))::int AS n`)).rows[0]?.n ?? 0
  const until = Date.now() + 180_000
  while (await busy() > 0) {
    if (Date.now() > until) throw new Error('settlement runs or reports of other test files are still in flight after 3 minutes')
    await new Promise(resolve => setTimeout(resolve, 500))
  }
}

async function send(route: FuzzRoute, t: Target, body: Json): Promise<{ status: number, text: string }> {
  if (route.multipart) {
    const form = new FormData()
    const fields = body && typeof body === 'object' && !Array.isArray(body) ? body : { caption: body }
    let filename = route.multipart === 'attachment' ? 'report.pdf' : 'points.csv'
    for (const [k, v] of Object.entries(fields)) {
      if (k === 'filename') filename = typeof v === 'string' ? v : JSON.stringify(v)
      else form.append(k, typeof v === 'string' ? v : JSON.stringify(v))
    }
    const content = route.multipart === 'attachment' ? TINY_PDF : `Point,Kind,Easting,Northing,Ground level,Final depth\n${typeof fields.row === 'string' ? fields.row : 'FZ-1,borehole,1,2,3,10'}\n`
    form.append('file', new Blob([content]), filename)
    const headers: Record<string, string> = { origin: t.client.origin ?? '' }
    if (t.client.cookie) headers.cookie = t.client.cookie
    const res = await fetch(t.client.base + t.path, { method: route.method, body: form, headers })
    return { status: res.status, text: await res.text() }
  }
  const r = await t.client.request(route.method, t.path, serialise(body), { 'content-type': 'application/json' })
  return { status: r.status, text: typeof r.body === 'string' ? r.body : JSON.stringify(r.body) }
}

describe('every write route under hostile input', () => {
  const ctx = {} as Ctx
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL })
  let fpSql = ''
  const fingerprint = async () => {
    const t0 = Date.now()
    const fp = (await db.query<{ fp: string }>(fpSql)).rows[0]!.fp
    tally.fingerprintMs += Date.now() - t0
    return fp
  }
  let tally = { requests: 0, byStatus: {} as Record<number, number>, started: 0, fingerprintMs: 0 }
  const routes: FuzzRoute[] = []
  let tokenOwner: Client
  let passwordUser: { client: Client, email: string }

  beforeAll(async () => {
    await db.connect()
    // Settlement runs and reports queued by other test files finish in the background and write their
    // progress; the database is only quiet enough to compare before and after once none is left in flight.
    await waitForQuietQueues(db)
    fpSql = await fingerprintQuery(db)
    ctx.owner = await signIn(demoEmail('owner'))
    const p = await ctx.owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `FZ-${Date.now().toString(36)}`, name: 'Hostile input' })
    expect(p.status).toBe(201)
    ctx.projectId = p.body.project.id
    ctx.clients = { owner: ctx.owner } as Ctx['clients']
    ctx.ids = {} as Ctx['ids']
    // Routes whose fixtures need another member (a version saved by the engineer, sent to the reviewer).
    for (const role of ['engineer', 'reviewer'] as const) {
      const u = await createUser(ctx.owner, `fuzz-${role}`)
      expect((await ctx.owner.post(`/api/projects/${ctx.projectId}/members`, { email: u.email, role })).status).toBe(201)
      ctx.clients[role] = u.client
      ctx.ids[role] = u.id
    }
    tokenOwner = (await createUser(ctx.owner, 'fuzz-tokens')).client
    const pw = await createUser(ctx.owner, 'fuzz-password')
    passwordUser = { client: pw.client, email: pw.email }
    tally = { requests: 0, byStatus: {}, started: Date.now(), fingerprintMs: 0 }
  }, 300_000)

  afterAll(async () => {
    await db.end()
    const seconds = ((Date.now() - tally.started) / 1000).toFixed(1)
    console.info(`fuzz: ${tally.requests} hostile requests over ${routes.length} routes in ${seconds} s (${RUNS} per route, seed ${SEED}); statuses ${JSON.stringify(tally.byStatus)}; ${(tally.fingerprintMs / 1000).toFixed(1)} s reading the database before and after`)
  })

  // Project routes, from the matrix (the owner may call every one of them).
  for (const rc of MATRIX_WRITES) {
    const multipart = rc.path.endsWith('/attachments') && rc.method === 'POST'
      ? 'attachment' as const
      : rc.path.endsWith('/imports') && rc.method === 'POST' ? 'import' as const : undefined
    routes.push({
      method: rc.method,
      path: rc.path,
      multipart,
      prepare: async () => {
        const prepared = rc.prepare ? await rc.prepare(ctx) : {}
        const fallback = multipart === 'attachment' ? { ownerType: 'project', caption: 'Site photo' } : multipart === 'import' ? { filename: 'points.csv', row: 'FZ-1,borehole,1,2,3,10' } : {}
        return { client: ctx.owner, path: prepared.path ?? rc.path.replace(':projectId', ctx.projectId), body: (prepared.body ?? fallback) as Json }
      },
    })
  }

  // Site-wide writes.
  routes.push(
    { method: 'POST', path: '/api/projects', prepare: async () => ({ client: ctx.owner, path: '/api/projects', body: { jobNumber: `FZP-${Math.random().toString(36).slice(2, 8)}`, name: 'Fuzz project' } }) },
    { method: 'POST', path: '/api/users', prepare: async () => ({ client: ctx.owner, path: '/api/users', body: { email: uniqueEmail('fuzz'), displayName: 'Fuzz', password: TEST_PASSWORD } }) },
    { method: 'POST', path: '/api/account/tokens', prepare: async () => ({ client: tokenOwner, path: '/api/account/tokens', body: { name: 'Nightly export' } }) },
    {
      method: 'DELETE', path: '/api/account/tokens/:tokenId',
      prepare: async () => {
        const r = await tokenOwner.post<{ token: { id: string } }>('/api/account/tokens', { name: 'to revoke' })
        if (r.status !== 201) throw new Error(`fixture token failed: ${r.status}`)
        return { client: tokenOwner, path: `/api/account/tokens/${r.body.token.id}`, body: {} }
      },
    },
    {
      method: 'POST', path: '/api/account/password',
      // A 2xx changed the password (and the session): sign in again with the new one is not needed, the cookie was renewed.
      prepare: async () => ({ client: passwordUser.client, path: '/api/account/password', body: { currentPassword: TEST_PASSWORD, newPassword: 'another-long-passphrase-7' } }),
    },
    {
      method: 'POST', path: '/api/auth/login',
      prepare: async () => {
        const c = new Client()
        // Its own address, so the sign-in throttle of this run touches nobody else.
        c.forwardedFor = `198.51.100.${Math.floor(Math.random() * 250) + 1}`
        return { client: c, path: '/api/auth/login', body: { email: 'fuzz.nobody@test.example', password: 'not-the-password-1' } }
      },
    },
    {
      method: 'POST', path: '/api/auth/logout',
      prepare: async () => ({ client: await signIn(passwordUser.email, TEST_PASSWORD).catch(() => new Client()), path: '/api/auth/logout', body: {} }),
    },
    ...Object.entries(CALC_BODIES).map(([path, body]): FuzzRoute => ({ method: 'POST', path, prepare: async () => ({ client: ctx.owner, path, body }) })),
  )

  it('covers every write route of the matrix and each route with a body has its schema listed', () => {
    const keys = new Set(routes.map(r => `${r.method} ${r.path}`))
    for (const rc of MATRIX_WRITES) expect(keys.has(`${rc.method} ${rc.path}`)).toBe(true)
    for (const key of Object.keys(SCHEMAS)) expect(keys.has(key), key).toBe(true)
    expect(routes.length).toBeGreaterThanOrEqual(55)
  })

  // The import commit reads the file, not the body: hostile cells go in the file (a CSV without quotes).
  const HOSTILE_CELLS = ['a\u0000b', '\u0000', '0000-01-01', '9999-12-31', '0000-01-01T00:00:00Z', '1e308', '-1e308', '-0', 'NaN', 'Infinity',
    '2147483648', '9007199254740993', 'x'.repeat(5000), '', 'borehole', 'standing', '2025-03-01', '2025-03-01T09:00:00Z', '1.5', '-3', '12']
  const cell = fc.oneof({ weight: 3, arbitrary: fc.constantFrom(...HOSTILE_CELLS) }, { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 12 }).map(v => v.replace(/[,"\r\n]/g, '')) })
  const IMPORT_FILES = {
    points: {
      headers: ['Point', 'Kind', 'Easting', 'Northing', 'Ground level', 'Final depth', 'Started', 'Ended', 'Method', 'Logged by', 'Remarks'],
      mapping: { identifier: 'Point', kind: 'Kind', easting: 'Easting', northing: 'Northing', groundElevation: 'Ground level', finalDepth: 'Final depth', startedOn: 'Started', endedOn: 'Ended', method: 'Method', loggedBy: 'Logged by', remarks: 'Remarks' },
      valid: (n: number) => [`FI-${n}`, 'borehole', '1', '2', '3', '10', '2025-03-01', '2025-03-02', 'rotary', 'AF', 'ok'],
    },
    groundwater: {
      headers: ['Point', 'Kind', 'Observed at', 'Depth', 'Pressure', 'Remarks'],
      mapping: { point: 'Point', kind: 'Kind', observedAt: 'Observed at', depth: 'Depth', pressure: 'Pressure', remarks: 'Remarks' },
      valid: (_n: number, point = '') => [point, 'standing', '2025-03-01T09:00:00Z', '1.5', '', 'ok'],
    },
  } as const
  for (const [target, file] of Object.entries(IMPORT_FILES)) {
    it(`POST /api/projects/:projectId/imports/:importId/commit (${target}, hostile file cells): never 5xx, and a 4xx writes nothing`, async () => {
      const point = (await ctx.owner.post<{ point: { identifier: string } }>(`/api/projects/${ctx.projectId}/points`, { identifier: `FG-${Date.now().toString(36)}`, kind: 'borehole', easting: 1, northing: 2, groundElevation: 3, finalDepth: 20 })).body.point.identifier
      let n = 0
      await fc.assert(
        fc.asyncProperty(fc.array(fc.tuple(fc.nat({ max: file.headers.length - 1 }), cell), { minLength: 1, maxLength: 4 }), async (spoils) => {
          n += 1
          const row: string[] = [...file.valid(n, point)]
          for (const [col, value] of spoils) row[col] = value
          const up = await upload<{ importId: string }>(ctx.owner, `/api/projects/${ctx.projectId}/imports`, `${target}.csv`, `${file.headers.join(',')}\n${row.join(',')}\n`)
          tally.requests += 1
          expect(up.status, `upload of ${JSON.stringify(row).slice(0, 300)} → ${JSON.stringify(up.body).slice(0, 300)}`).toBeLessThan(500)
          if (up.status !== 201) return
          const before = await fingerprint()
          const r = await ctx.owner.post(`/api/projects/${ctx.projectId}/imports/${up.body.importId}/commit`, { target, mapping: file.mapping, saveMapping: false })
          tally.requests += 1
          tally.byStatus[r.status] = (tally.byStatus[r.status] ?? 0) + 1
          expect(r.status, `commit of ${JSON.stringify(row).slice(0, 300)} → ${JSON.stringify(r.body).slice(0, 300)}`).toBeLessThan(500)
          if (r.status >= 400) expect(await fingerprint(), `commit answered ${r.status} but wrote`).toBe(before)
        }),
        { numRuns: RUNS, seed: SEED - 1, endOnFailure: true },
      )
    }, TIMEOUT)
  }

  for (const [i, route] of routes.entries()) {
    const key = `${route.method} ${route.path}`
    it(`${key} (#${i}): never 5xx, and a 4xx writes nothing`, async () => {
      const schema = SCHEMAS[key]
      // Half the bodies start from the valid one (they reach the service), half from the schema.
      const base: fc.Arbitrary<{ fromSchema: Json | null }> = schema
        ? fc.oneof(fc.constant({ fromSchema: null }), bodiesOf(schema).map(b => ({ fromSchema: b })))
        : fc.constant({ fromSchema: null })
      let target = await route.prepare()
      await waitForQuietQueues(db)
      await fc.assert(
        fc.asyncProperty(base, fc.array(mutation, { minLength: 1, maxLength: 3 }), async ({ fromSchema }, mutations) => {
          const body = mutate(fromSchema ?? target.body, mutations)
          const before = await fingerprint()
          const r = await send(route, target, body)
          tally.requests += 1
          tally.byStatus[r.status] = (tally.byStatus[r.status] ?? 0) + 1
          expect(r.status, `${key} with ${serialise(body).slice(0, 300)} → ${r.text.slice(0, 300)}`).toBeLessThan(500)
          if (r.status >= 400) expect(await fingerprint(), `${key} answered ${r.status} but wrote: ${serialise(body).slice(0, 300)}`).toBe(before)
          else {
            // A request taken (e.g. a report issued on the queue) may go on writing in the background.
            await waitForQuietQueues(db)
            target = await route.prepare()
            await waitForQuietQueues(db)
          }
        }),
        { numRuns: RUNS, seed: SEED + i, endOnFailure: true },
      )
    }, TIMEOUT)
  }
})
