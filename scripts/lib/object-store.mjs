// A local S3-compatible object store for attachments: the `s3rver` package,
// run in a child process (so scripts that block in spawnSync keep it serving),
// on 127.0.0.1 with its files under `.data/<name>`. Used by `npm start`,
// `npm run dev`, `npm test` and `npm run bench` unless PASTLOAD_S3_ENDPOINT or
// PASTLOAD_S3_BUCKET points at a real store.
import { createServer } from 'node:http'
import { fileURLToPath } from 'node:url'
import { forkService, serviceFolder, stopper } from './child-service.mjs'
import { log } from './log.mjs'

const SELF = fileURLToPath(import.meta.url)
export const FAKE_BUCKET = 'pastload'
// s3rver accepts exactly this key pair (its built-in account); the store listens on loopback only.
const FAKE_KEY = 'S3RVER'

/** True when the environment already names an object store, so no fake is started. */
export function externalObjectStore(env = process.env) {
  return Boolean(env.PASTLOAD_S3_ENDPOINT || env.PASTLOAD_S3_BUCKET)
}

function envFor(port) {
  return {
    PASTLOAD_S3_ENDPOINT: `http://127.0.0.1:${port}`,
    PASTLOAD_S3_REGION: 'us-east-1',
    PASTLOAD_S3_BUCKET: FAKE_BUCKET,
    PASTLOAD_S3_ACCESS_KEY_ID: FAKE_KEY,
    PASTLOAD_S3_SECRET_ACCESS_KEY: FAKE_KEY,
    PASTLOAD_S3_FORCE_PATH_STYLE: '1',
  }
}

/** Does an S3 service already answer on the port (e.g. our fake from another terminal)? */
async function answersLikeS3(port) {
  try {
    const r = await fetch(`http://127.0.0.1:${port}/`, { signal: AbortSignal.timeout(2000) })
    return /ListAllMyBucketsResult|<Error>/.test(await r.text())
  }
  catch {
    return false
  }
}



/**
 * Starts the fake on 127.0.0.1:`port` (0: a free port) with the bucket created,
 * and returns `{ env, stop, port }`: `env` holds the PASTLOAD_S3_* variables for
 * the app; `stop()` (synchronous) stops the store only if this call started it.
 * `fresh` empties `.data/<name>` first and removes it on stop (test runs).
 * `optional`: when the fake cannot start, log why and return an empty env, so the
 * app still starts (attachments then answer 503).
 */
export async function startObjectStore({ projectRoot, name, port, fresh = false, optional = false }) {
  try {
    const directory = serviceFolder(projectRoot, name, 's3', fresh)
    return await launch(directory, port, fresh)
  }
  catch (err) {
    if (err.code === 'EADDRINUSE' && port && await answersLikeS3(port)) {
      log('s3', `Reusing the object store already running on port ${port}`)
      return { env: envFor(port), port, stop: () => {} }
    }
    const why = err.code === 'EADDRINUSE' ? `port ${port} is in use by another program: choose another with PASTLOAD_S3_PORT or PASTLOAD_TEST_S3_PORT` : err.message
    if (!optional) throw new Error(`The local object store did not start: ${why}`)
    log('s3', `The local object store did not start (${why}): attachments are off until PASTLOAD_S3_* point at a store.`)
    return { env: {}, port: null, stop: () => {} }
  }
}

async function launch(directory, port, removeOnStop) {
  const { child, msg } = await forkService(SELF, ['--serve', directory, String(port ?? 0)])
  log('s3', `Object store (s3rver) on http://127.0.0.1:${msg.port}, bucket "${FAKE_BUCKET}", data in ${directory}`)
  const stop = stopper(child, directory, removeOnStop, () => log('s3', `Object store on port ${msg.port} stopped`))
  return { env: envFor(msg.port), port: msg.port, stop }
}

async function serve(directory, port) {
  let http
  try {
    const { default: S3rver } = await import('s3rver')
    const store = new S3rver({ silent: true, directory, configureBuckets: [{ name: FAKE_BUCKET }] })
    await store.configureBuckets()
    // s3rver is a Koa app: serve its handler from our own server so a busy port is reported, not thrown.
    http = createServer(store.callback())
    await new Promise((resolve, reject) => {
      http.once('error', reject)
      http.listen(port, '127.0.0.1', resolve)
    })
  }
  catch (err) {
    const missing = err.code === 'ERR_MODULE_NOT_FOUND'
    process.send?.({ error: missing ? 's3rver is not installed (it is a devDependency: run `npm ci` without --omit=dev)' : err.message, code: err.code })
    process.exit(1)
  }
  const close = () => {
    http.close(() => process.exit(0))
    http.closeAllConnections()
  }
  process.on('SIGTERM', close)
  process.on('SIGINT', close)
  // The parent went away (even by kill -9): its IPC channel closes, and so does the store.
  process.on('disconnect', close)
  process.send?.({ port: http.address().port })
}

if (process.argv[1] === SELF && process.argv[2] === '--serve') {
  serve(process.argv[3], Number(process.argv[4]))
}
