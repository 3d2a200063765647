import { onBeforeUnmount, onMounted, watch } from 'vue'

/**
 * The browser asks before the page is closed, reloaded or left for another address while `unsaved()` holds
 * (moves inside the app are guarded by the page's route guards). The `beforeunload` listener is on the window only
 * while there is something to lose: some browsers do not keep a page holding one in their back/forward cache, and
 * adding it while the page opens costs the page's start for nothing.
 */
export function useUnloadWarning(unsaved: () => boolean, message?: string) {
  function onBeforeUnload(e: BeforeUnloadEvent) {
    e.preventDefault()
    // Older browsers show (or at least need) a returned text; current ones show their own words.
    if (message) e.returnValue = message
  }
  let listening = false
  function listen(on: boolean) {
    if (on === listening) return
    listening = on
    if (on) window.addEventListener('beforeunload', onBeforeUnload)
    else window.removeEventListener('beforeunload', onBeforeUnload)
  }
  let stop: (() => void) | null = null
  onMounted(() => {
    stop = watch(unsaved, listen, { immediate: true })
  })
  onBeforeUnmount(() => {
    stop?.()
    listen(false)
  })
}
