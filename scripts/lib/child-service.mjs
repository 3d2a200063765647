// A local service (object store, mail catcher) runs in a forked copy of its own script, which
// answers once on the IPC channel: `{ port, … }` when it listens, `{ error, code }` when it cannot.
import { fork } from 'node:child_process'
import { mkdirSync, readdirSync, rmSync } from 'node:fs'
import { join } from 'node:path'

/**
 * Forks `script` with `args` and waits (20 s at most) for its first message. Resolves with the
 * child and that message; rejects with the child's error (its `code` and `port` kept) or when
 * it exits first. The child no longer keeps the parent's event loop alive.
 */
export function forkService(script, args) {
  return new Promise((resolve, reject) => {
    let child
    try {
      child = fork(script, args, { stdio: ['ignore', 'inherit', 'inherit', 'ipc'] })
    }
    catch (err) {
      reject(err)
      return
    }
    const timer = setTimeout(() => {
      child.kill('SIGKILL')
      reject(new Error('no answer within 20 s'))
    }, 20_000)
    child.once('error', (err) => {
      clearTimeout(timer)
      reject(err)
    })
    child.once('exit', (code) => {
      clearTimeout(timer)
      reject(new Error(`it exited with code ${code}`))
    })
    child.once('message', (msg) => {
      clearTimeout(timer)
      child.removeAllListeners('exit')
      if (msg?.error) {
        reject(Object.assign(new Error(msg.error), { code: msg.code, port: msg.port }))
        return
      }
      // The service must not keep the parent's event loop alive, nor outlive it (see each script's `--serve`).
      child.unref()
      child.channel?.unref()
      resolve({ child, msg })
    })
  })
}

/** A `stop()` that ends the child once, removes its folder when asked, and says so. */
export function stopper(child, directory, removeOnStop, said) {
  let running = true
  return () => {
    if (!running) return
    running = false
    child.kill('SIGTERM')
    if (removeOnStop) rmSync(directory, { recursive: true, force: true })
    said()
  }
}

function alive(pid) {
  try {
    process.kill(pid, 0)
    return true
  }
  catch (err) {
    return err.code === 'EPERM'
  }
}

/**
 * The service's folder `.data/<name>`, created. `fresh` (test runs) first removes it and the
 * per-run folders `<prefix>-test-<pid>` / `<prefix>-bench-<pid>` of runs that were killed.
 */
export function serviceFolder(projectRoot, name, prefix, fresh) {
  const dataDir = join(projectRoot, '.data')
  const directory = join(dataDir, name)
  if (fresh) {
    let entries = []
    try { entries = readdirSync(dataDir) }
    catch { entries = [] }
    const stale = new RegExp(`^${prefix}-(?:test|bench)-(\\d+)$`)
    for (const entry of entries) {
      const m = stale.exec(entry)
      if (m && !alive(Number(m[1]))) rmSync(join(dataDir, entry), { recursive: true, force: true })
    }
    rmSync(directory, { recursive: true, force: true })
  }
  mkdirSync(directory, { recursive: true })
  return directory
}
