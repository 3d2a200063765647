import { getCurrentScope, onScopeDispose } from 'vue'

/**
 * The one way a request that follows edits is asked: `schedule()` waits `delay` ms
 * of quiet (`schedule(true)`: at once), then aborts the request still in flight
 * and runs `task` with a fresh signal. The task hands the signal to its fetch (or
 * to `refresh({ signal })` of a `useAsyncData`) and drops an answer whose signal
 * was aborted, so an older answer never lands over a newer one. Everything stops
 * with the calling component.
 */
export function useLatestRequest(task: (signal: AbortSignal) => Promise<unknown>, delay: number) {
  let timer: ReturnType<typeof setTimeout> | null = null
  let controller: AbortController | null = null

  function run() {
    controller?.abort()
    const mine = new AbortController()
    controller = mine
    // A failure is the task's to show (an error ref or the asyncData's error).
    task(mine.signal).catch(() => {})
  }

  function schedule(immediate = false) {
    if (import.meta.server) return
    if (timer) clearTimeout(timer)
    timer = null
    if (immediate) return run()
    timer = setTimeout(() => {
      timer = null
      run()
    }, delay)
  }

  function cancel() {
    if (timer) clearTimeout(timer)
    timer = null
    controller?.abort()
    controller = null
  }

  if (getCurrentScope()) onScopeDispose(cancel)
  return { schedule, cancel }
}
