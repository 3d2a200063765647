/** A point in the drawing's own coordinates (px of the root <svg>). */
export interface SvgPoint { x: number, y: number }

/** The pointer position of an event in the coordinates of the <svg> that holds `el`. */
export function svgPoint(e: { clientX: number, clientY: number }, el: Element): SvgPoint {
  // The outermost <svg>: tracks clip their content in nested viewports of their own.
  let svg: SVGSVGElement | null = el instanceof SVGSVGElement ? el : (el as SVGElement).ownerSVGElement
  while (svg?.ownerSVGElement) svg = svg.ownerSVGElement
  if (!svg) return { x: 0, y: 0 }
  const m = svg.getScreenCTM()
  if (!m) return { x: 0, y: 0 }
  const p = new DOMPoint(e.clientX, e.clientY).matrixTransform(m.inverse())
  return { x: p.x, y: p.y }
}

/**
 * Follows one pointer from a pointerdown on a handle until it is released, in
 * svg coordinates. The pointer is captured, so the drag survives leaving the
 * handle; the default is prevented so no compatibility mouse events reach d3.zoom.
 */
export function dragPointer(e: PointerEvent, handlers: { move: (p: SvgPoint, ev: PointerEvent) => void, end?: (moved: boolean) => void }) {
  if (e.button !== 0) return
  const el = e.currentTarget as Element
  e.preventDefault()
  e.stopPropagation()
  el.setPointerCapture?.(e.pointerId)
  const start = svgPoint(e, el)
  let moved = false
  const onMove = (ev: PointerEvent) => {
    if (ev.pointerId !== e.pointerId) return
    const p = svgPoint(ev, el)
    if (!moved && Math.hypot(p.x - start.x, p.y - start.y) < 2) return
    moved = true
    handlers.move(p, ev)
  }
  const onUp = (ev: PointerEvent) => {
    if (ev.pointerId !== e.pointerId) return
    el.removeEventListener('pointermove', onMove as EventListener)
    el.removeEventListener('pointerup', onUp as EventListener)
    el.removeEventListener('pointercancel', onUp as EventListener)
    el.releasePointerCapture?.(e.pointerId)
    handlers.end?.(moved)
  }
  el.addEventListener('pointermove', onMove as EventListener)
  el.addEventListener('pointerup', onUp as EventListener)
  el.addEventListener('pointercancel', onUp as EventListener)
}

export { displayTicks } from '#shared/plots/axes'
export type { AxisTick } from '#shared/plots/axes'
