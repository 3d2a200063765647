import { watch } from 'vue'

/** Ready (`true`), still waiting (`false`), or why it cannot become ready (the message). */
export type Readiness = boolean | string

/**
 * Resolves once `state()` reads `true`; rejects with the message `state()` gives as soon as it gives one, or with
 * `timeoutMessage` when `timeoutMs` pass first. It follows the reactive values `state` reads and stops watching
 * them once settled.
 */
export function untilReady(state: () => Readiness, timeoutMs: number, timeoutMessage: string): Promise<void> {
  const now = state()
  if (now === true) return Promise.resolve()
  if (typeof now === 'string') return Promise.reject(new Error(now))
  return new Promise((resolve, reject) => {
    const stop = watch(state, (s) => {
      if (s === false) return
      finish()
      if (s === true) resolve()
      else reject(new Error(s))
    })
    const timer = setTimeout(() => {
      finish()
      reject(new Error(timeoutMessage))
    }, timeoutMs)
    function finish() {
      clearTimeout(timer)
      stop()
    }
  })
}
