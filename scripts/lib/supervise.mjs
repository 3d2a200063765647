// Keeps a child process (the app) running: when it dies without being asked to
// stop, it is started again after a bounded, doubling back-off (1 s, 2 s, 4 s …
// at most 30 s). Too many crashes within a window means something is wrong that
// a restart will not fix: the supervisor gives up and says so. Stopping (Ctrl-C,
// SIGTERM) sends SIGTERM to the child and never restarts it.
import { log as defaultLog } from './log.mjs'

export const SUPERVISE_DEFAULTS = {
  baseDelayMs: 1_000,
  maxDelayMs: 30_000,
  // Give up at the sixth crash within ten minutes (five restarts tried).
  maxRestarts: 5,
  windowMs: 10 * 60_000,
  // A child that does not exit within this time after SIGTERM is killed.
  killAfterMs: 10_000,
}

function seconds(ms) {
  if (ms >= 120_000) return `${Math.round(ms / 6_000) / 10} min`
  return ms >= 1000 ? `${Math.round(ms / 100) / 10} s` : `${ms} ms`
}

/** The wait before restart number `n` (1-based): base, 2×base, 4×base … capped at `maxDelayMs`. */
export function restartDelay(n, { baseDelayMs = SUPERVISE_DEFAULTS.baseDelayMs, maxDelayMs = SUPERVISE_DEFAULTS.maxDelayMs } = {}) {
  return Math.min(maxDelayMs, baseDelayMs * 2 ** Math.max(0, n - 1))
}

/**
 * Starts `spawnChild()` (which returns a ChildProcess) and keeps it running.
 * Returns `{ stop, done, current }`: `stop(signal?)` stops the child for good and
 * resolves when it has exited; `done` resolves with `{ reason: 'stopped' | 'gave-up',
 * code, restarts }`; `current()` is the running child (or null while waiting).
 */
export function supervise(spawnChild, options = {}) {
  const o = { ...SUPERVISE_DEFAULTS, ...options }
  const log = o.log ?? (message => defaultLog('app', message))
  const now = o.now ?? Date.now
  let child = null
  let timer = null
  let stopping = false
  let restarts = 0
  let crashes = []
  let finish
  const done = new Promise((resolve) => { finish = resolve })

  const start = () => {
    timer = null
    const startedAt = now()
    const proc = spawnChild()
    child = proc
    let ended = false
    const onEnd = (code, signal) => {
      if (ended) return
      ended = true
      child = null
      if (stopping) {
        finish({ reason: 'stopped', code: code ?? 0, restarts })
        return
      }
      const at = now()
      crashes = crashes.filter(t => at - t < o.windowMs)
      crashes.push(at)
      const how = signal ? `was killed (${signal})` : `exited with code ${code}`
      const ran = seconds(at - startedAt)
      if (crashes.length > o.maxRestarts) {
        log(`The app ${how} after ${ran}: ${crashes.length} crashes within ${seconds(o.windowMs)}, giving up. Fix the cause above and start again.`)
        finish({ reason: 'gave-up', code: code || 1, restarts })
        return
      }
      const delay = restartDelay(crashes.length, o)
      restarts++
      log(`The app ${how} after ${ran}; restarting in ${seconds(delay)} (restart ${crashes.length} of at most ${o.maxRestarts} within ${seconds(o.windowMs)}). The database and object store keep running.`)
      timer = setTimeout(start, delay)
    }
    proc.once('exit', onEnd)
    // A child that could not be started at all emits 'error' and no 'exit'.
    proc.once('error', (err) => {
      log(`The app could not be run: ${err.message}`)
      onEnd(1, null)
    })
  }

  const stop = (signal = 'SIGTERM') => {
    if (!stopping) {
      stopping = true
      if (timer) {
        clearTimeout(timer)
        timer = null
        finish({ reason: 'stopped', code: 0, restarts })
      }
      else if (child) {
        const proc = child
        proc.kill(signal)
        const force = setTimeout(() => proc.kill('SIGKILL'), o.killAfterMs)
        force.unref?.()
        proc.once('exit', () => clearTimeout(force))
      }
    }
    return done
  }

  start()
  return { stop, done, current: () => child }
}
