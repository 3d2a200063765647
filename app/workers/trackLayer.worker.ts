import { createLayerPainter, type LayerMessage, type LayerPainter } from '~/utils/trackLayers'

/**
 * Paints one of the stress workspace's canvas layers off the page's main thread: the page hands the canvas over
 * (`transferControlToOffscreen`) in its first message, then sends what to draw (`useLayerPainter`). Each draw
 * answers with its count and time; the drawing reaches the screen without the page's thread.
 */
let painter: LayerPainter | null = null

addEventListener('message', (e: MessageEvent<{ kind: 'canvas', canvas: OffscreenCanvas } | LayerMessage>) => {
  const message = e.data
  if (message.kind === 'canvas') {
    painter = createLayerPainter(message.canvas)
    return
  }
  const reply = painter?.handle(message)
  if (reply) postMessage(reply)
})
