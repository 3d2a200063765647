import type { Ref } from 'vue'
import TrackLayerWorker from '~/workers/trackLayer.worker?worker'
import { createLayerPainter, type LayerMessage, type LayerPainter, type LayerReply } from '~/utils/trackLayers'

/** Where a layer is painted: by its worker, or on the page itself. */
export type PainterPlace = 'worker' | 'page'

/**
 * A canvas layer of the stress workspace painted by a worker of its own: once mounted, the canvas is handed
 * over (`transferControlToOffscreen`) and `send` passes what to draw; each draw's reply (count, time) comes to
 * `onDrawn`. Where a browser cannot hand a canvas over or start the worker — or the worker fails — the same
 * painter (`app/utils/trackLayers.ts`) draws on the page itself, on a new canvas (bind `canvasKey` to the
 * canvas's `key`: a canvas once handed over cannot be drawn on here), from the last rows and view it was sent.
 */
export function useLayerPainter(canvas: Ref<HTMLCanvasElement | null>, onDrawn: (reply: LayerReply) => void) {
  const place = ref<PainterPlace | null>(null)
  const canvasKey = ref(0)
  let worker: Worker | null = null
  let local: LayerPainter | null = null
  /** The last rows and the last draw sent, replayed when the page takes over from a failed worker. */
  let rows: LayerMessage | null = null
  let last: LayerMessage | null = null

  function paintHere() {
    place.value = 'page'
    const cv = canvas.value
    if (!cv) return
    local = createLayerPainter(cv)
    if (rows) local.handle(rows)
    const reply = last && local.handle(last)
    if (reply) onDrawn(reply)
  }
  function workerFailed() {
    worker?.terminate()
    worker = null
    canvasKey.value++
    void nextTick(paintHere)
  }

  onMounted(() => {
    const cv = canvas.value
    if (!cv) return
    if (typeof cv.transferControlToOffscreen === 'function' && typeof Worker === 'function') {
      try {
        worker = new TrackLayerWorker()
        worker.addEventListener('message', (e: MessageEvent<LayerReply>) => onDrawn(e.data))
        worker.addEventListener('error', workerFailed)
        const offscreen = cv.transferControlToOffscreen()
        worker.postMessage({ kind: 'canvas', canvas: offscreen }, [offscreen])
        place.value = 'worker'
        return
      }
      catch {
        // The canvas was not handed over (no worker could start): it is drawn here.
        worker?.terminate()
        worker = null
      }
    }
    paintHere()
  })
  onBeforeUnmount(() => {
    worker?.terminate()
    worker = null
  })

  function send(message: LayerMessage) {
    if (message.kind === 'dense-rows') rows = message
    else last = message
    if (worker) {
      worker.postMessage(message)
      return
    }
    const reply = local?.handle(message)
    if (reply) onDrawn(reply)
  }
  return { send, place, canvasKey }
}
