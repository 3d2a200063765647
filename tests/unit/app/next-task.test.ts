import { afterEach, describe, expect, it, vi } from 'vitest'
import { nextTask } from '../../../app/utils/nextTask'

describe('nextTask: resolves in the next task, not by a timer', () => {
  afterEach(() => { vi.useRealTimers() })

  it('resolves after the current task and every microtask it queued', async () => {
    const order: string[] = []
    const done = nextTask().then(() => order.push('next task'))
    void Promise.resolve().then(() => order.push('microtask')).then(() => order.push('chained microtask'))
    order.push('same task')
    await done
    expect(order).toEqual(['same task', 'microtask', 'chained microtask', 'next task'])
  })

  it('needs no timer: it resolves while timers are held', async () => {
    vi.useFakeTimers()
    let resolved = false
    const p = nextTask().then(() => { resolved = true })
    // No timer is advanced: only the channel's message can resolve it.
    await p
    expect(resolved).toBe(true)
    expect(vi.getTimerCount()).toBe(0)
  })
})
