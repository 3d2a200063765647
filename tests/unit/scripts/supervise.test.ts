// The app supervisor of `npm start` (scripts/lib/supervise.mjs), run against tiny
// child scripts that crash or keep running. Delays are tiny so the file runs fast;
// the assertions are on what happened (starts, log lines, outcome), never on time.
import { spawn, type ChildProcess } from 'node:child_process'
import { describe, expect, it } from 'vitest'
import { restartDelay, supervise } from '../../../scripts/lib/supervise.mjs'

const FAST = { baseDelayMs: 5, maxDelayMs: 20, killAfterMs: 5_000 }

function node(code: string): ChildProcess {
  return spawn(process.execPath, ['-e', code], { stdio: ['ignore', 'pipe', 'inherit'] })
}

/** Resolves when the child prints its first line (it is running its script). */
function ready(child: ChildProcess): Promise<void> {
  return new Promise(resolve => child.stdout!.once('data', () => resolve()))
}

describe('app supervisor', () => {
  it('doubles the wait between restarts up to the cap', () => {
    expect([1, 2, 3, 4, 5, 6, 7].map(n => restartDelay(n))).toEqual([1000, 2000, 4000, 8000, 16000, 30000, 30000])
    expect([1, 2, 3].map(n => restartDelay(n, { baseDelayMs: 5, maxDelayMs: 12 }))).toEqual([5, 10, 12])
  })

  it('restarts a crashing app with a growing back-off and gives up after too many crashes in the window', async () => {
    const lines: string[] = []
    let starts = 0
    const s = supervise(() => {
      starts++
      return node('process.exit(3)')
    }, { ...FAST, maxRestarts: 3, windowMs: 60_000, log: m => lines.push(m) })
    const result = await s.done
    expect(result).toEqual({ reason: 'gave-up', code: 3, restarts: 3 })
    expect(starts).toBe(4)
    expect(lines).toHaveLength(4)
    expect(lines[0]).toMatch(/^The app exited with code 3 after .+; restarting in 5 ms \(restart 1 of at most 3 within 60 s\)/)
    expect(lines[1]).toMatch(/restarting in 10 ms \(restart 2 of at most 3/)
    expect(lines[2]).toMatch(/restarting in 20 ms \(restart 3 of at most 3/)
    expect(lines[3]).toMatch(/^The app exited with code 3 after .+: 4 crashes within 60 s, giving up/)
  })

  it('forgets crashes older than the window', async () => {
    const lines: string[] = []
    let clock = 0
    let starts = 0
    // Each crash happens "an hour" after the previous one on the supervisor's clock.
    const s = supervise(() => {
      starts++
      clock += 3_600_000
      return node(starts < 5 ? 'process.exit(1)' : 'console.log("up"); setInterval(() => {}, 1000)')
    }, { ...FAST, maxRestarts: 1, windowMs: 60_000, now: () => clock, log: m => lines.push(m) })
    while (starts < 5) await new Promise(r => setTimeout(r, 10))
    await ready(s.current()!)
    expect(lines.every(l => /restart 1 of at most 1/.test(l))).toBe(true)
    expect(lines).toHaveLength(4)
    expect(await s.stop()).toEqual({ reason: 'stopped', code: 0, restarts: 4 })
  })

  it('brings a killed app back and stops it for good on request', async () => {
    const lines: string[] = []
    const children: ChildProcess[] = []
    const s = supervise(() => {
      const c = node('process.on("SIGTERM", () => process.exit(0)); setInterval(() => {}, 1000); console.log("up")')
      children.push(c)
      return c
    }, { ...FAST, log: m => lines.push(m) })
    await ready(children[0]!)
    children[0]!.kill('SIGKILL')
    while (children.length < 2) await new Promise(r => setTimeout(r, 10))
    await ready(children[1]!)
    expect(lines).toHaveLength(1)
    expect(lines[0]).toMatch(/^The app was killed \(SIGKILL\) after .+; restarting in 5 ms/)

    const result = await s.stop()
    expect(result).toEqual({ reason: 'stopped', code: 0, restarts: 1 })
    expect([children[1]!.exitCode, children[1]!.signalCode]).toEqual([0, null])
    // Stopping never restarts.
    await new Promise(r => setTimeout(r, 50))
    expect(children).toHaveLength(2)
    expect(s.current()).toBeNull()
  })
})
