// @vitest-environment happy-dom
import { flushPromises, mount } from '@vue/test-utils'
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h, nextTick, ref } from 'vue'
import { useDrawingDownload } from '../../../app/composables/useDrawingDownload'
import { useElementWidth, useMeasuredWidth } from '../../../app/composables/useElementWidth'

/**
 * A ResizeObserver the test drives: like the browser's, it reports the element's width once when it starts
 * observing (after the current task), then `resize(w)` reports a new content width to every live observer.
 */
class FakeObserver {
  static live: FakeObserver[] = []
  constructor(private readonly report: (entries: { contentRect: { width: number } }[]) => void) {}
  observe(el: HTMLElement) {
    FakeObserver.live.push(this)
    queueMicrotask(() => { if (FakeObserver.live.includes(this)) this.report([{ contentRect: { width: el.clientWidth } }]) })
  }
  disconnect() { FakeObserver.live = FakeObserver.live.filter(o => o !== this) }
  static resize(width: number) { for (const o of FakeObserver.live) o.report([{ contentRect: { width } }]) }
}

/** A box of `clientWidth` px showing the width the composable gives. */
function widthBox(clientWidth: number, options: { initial: number, min?: number }) {
  return defineComponent({
    setup() {
      const root = ref<HTMLElement | null>(null)
      const width = useElementWidth(root, options)
      return () => h('div', { ref: (el) => {
        if (el) Object.defineProperty(el, 'clientWidth', { value: clientWidth, configurable: true })
        root.value = el as HTMLElement | null
      } }, String(width.value))
    },
  })
}

describe('useElementWidth', () => {
  afterEach(() => {
    vi.unstubAllGlobals()
    FakeObserver.live = []
  })

  it('starts at the initial width, takes the box\'s width when mounted and follows it, never below the minimum', async () => {
    vi.stubGlobal('ResizeObserver', FakeObserver)
    const w = mount(widthBox(612.4, { initial: 900, min: 300 }))
    await flushPromises()
    expect(w.text()).toBe('612')
    FakeObserver.resize(480.6)
    await nextTick()
    expect(w.text()).toBe('481')
    FakeObserver.resize(120)
    await nextTick()
    expect(w.text()).toBe('300')
    w.unmount()
    expect(FakeObserver.live).toHaveLength(0)
  })

  it('with no minimum, a narrow box gives its own width', async () => {
    vi.stubGlobal('ResizeObserver', FakeObserver)
    const w = mount(widthBox(250, { initial: 960 }))
    await flushPromises()
    expect(w.text()).toBe('250')
  })

  it('says when the width is measured: not before the box has been laid out, then from its first report on', async () => {
    vi.stubGlobal('ResizeObserver', FakeObserver)
    const seen: string[] = []
    const Box = defineComponent({
      setup() {
        const root = ref<HTMLElement | null>(null)
        const { width, measured } = useMeasuredWidth(root, { initial: 900, min: 300 })
        return () => {
          seen.push(`${width.value}:${measured.value}`)
          return h('div', { ref: (el) => {
            if (el) Object.defineProperty(el, 'clientWidth', { value: 640, configurable: true })
            root.value = el as HTMLElement | null
          } }, `${width.value} ${measured.value ? 'measured' : 'waiting'}`)
        }
      },
    })
    const w = mount(Box)
    expect(w.text()).toBe('900 waiting')
    await flushPromises()
    expect(w.text()).toBe('640 measured')
    // Built at the initial width, then once at the measured width: no render at a width that is not the box's.
    expect(seen).toEqual(['900:false', '640:true'])
  })
})

describe('useDrawingDownload', () => {
  it('shows why a drawing could not be downloaded, and clears it on the next try', async () => {
    let ready = false
    const d = useDrawingDownload(() => {
      if (!ready) throw new Error('The drawing is not ready.')
      return '<svg width="10" height="10"></svg>'
    }, 'plot')
    d.asSvg()
    expect(d.error.value).toBe('The drawing is not ready.')
    await d.asPng()
    expect(d.error.value).toBe('The drawing is not ready.')
    expect(d.busy.value).toBe(false)
    ready = true
    const created = vi.fn(() => 'blob:plot')
    vi.stubGlobal('URL', Object.assign(Object.create(URL), { createObjectURL: created, revokeObjectURL: () => {} }))
    const clicked: string[] = []
    const click = vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) { clicked.push(this.download) })
    d.asSvg()
    expect(d.error.value).toBe('')
    expect(clicked).toEqual(['plot.svg'])
    click.mockRestore()
    vi.unstubAllGlobals()
  })
})
