/**
 * Device pixels per CSS pixel for a drawing canvas's backing store. Beyond two, a phone's sharper screen adds little
 * to a plot of points and lines, while the canvas's memory and every redraw grow with the square of the ratio (a
 * 760 × 560 px canvas at 3× holds 3.8 million pixels, 15 MB, against 1.7 million at 2×).
 */
export const MAX_CANVAS_PIXEL_RATIO = 2

/** The screen's pixel ratio for a canvas, at least 1 and at most `MAX_CANVAS_PIXEL_RATIO`. */
export function canvasPixelRatio(screenRatio: number | undefined = globalThis.devicePixelRatio): number {
  if (!screenRatio || !Number.isFinite(screenRatio) || screenRatio < 1) return 1
  return Math.min(screenRatio, MAX_CANVAS_PIXEL_RATIO)
}
