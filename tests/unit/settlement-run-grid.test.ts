// Differential settlement and angular distortion between neighbouring grid points, on a hand-made grid.
import { describe, expect, it } from 'vitest'
import { gridAxes, gridDistortion } from '../../shared/settlement-run/grid'

describe('gridDistortion', () => {
  it('finds the worst neighbouring pair along x, y and the diagonals, by hand (β = Δs / distance; common practice)', () => {
    const xs = [0, 10, 20]
    const ys = [0, 5]
    // settlement[j][i] at (xs[i], ys[j]), m.
    const settlement = [
      [0.100, 0.130, 0.120],
      [0.110, 0.090, 0.125],
    ]
    const d = gridDistortion(xs, ys, settlement)
    // Pairs and |Δs|: x: .03 (10 m), .01, .02, .035 (10 m); y: .01 (5 m), .04 (5 m), .005;
    // diagonals (√125 m): (0,0)-(10,5) .01, (10,0)-(20,5) .005, (10,0)-(0,5) .02, (20,0)-(10,5) .03.
    expect(d.maxDifferential).toBeCloseTo(0.04, 15)
    expect(d.worstDifferential).toEqual({ a: { x: 10, y: 0 }, b: { x: 10, y: 5 }, value: d.maxDifferential })
    // β: .04 / 5 = 0.008 is the largest (next .03 / √125 = 0.00268, .035 / 10 = 0.0035).
    expect(d.maxAngularDistortion).toBeCloseTo(0.008, 15)
    expect(d.worstAngularDistortion!.a).toEqual({ x: 10, y: 0 })
    expect(d.worstAngularDistortion!.b).toEqual({ x: 10, y: 5 })
  })

  it('takes a diagonal pair when it is the worst', () => {
    // (0,0) 0, (4,0) 12 mm, (0,3) 12 mm, (4,3) 24 mm. Along x: 12 mm / 4 m = 0.003; along y: 12 mm / 3 m = 0.004;
    // diagonal (0,0)-(4,3): 24 mm over 5 m = 0.0048, the worst of both; anti-diagonal: 0.
    const d = gridDistortion([0, 4], [0, 3], [[0, 0.012], [0.012, 0.024]])
    expect(d.maxDifferential).toBeCloseTo(0.024, 15)
    expect(d.maxAngularDistortion).toBeCloseTo(0.0048, 15)
    expect(d.worstAngularDistortion).toEqual({ a: { x: 0, y: 0 }, b: { x: 4, y: 3 }, value: d.maxAngularDistortion })
    // The anti-diagonal: (4,0) 30 mm, the rest 0: (4,0)-(0,3) 30 mm / 5 m; along y at x = 4: 30 mm / 3 m = 0.01 is the worst β.
    const anti = gridDistortion([0, 4], [0, 3], [[0, 0.03], [0, 0]])
    expect(anti.maxAngularDistortion).toBeCloseTo(0.01, 15)
    expect(anti.worstAngularDistortion!.a).toEqual({ x: 4, y: 0 })
    expect(anti.worstAngularDistortion!.b).toEqual({ x: 4, y: 3 })
  })

  it('a single point has no pair', () => {
    expect(gridDistortion([0], [0], [[0.2]])).toEqual({ maxDifferential: 0, maxAngularDistortion: 0, worstDifferential: null, worstAngularDistortion: null })
  })
})

describe('gridAxes', () => {
  it('spans the footprints plus the margin at the spacing', () => {
    const axes = gridAxes([{ type: 'rectangle', x: 10, y: 0, width: 8, length: 4, rotation: 0, pressure: 50 }], { spacing: 2, margin: 3 })!
    expect(axes.xs).toEqual([3, 5, 7, 9, 11, 13, 15, 17])
    expect(axes.ys).toEqual([-5, -3, -1, 1, 3, 5])
    expect(gridAxes([{ type: 'uniform', pressure: 10 }], { spacing: 2, margin: 3 })).toBeNull()
  })
})
