import { onBeforeUnmount, onMounted, ref, type Ref } from 'vue'

/**
 * The width of an element in whole px, followed with a ResizeObserver while the component is
 * mounted: `initial` until it mounts (what the server renders), then the element's width, never
 * below `min`. The plots draw at this width, so a narrow box gets a smaller drawing, not a squeezed one.
 */
export function useElementWidth(target: Ref<HTMLElement | null>, options: { initial: number, min?: number }): Ref<number> {
  const min = options.min ?? 0
  const width = ref(options.initial)
  let observer: ResizeObserver | null = null
  onMounted(() => {
    const el = target.value
    if (!el) return
    width.value = Math.max(min, Math.round(el.clientWidth))
    observer = new ResizeObserver((entries) => {
      const w = Math.max(min, Math.round(entries[0]?.contentRect.width ?? width.value))
      if (w !== width.value) width.value = w
    })
    observer.observe(el)
  })
  onBeforeUnmount(() => observer?.disconnect())
  return width
}
