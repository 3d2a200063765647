import { performance } from 'node:perf_hooks'

/**
 * Calls `fn` `warmup` times, then `calls` times timed one after another: the median and p95 in ms and the
 * last call's answer (for a check or a page count).
 */
export async function timeCalls<T>(fn: () => Promise<T>, opts: { warmup: number, calls: number }): Promise<{ median: number, p95: number, last: T }> {
  let last = await fn()
  for (let i = 1; i < opts.warmup; i++) last = await fn()
  const times: number[] = []
  for (let i = 0; i < opts.calls; i++) {
    const t0 = performance.now()
    last = await fn()
    times.push(performance.now() - t0)
  }
  times.sort((a, b) => a - b)
  return { median: times[Math.floor(times.length / 2)] ?? Number.NaN, p95: times[Math.floor(times.length * 0.95)] ?? Number.NaN, last }
}
