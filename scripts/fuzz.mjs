// `npm run fuzz`: the write-route fuzz test (tests/api/fuzz-writes.test.ts) with many more
// bodies per route than `npm test` sends. PASTLOAD_FUZZ_RUNS (default 400) sets the bodies
// per route, PASTLOAD_FUZZ_SEED the seed (default: a new one, printed, so a failure can be replayed).
import { spawnSync } from 'node:child_process'
import { fileURLToPath } from 'node:url'
import { log } from './lib/log.mjs'

const root = fileURLToPath(new URL('..', import.meta.url))
const runs = process.env.PASTLOAD_FUZZ_RUNS ?? '400'
const seed = process.env.PASTLOAD_FUZZ_SEED ?? String(Math.floor(Math.random() * 2 ** 31))
log('fuzz', `${runs} bodies per route, seed ${seed} (replay with PASTLOAD_FUZZ_SEED=${seed})`)
const r = spawnSync(process.execPath, ['scripts/vitest-with-db.mjs', '--project', 'api', 'tests/api/fuzz-writes.test.ts', ...process.argv.slice(2)], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, PASTLOAD_FUZZ_RUNS: runs, PASTLOAD_FUZZ_SEED: seed },
})
process.exit(r.status ?? 1)
