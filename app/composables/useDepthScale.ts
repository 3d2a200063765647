import * as d3 from 'd3'

/**
 * The one depth axis every track of the stress workspace shares: a linear scale
 * from depth (m, down) to screen y, zoomed and panned on y only by d3.zoom on the
 * whole drawing. Handles (anything marked `data-handle`) and shift-drags (the
 * lasso) are left to their own gestures; double-click is left to the tracks.
 */
export function useDepthScale(options: {
  domain: MaybeRefOrGetter<[number, number]>
  /** Top and bottom of the plotting band in px. */
  range: MaybeRefOrGetter<[number, number]>
  maxZoom?: number
}) {
  const transform = shallowRef<d3.ZoomTransform>(d3.zoomIdentity)
  const base = computed(() => d3.scaleLinear().domain(toValue(options.domain)).range(toValue(options.range)))
  const y = computed(() => transform.value.rescaleY(base.value))
  let behaviour: d3.ZoomBehavior<SVGSVGElement, unknown> | null = null
  let target: SVGSVGElement | null = null

  /** The drawing's width, read when a zoom first needs it (not while the drawing mounts: that would force a layout), then kept until the window is resized. */
  let width = 0
  const forgetWidth = () => { width = 0 }
  function configure() {
    if (!behaviour || !target) return
    const [top, bottom] = toValue(options.range)
    const el = target
    forgetWidth()
    behaviour
      .extent(() => [[0, top], [(width ||= el.clientWidth || 1000), bottom]])
      .translateExtent([[-Infinity, top], [Infinity, bottom]])
  }

  function attach(el: SVGSVGElement) {
    target = el
    behaviour = d3.zoom<SVGSVGElement, unknown>()
      .scaleExtent([1, options.maxZoom ?? 60])
      .filter((event: Event) => {
        const e = event as MouseEvent & WheelEvent
        const t = e.target as Element | null
        if (t?.closest?.('[data-handle]')) return false
        if (e.type === 'dblclick') return false
        if (e.shiftKey && e.type !== 'wheel') return false
        return (!e.ctrlKey || e.type === 'wheel') && !e.button
      })
      .on('zoom', (e: d3.D3ZoomEvent<SVGSVGElement, unknown>) => {
        // Depth only: keep the x translation at 0 so the tracks never slide sideways.
        transform.value = d3.zoomIdentity.translate(0, e.transform.y).scale(e.transform.k)
      })
    configure()
    d3.select(el).call(behaviour).on('dblclick.zoom', null)
    window.addEventListener('resize', forgetWidth)
  }

  function detach() {
    window.removeEventListener('resize', forgetWidth)
    if (target) d3.select(target).on('.zoom', null)
    target = null
    behaviour = null
  }

  /** Shows depths [top, bottom] (m) over the whole plotting band. */
  function showDepths(top: number, bottom: number) {
    if (!behaviour || !target) return
    const [r0, r1] = toValue(options.range)
    const b = base.value
    const k = Math.max(1, (r1 - r0) / Math.max(1e-6, b(bottom) - b(top)))
    const ty = r0 - k * b(top)
    d3.select(target).call(behaviour.transform, d3.zoomIdentity.translate(0, ty).scale(k))
  }

  function reset() {
    if (behaviour && target) d3.select(target).call(behaviour.transform, d3.zoomIdentity)
  }

  /** Scripted zoom about a screen y (benchmarks, keyboard). */
  function zoomBy(factor: number, atY?: number) {
    if (!behaviour || !target) return
    const [r0, r1] = toValue(options.range)
    d3.select(target).call(behaviour.scaleBy, factor, [0, atY ?? (r0 + r1) / 2])
  }

  function panBy(dy: number) {
    if (behaviour && target) d3.select(target).call(behaviour.translateBy, 0, dy)
  }

  watch(() => [toValue(options.range), toValue(options.domain)], configure)

  return { y, transform, attach, detach, showDepths, reset, zoomBy, panBy }
}

export type DepthScale = ReturnType<typeof useDepthScale>
