// Settlement-run job tests: polling a run until it settles, standalone job workers
// (`scripts/worker.mjs`) on a queue schema of the test file's own, stopped after the file, a run's
// row as the worker leaves it, and a copy of a run written as if a worker were part-way through it.
import { spawn, type ChildProcess } from 'node:child_process'
import { resolve } from 'node:path'
import pg from 'pg'
import { afterAll } from 'vitest'
import { freePort, ROOT } from './server'

const { Pool } = pg

/** Polls until `done` holds (generous: the machine may be busy); returns the last value. */
export async function until<T>(what: string, read: () => Promise<T>, done: (v: T) => boolean, seconds = 240): Promise<T> {
  const deadline = Date.now() + seconds * 1000
  for (;;) {
    const v = await read()
    if (done(v)) return v
    if (Date.now() > deadline) throw new Error(`${what}: still ${JSON.stringify(v)} after ${seconds} s`)
    await new Promise(r => setTimeout(r, 100))
  }
}

export interface StandaloneWorker { child: ChildProcess, url: string, log: () => string }

/**
 * Standalone workers on the queue schema `<prefix>_<time>` (jobs expire after 60 s, expired jobs are
 * looked for every second); each answers HTTP on a port of its own. After the file every worker
 * still alive is stopped and the schema dropped through `pool`.
 */
export function useStandaloneWorkers(prefix: string, pool: pg.Pool): { schema: string, start: () => Promise<StandaloneWorker> } {
  const schema = `${prefix}_${Date.now().toString(36)}`
  const workers: ChildProcess[] = []

  async function start(): Promise<StandaloneWorker> {
    const port = await freePort()
    let log = ''
    const child = spawn(process.execPath, [resolve(ROOT, 'scripts/worker.mjs')], {
      cwd: ROOT,
      env: {
        ...process.env,
        PASTLOAD_JOBS_SCHEMA: schema,
        PASTLOAD_RUN_JOB_EXPIRY_S: '60',
        PASTLOAD_JOBS_MAINTENANCE_S: '1',
        PASTLOAD_WORKER_PORT: String(port),
        PASTLOAD_WORKER_SKIP_BUILD: '1',
        PASTLOAD_TRUST_PROXY: '1',
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    child.stdout?.on('data', (d: Buffer) => { log += d.toString() })
    child.stderr?.on('data', (d: Buffer) => { log += d.toString() })
    workers.push(child)
    const url = `http://127.0.0.1:${port}`
    await until('worker ready', async () => {
      if (child.exitCode !== null) throw new Error(`the worker exited (${child.exitCode}):\n${log}`)
      try {
        const health = await (await fetch(`${url}/api/health`)).json() as { db?: string }
        return health.db === 'ok' && log.includes('settlement-run worker started')
      }
      catch {
        return false
      }
    }, ready => ready, 60)
    return { child, url, log: () => log }
  }

  afterAll(async () => {
    for (const w of workers) {
      if (w.exitCode === null && w.signalCode === null) {
        w.kill('SIGTERM')
        await new Promise(r => w.once('exit', r))
      }
    }
    await pool.query(`drop schema if exists ${schema} cascade`)
  })

  return { schema, start }
}

export interface RunRow { status: string, progress: number, attempts: number, has_results: boolean, points: number }

/**
 * A small pool on the test database (closed after the file) and a reader of a run's row as the
 * worker leaves it: status, progress, starts, whether results and point rows are written.
 */
export function useRunRows(): { pool: pg.Pool, row: (runId: string) => Promise<RunRow> } {
  const pool = new Pool({ connectionString: process.env.DATABASE_URL, max: 2 })
  afterAll(() => pool.end())
  async function row(runId: string): Promise<RunRow> {
    const r = await pool.query<RunRow>(`select status, progress, attempts, results is not null as has_results,
      (select count(*)::int from settlement_run_points p where p.run_id = r.id) as points from settlement_runs r where id = $1`, [runId])
    const found = r.rows[0]
    if (!found) throw new Error(`run ${runId} has no row`)
    return found
  }
  return { pool, row }
}

/**
 * A copy of run `runId`'s inputs named `name`, written as a worker leaves a run part-way (running at `progress`,
 * started now, no results yet): a page cannot tell it from a run being computed. Returns the copy's id.
 */
export async function insertRunningCopy(pool: pg.Pool, runId: string, name: string, progress: number): Promise<string> {
  const { rows: [copy] } = await pool.query<{ id: string }>(
    `insert into settlement_runs (project_id, name, model, definition, loads, points, grid, options, status, progress, created_by, started_at)
     select project_id, $2, model, definition, loads, points, grid, options, 'running', $3, created_by, now() from settlement_runs where id = $1 returning id`,
    [runId, name, progress],
  )
  if (!copy) throw new Error(`run ${runId} has no row to copy`)
  return copy.id
}
