// @vitest-environment happy-dom
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { createApp, defineComponent, h, nextTick, ref } from 'vue'
import { useTaskSteps } from '../../../app/composables/useTaskSteps'

/** Mounts a component that builds `count` parts with the steps, and reads what it shows. */
function mountSteps(count: number, ready?: () => boolean) {
  let steps!: ReturnType<typeof useTaskSteps>
  const el = document.createElement('div')
  const app = createApp(defineComponent({
    setup() {
      steps = useTaskSteps(count, ready)
      return () => h('div', Array.from({ length: steps.value }, (_v, k) => h('p', `part ${k + 1}`)))
    },
  }))
  app.mount(el)
  return { el, app, steps: () => steps.value, shown: () => el.querySelectorAll('p').length }
}

/** Runs the next waiting task (or all of them) and lets Vue render what they changed; answers the steps taken. */
async function runTasks(m: ReturnType<typeof mountSteps>, which: 'next' | 'all'): Promise<number> {
  if (which === 'next') vi.advanceTimersToNextTimer()
  else vi.runAllTimers()
  await nextTick()
  return m.steps()
}

describe('useTaskSteps: a part built in steps, one per task', () => {
  beforeEach(() => { vi.useFakeTimers() })
  afterEach(() => { vi.useRealTimers() })

  it('takes no step in the task that mounts the component, then one per task up to the count', async () => {
    const m = mountSteps(3)
    await nextTick()
    expect(m.steps()).toBe(0)
    for (const k of [1, 2, 3]) {
      expect(await runTasks(m, 'next')).toBe(k)
      expect(m.shown()).toBe(k)
    }
    // Past the count no further step is taken.
    expect(await runTasks(m, 'all')).toBe(3)
    expect(m.shown()).toBe(3)
    m.app.unmount()
  })

  it('waits for ready, pauses when it stops holding and goes on from there when it holds again', async () => {
    const ready = ref(false)
    const m = mountSteps(4, () => ready.value)
    expect(await runTasks(m, 'all')).toBe(0)
    ready.value = true
    await nextTick()
    expect(await runTasks(m, 'next')).toBe(1)
    ready.value = false
    expect(await runTasks(m, 'all')).toBe(1)
    ready.value = true
    await nextTick()
    expect(await runTasks(m, 'all')).toBe(4)
    expect(m.shown()).toBe(4)
    m.app.unmount()
  })

  it('leaves no task behind when the component is unmounted half-way', async () => {
    const m = mountSteps(5)
    expect(await runTasks(m, 'next')).toBe(1)
    expect(vi.getTimerCount()).toBe(1)
    m.app.unmount()
    expect(vi.getTimerCount()).toBe(0)
  })
})
