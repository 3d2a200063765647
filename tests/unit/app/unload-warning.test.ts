// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { createApp, defineComponent, h, nextTick, ref } from 'vue'
import { useUnloadWarning } from '../../../app/composables/useUnloadWarning'

/** Mounts a component that warns while `unsaved` holds. */
function mountWarning(unsaved: () => boolean, message?: string) {
  const app = createApp(defineComponent({
    setup() {
      useUnloadWarning(unsaved, message)
      return () => h('div')
    },
  }))
  app.mount(document.createElement('div'))
  return app
}

/** Fires the event the browser sends before it leaves the page; answers whether leaving would be questioned. */
function leave(): { asked: boolean, returned: unknown } {
  const e = new Event('beforeunload', { cancelable: true }) as BeforeUnloadEvent
  window.dispatchEvent(e)
  return { asked: e.defaultPrevented, returned: e.returnValue }
}

describe('useUnloadWarning: the browser asks before leaving only while something is unsaved', () => {
  afterEach(() => { vi.restoreAllMocks() })

  it('listens only while unsaved holds, and asks when it does', async () => {
    const adds = vi.spyOn(window, 'addEventListener')
    const unsaved = ref(false)
    const app = mountWarning(() => unsaved.value)
    // Nothing to lose while the page opens: no listener at all.
    expect(adds.mock.calls.filter(c => c[0] === 'beforeunload')).toHaveLength(0)
    expect(leave().asked).toBe(false)
    unsaved.value = true
    await nextTick()
    expect(adds.mock.calls.filter(c => c[0] === 'beforeunload')).toHaveLength(1)
    expect(leave().asked).toBe(true)
    unsaved.value = false
    await nextTick()
    expect(leave().asked).toBe(false)
    app.unmount()
  })

  it('gives the message to browsers that show one, and stops listening when the component goes', async () => {
    const removes = vi.spyOn(window, 'removeEventListener')
    const unsaved = ref(true)
    const app = mountWarning(() => unsaved.value, 'The log has unsaved edits.')
    await nextTick()
    expect(leave()).toEqual({ asked: true, returned: 'The log has unsaved edits.' })
    app.unmount()
    expect(removes.mock.calls.filter(c => c[0] === 'beforeunload')).toHaveLength(1)
    expect(leave().asked).toBe(false)
  })
})
