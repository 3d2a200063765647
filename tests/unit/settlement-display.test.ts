import { describe, expect, it } from 'vitest'
import { contourThresholds, gridToPlan, settlementBands, settlementColour } from '../../app/utils/settlementContours'
import { formatDistortion, formatSettlement, formatYears, settlementFactor } from '../../app/utils/settlementUnits'

describe('settlement units', () => {
  it('shows metres as millimetres (SI) or inches (US, 1 in = 0.0254 m exactly, NIST SP 811 2008 App. B.8)', () => {
    expect(settlementFactor('SI')).toBe(1000)
    expect(settlementFactor('US')).toBeCloseTo(1 / 0.0254, 12)
    expect(formatSettlement(0.1234, 'SI')).toBe('123.4 mm')
    expect(formatSettlement(0.0254, 'US')).toBe('1.00 in')
    expect(formatSettlement(-0.00001, 'SI')).toBe('0.0 mm')
    expect(formatSettlement(null, 'SI')).toBe('—')
    expect(formatSettlement(0.5, 'SI', false)).toBe('500.0')
  })

  it('writes durations and angular distortion plainly', () => {
    expect(formatYears(0.5)).toBe('6.0 months')
    expect(formatYears(0.01)).toBe('4 days')
    expect(formatYears(3.456)).toBe('3.5 years')
    expect(formatYears(25.4)).toBe('25 years')
    expect(formatYears(null)).toBe('—')
    expect(formatDistortion(1 / 500)).toBe('1/500')
    expect(formatDistortion(1 / 1234.4)).toBe('1/1,230')
    expect(formatDistortion(0)).toBe('0')
  })
})

describe('settlement contours', () => {
  it('places thresholds at round display values below the maximum', () => {
    // 0.123 m in mm: 0–123 → ticks at every 20 mm.
    expect(contourThresholds(0.123, 1000, 6).map(v => Math.round(v * 1000))).toEqual([20, 40, 60, 80, 100, 120])
    expect(contourThresholds(0, 1000)).toEqual([])
  })

  it('ramps from pale to dark', () => {
    expect(settlementColour(0)).toBe('rgb(246, 239, 220)')
    expect(settlementColour(1)).toBe('rgb(12, 36, 43)')
  })

  it('draws one band per threshold over a cone of settlement, the inner ones smaller', () => {
    const xs = [0, 1, 2, 3, 4, 5, 6, 7, 8]
    const ys = xs
    const settlement = ys.map(y => xs.map(x => Math.max(0, 0.1 - 0.02 * Math.hypot(x - 4, y - 4))))
    const bands = settlementBands({ xs, ys, settlement }, [0.02, 0.05, 0.08])
    expect(bands.map(b => b.value.toFixed(2))).toEqual(['-0.00', '0.02', '0.05', '0.08'])
    const area = (b: (typeof bands)[number]) => b.geometry.coordinates.flat().reduce((s, ring) => {
      let a = 0
      for (let k = 0; k < ring.length - 1; k++) a += ring[k]![0]! * ring[k + 1]![1]! - ring[k + 1]![0]! * ring[k]![1]!
      return s + Math.abs(a) / 2
    }, 0)
    const areas = bands.map(area)
    for (let k = 1; k < areas.length; k++) expect(areas[k]!).toBeLessThan(areas[k - 1]!)
    // The 0.05 m contour of s = 0.1 − 0.02 r is the circle r = 2.5 (area ≈ 19.6 cell²).
    expect(areas[2]!).toBeGreaterThan(17)
    expect(areas[2]!).toBeLessThan(20.5)
  })

  it('maps d3-contour index space back to plan metres', () => {
    const toPlan = gridToPlan({ xs: [100, 105, 110], ys: [-20, -10] })
    expect(toPlan(0.5, 0.5)).toEqual({ x: 100, y: -20 })
    expect(toPlan(2.5, 1.5)).toEqual({ x: 110, y: -10 })
  })
})
