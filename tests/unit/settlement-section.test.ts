import { describe, expect, it } from 'vitest'
import { defaultSection, gridValueAt, sectionAlong } from '../../shared/settlement-run/section'

// A grid whose values are a bilinear function s = a + b·x + c·y + d·x·y: bilinear interpolation
// reproduces such a function exactly between nodes (a property of the interpolant, common practice).
const f = (x: number, y: number) => 0.1 + 0.002 * x - 0.001 * y + 0.0001 * x * y
const xs = [0, 5, 10, 15, 20]
const ys = [-10, 0, 10]
const grid = { xs, ys, settlement: ys.map(y => xs.map(x => f(x, y))) }

describe('gridValueAt', () => {
  it('returns the node values at the nodes', () => {
    expect(gridValueAt(grid, 5, 0)).toBeCloseTo(f(5, 0), 12)
    expect(gridValueAt(grid, 20, 10)).toBeCloseTo(f(20, 10), 12)
    expect(gridValueAt(grid, 0, -10)).toBeCloseTo(f(0, -10), 12)
  })

  it('reproduces a bilinear field exactly between the nodes', () => {
    for (const [x, y] of [[2.5, -5], [7.3, 4.1], [19.9, 9.9], [0.1, -9.9], [12, 0]] as const) {
      expect(gridValueAt(grid, x, y)).toBeCloseTo(f(x, y), 12)
    }
  })

  it('is the mean of the four nodes at a cell centre', () => {
    const mean = (f(5, 0) + f(10, 0) + f(5, 10) + f(10, 10)) / 4
    expect(gridValueAt(grid, 7.5, 5)).toBeCloseTo(mean, 12)
  })

  it('is null outside the grid', () => {
    expect(gridValueAt(grid, -0.5, 0)).toBeNull()
    expect(gridValueAt(grid, 10, 10.5)).toBeNull()
    expect(gridValueAt(grid, 25, -20)).toBeNull()
  })
})

describe('sectionAlong', () => {
  it('samples the segment evenly with chainage from its start', () => {
    const s = sectionAlong(grid, { x: 0, y: 0 }, { x: 20, y: 0 }, 5)
    expect(s.length).toBe(20)
    expect(s.samples.map(p => p.chainage)).toEqual([0, 5, 10, 15, 20])
    expect(s.samples.map(p => p.x)).toEqual([0, 5, 10, 15, 20])
    // Along y = 0 the field is 0.1 + 0.002 x: a straight line rising 0.002 m per m.
    s.samples.forEach(p => expect(p.settlement).toBeCloseTo(0.1 + 0.002 * p.x, 12))
    expect(s.max?.x).toBe(20)
    expect(s.min?.x).toBe(0)
    expect(s.maxSlope).toBeCloseTo(0.002, 12)
  })

  it('follows a diagonal and reads the end values', () => {
    const s = sectionAlong(grid, { x: 0, y: -10 }, { x: 20, y: 10 }, 41)
    expect(s.length).toBeCloseTo(Math.hypot(20, 20), 12)
    expect(s.samples[0]!.settlement).toBeCloseTo(f(0, -10), 12)
    expect(s.samples[40]!.settlement).toBeCloseTo(f(20, 10), 12)
    expect(s.samples[20]!.settlement).toBeCloseTo(f(10, 0), 12)
  })

  it('marks samples beyond the grid as null and leaves them out of the extremes', () => {
    const s = sectionAlong(grid, { x: -10, y: 0 }, { x: 10, y: 0 }, 5)
    expect(s.samples.map(p => p.settlement === null)).toEqual([true, true, false, false, false])
    expect(s.min?.x).toBe(0)
    expect(s.max?.x).toBe(10)
  })

  it('has no extremes when the whole section misses the grid', () => {
    const s = sectionAlong(grid, { x: 30, y: 0 }, { x: 40, y: 0 }, 3)
    expect(s.max).toBeNull()
    expect(s.min).toBeNull()
    expect(s.maxSlope).toBe(0)
  })
})

describe('defaultSection', () => {
  it('crosses the middle of the grid along its longer side', () => {
    const d = defaultSection(grid)
    expect(d.a).toEqual({ x: 2, y: 0 })
    expect(d.b).toEqual({ x: 18, y: 0 })
    const tall = defaultSection({ xs: [0, 10], ys: [0, 50, 100] })
    expect(tall.a).toEqual({ x: 5, y: 10 })
    expect(tall.b).toEqual({ x: 5, y: 90 })
  })
})
