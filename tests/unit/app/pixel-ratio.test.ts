import { describe, expect, it } from 'vitest'
import { canvasPixelRatio, MAX_CANVAS_PIXEL_RATIO } from '../../../app/utils/pixelRatio'

describe('canvasPixelRatio', () => {
  it('keeps the screen\'s ratio from 1 up to 2, fractional ratios included', () => {
    expect(canvasPixelRatio(1)).toBe(1)
    expect(canvasPixelRatio(1.75)).toBe(1.75)
    expect(canvasPixelRatio(2)).toBe(2)
  })

  it('draws a 3× or 3.5× phone\'s canvases at 2×', () => {
    expect(MAX_CANVAS_PIXEL_RATIO).toBe(2)
    expect(canvasPixelRatio(3)).toBe(2)
    expect(canvasPixelRatio(3.5)).toBe(2)
  })

  it('reads 1 for a missing, zero, negative, zoomed-out or non-finite ratio', () => {
    for (const r of [undefined, 0, -2, 0.5, Number.NaN, Number.POSITIVE_INFINITY]) expect(canvasPixelRatio(r)).toBe(1)
  })
})
