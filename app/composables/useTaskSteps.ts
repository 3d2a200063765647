import { onBeforeUnmount, onMounted, ref, watch, type Ref } from 'vue'

/**
 * Builds a heavy part of a page in `count` steps, one per task once the component is mounted and `ready()` holds,
 * so the browser can paint and answer input between them instead of running one long task. The returned count of
 * steps taken is 0 on the server and until the first task after the component is mounted and ready; the template
 * shows a part once the count reaches it. A step is not taken while `ready()` is false, and the steps go on from
 * there when it holds again.
 */
export function useTaskSteps(count: number, ready: () => boolean = () => true): Readonly<Ref<number>> {
  const taken = ref(0)
  let timer: ReturnType<typeof setTimeout> | null = null
  let mounted = false
  function next() {
    timer = null
    if (!ready() || taken.value >= count) return
    taken.value++
    if (taken.value < count) timer = setTimeout(next, 0)
  }
  function start() {
    if (mounted && !timer && taken.value < count && ready()) timer = setTimeout(next, 0)
  }
  watch(ready, start)
  onMounted(() => {
    mounted = true
    start()
  })
  onBeforeUnmount(() => {
    if (timer) clearTimeout(timer)
    timer = null
  })
  return taken
}
