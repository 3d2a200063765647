import { afterEach, describe, expect, it, vi } from 'vitest'
import { nextTick, ref } from 'vue'
import { untilReady, type Readiness } from '../../../app/utils/untilReady'

describe('untilReady: waits for a reactive state to be ready, fails on its message or a timeout', () => {
  afterEach(() => { vi.useRealTimers() })

  it('resolves at once when the state is ready already, and rejects at once with a message it gives', async () => {
    await expect(untilReady(() => true, 1000, 'late')).resolves.toBeUndefined()
    await expect(untilReady(() => 'σ\'v0 falls to zero at 4.0 m.', 1000, 'late')).rejects.toThrow('σ\'v0 falls to zero at 4.0 m.')
  })

  it('resolves when the state turns ready, and then watches no more', async () => {
    vi.useFakeTimers()
    const state = ref<Readiness>(false)
    let reads = 0
    let settled = ''
    const p = untilReady(() => { reads++; return state.value }, 5000, 'late').then(() => { settled = 'ready' })
    await nextTick()
    expect(settled).toBe('')
    state.value = true
    await p
    expect(settled).toBe('ready')
    expect(vi.getTimerCount()).toBe(0)
    const before = reads
    state.value = false
    await nextTick()
    state.value = 'too late to matter'
    await nextTick()
    expect(reads).toBe(before)
  })

  it('rejects with the message the state turns to', async () => {
    const state = ref<Readiness>(false)
    const p = untilReady(() => state.value, 5000, 'late')
    state.value = 'The points could not be worked out.'
    await expect(p).rejects.toThrow('The points could not be worked out.')
  })

  it('rejects with the timeout message when the state stays waiting', async () => {
    vi.useFakeTimers()
    const state = ref<Readiness>(false)
    const p = untilReady(() => state.value, 5000, 'Still waiting.')
    const caught = p.catch((e: Error) => e.message)
    await vi.advanceTimersByTimeAsync(4999)
    state.value = false
    await vi.advanceTimersByTimeAsync(1)
    expect(await caught).toBe('Still waiting.')
  })
})
