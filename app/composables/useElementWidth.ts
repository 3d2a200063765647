import { onBeforeUnmount, onMounted, ref, type Ref } from 'vue'

/**
 * The width of an element in whole px, followed with a ResizeObserver while the component is
 * mounted: `initial` until it mounts (what the server renders), then the element's width, never
 * below `min`. The plots draw at this width, so a narrow box gets a smaller drawing, not a squeezed one.
 */
export function useElementWidth(target: Ref<HTMLElement | null>, options: { initial: number, min?: number }): Ref<number> {
  return useMeasuredWidth(target, options).width
}

/**
 * `useElementWidth` with `measured`: false until the element's own width is known. A plot that
 * draws its content only once `measured` is true is built once at its real width on the client,
 * instead of at `initial` and again at the measured width (a second render of every element).
 */
export function useMeasuredWidth(target: Ref<HTMLElement | null>, options: { initial: number, min?: number }): { width: Ref<number>, measured: Ref<boolean> } {
  const min = options.min ?? 0
  const width = ref(options.initial)
  const measured = ref(false)
  let observer: ResizeObserver | null = null
  onMounted(() => {
    const el = target.value
    if (!el) return
    // The observer's first answer comes with the next layout, before that frame is painted: reading the width
    // here instead would force a layout of the whole page in the middle of mounting it.
    observer = new ResizeObserver((entries) => {
      const w = Math.max(min, Math.round(entries[0]?.contentRect.width ?? width.value))
      if (w !== width.value) width.value = w
      measured.value = true
    })
    observer.observe(el)
  })
  onBeforeUnmount(() => observer?.disconnect())
  return { width, measured }
}
