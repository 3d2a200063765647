import { describe, it, expect } from 'vitest'
import {
  circleAxisStress,
  circleStress,
  circleStressNumerical,
  newmarkFactor,
  rectangleStress,
  stressIncrease,
  stripStress,
  twoToOne,
} from '../../../shared/geotech/loads'
import { expectGeotechError } from '../../helpers/geotech'

/*
 * Independent checks: the Boussinesq (1885) point-load solution
 * Δσz = 3Pz³/(2πρ⁵) and Flamant's (1892) line-load solution
 * Δσz = 2pz³/(π(x² + z²)²), integrated over the loaded area here with
 * composite Simpson rules (the engine uses closed forms and Gauss–Legendre).
 */

/** Composite Simpson on [a, b] with n (even) panels. */
function simpson(f: (t: number) => number, a: number, b: number, n: number): number {
  const h = (b - a) / n
  let s = f(a) + f(b)
  for (let i = 1; i < n; i++) s += (i % 2 === 1 ? 4 : 2) * f(a + i * h)
  return (s * h) / 3
}

/** Boussinesq kernel per unit pressure: 3z³/(2πρ⁵). */
function boussinesq(dx: number, dy: number, z: number): number {
  const rho2 = dx * dx + dy * dy + z * z
  return (3 * z ** 3) / (2 * Math.PI * rho2 ** 2.5)
}

/** 2-D Simpson of the Boussinesq kernel over a rectangle centred at the origin, at plan point (x, y). */
function rectangleByQuadrature(width: number, length: number, q: number, x: number, y: number, z: number, n = 400): number {
  return q * simpson(xs => simpson(ys => boussinesq(xs - x, ys - y, z), -length / 2, length / 2, n), -width / 2, width / 2, n)
}

/** Disc of radius R about the origin, point at (d, 0): Simpson in r, trapezoid (periodic, spectrally exact) in φ. */
function circleByQuadrature(radius: number, q: number, d: number, z: number, nr = 600, nphi = 400): number {
  const ring = (r: number) => {
    let s = 0
    for (let k = 0; k < nphi; k++) {
      const phi = (2 * Math.PI * k) / nphi
      s += boussinesq(r * Math.cos(phi) - d, r * Math.sin(phi), z)
    }
    return s * ((2 * Math.PI) / nphi) * r
  }
  return q * simpson(ring, 0, radius, nr)
}

function stripByQuadrature(width: number, q: number, x: number, z: number, n = 4000): number {
  return q * simpson(s => (2 * z ** 3) / (Math.PI * ((x - s) ** 2 + z * z) ** 2), -width / 2, width / 2, n)
}


describe('Newmark (1935) corner influence factor', () => {
  // Influence factors as tabulated in standard texts (e.g. Das, Principles of Geotechnical Engineering), four decimals (memory).
  const table: [number, number, number][] = [
    [1, 1, 0.1752],
    [0.5, 0.5, 0.0840],
    [2, 2, 0.2325],
    [1, 2, 0.1999],
    [0.5, 1, 0.1202],
    [0.1, 0.1, 0.0047],
  ]
  for (const [m, n, factor] of table) {
    it(`I(${m}, ${n}) = ${factor}`, () => {
      expect(Math.abs(newmarkFactor(m, n) - factor)).toBeLessThanOrEqual(0.00006)
      expect(newmarkFactor(n, m)).toBeCloseTo(newmarkFactor(m, n), 14)
    })
  }

  it('tends to 0.25 as m, n → ∞ (a quarter of an infinite surface load) and to 0.2046 for m = 1, n → ∞', () => {
    // 0.25: a corner sees a quarter of a uniform half-space load (common practice); 0.2046 tabulated (memory).
    expect(newmarkFactor(1e6, 1e6)).toBeCloseTo(0.25, 9)
    expect(newmarkFactor(1, 1e7)).toBeCloseTo(0.2046, 4)
  })

  it('uses the right atan branch when m²n² > m² + n² + 1', () => {
    // m = n = 2: m²n² = 16 > 9. Without the +π branch the factor would be 0.2325 − 0.25 < 0 (Newmark 1935 formula).
    const m = 2
    const n = 2
    expect(m * m * n * n).toBeGreaterThan(m * m + n * n + 1)
    expect(newmarkFactor(m, n)).toBeGreaterThan(newmarkFactor(1, 1))
    expect(newmarkFactor(3, 3)).toBeGreaterThan(newmarkFactor(2, 2))
  })

  it('agrees with Boussinesq integrated over the rectangle under the corner', () => {
    // Corner of a 4 m × 6 m rectangle at z = 2 m: m = 2, n = 3.
    const q = 100
    const z = 2
    const expected = rectangleByQuadrature(4, 6, q, 2, 3, z)
    expect(rectangleStress(4, 6, q, 2, 3, z)).toBeCloseTo(expected, 6)
    expect(rectangleStress(4, 6, q, 2, 3, z)).toBeCloseTo(q * newmarkFactor(2, 3), 12)
  })
})

describe('rectangle by superposition', () => {
  it('centre of B × L = 4 × corner factor of (B/2, L/2)', () => {
    // Superposition of four equal corner rectangles (Newmark 1935).
    const z = 3
    expect(rectangleStress(6, 10, 120, 0, 0, z)).toBeCloseTo(4 * 120 * newmarkFactor(3 / z, 5 / z), 10)
    expect(stressIncrease({ type: 'rectangle', width: 6, length: 10, pressure: 120 }, z)).toBeCloseTo(4 * 120 * newmarkFactor(1, 5 / 3), 10)
  })

  it('centre value agrees with the independent Boussinesq quadrature', () => {
    const expected = rectangleByQuadrature(6, 10, 120, 0, 0, 3)
    expect(rectangleStress(6, 10, 120, 0, 0, 3)).toBeCloseTo(expected, 6)
  })

  it('a point outside the rectangle: signed superposition and quadrature agree', () => {
    // Point 2 m beyond the +x edge of a 4 × 6 rectangle, on its centre line: two big minus two small rectangles.
    const q = 100
    const z = 2.5
    const x = 4
    const explicit = 2 * q * (newmarkFactor((x + 2) / z, 3 / z) - newmarkFactor((x - 2) / z, 3 / z))
    const value = rectangleStress(4, 6, q, x, 0, z)
    expect(value).toBeCloseTo(explicit, 10)
    expect(value).toBeCloseTo(rectangleByQuadrature(4, 6, q, x, 0, z), 6)
    expect(value).toBeGreaterThan(0)
    expect(value).toBeLessThan(rectangleStress(4, 6, q, 2, 0, z))
  })

  it('a point outside beyond a corner (both offsets outside) agrees with quadrature', () => {
    const value = rectangleStress(4, 6, 100, 3.5, -4.5, 2)
    expect(value).toBeCloseTo(rectangleByQuadrature(4, 6, 100, 3.5, -4.5, 2), 6)
  })

  it('an edge point agrees with quadrature', () => {
    expect(rectangleStress(4, 6, 100, 2, 1, 1.5)).toBeCloseTo(rectangleByQuadrature(4, 6, 100, 2, 1, 1.5, 600), 5)
  })

  it('surface values: q inside, q/2 on an edge, q/4 on a corner, 0 outside (limit z → 0⁺)', () => {
    expect(rectangleStress(4, 6, 100, 0.5, 0.5, 0)).toBe(100)
    expect(rectangleStress(4, 6, 100, 2, 0, 0)).toBe(50)
    expect(rectangleStress(4, 6, 100, 2, 3, 0)).toBe(25)
    expect(rectangleStress(4, 6, 100, 3, 0, 0)).toBe(0)
    // The limits the surface rule stands for:
    expect(rectangleStress(4, 6, 100, 0.5, 0.5, 1e-9)).toBeCloseTo(100, 6)
    expect(rectangleStress(4, 6, 100, 2, 0, 1e-9)).toBeCloseTo(50, 6)
    expect(rectangleStress(4, 6, 100, 2, 3, 1e-9)).toBeCloseTo(25, 6)
    expect(rectangleStress(4, 6, 100, 3, 0, 1e-9)).toBeCloseTo(0, 6)
  })
})

describe('circle', () => {
  it('closed form on the axis: z = R gives q(1 − 2^{−3/2}) = 0.6464 q', () => {
    // Δσ = q[1 − (1/(1 + (R/z)²))^{3/2}] (from Boussinesq 1885; any soil-mechanics text).
    expect(circleAxisStress(2, 100, 2)).toBeCloseTo(64.6447, 4)
  })

  it('numerical integration at r = 0 reproduces the closed form', () => {
    for (const z of [0.1, 0.5, 1, 2, 5, 20]) {
      expect(circleStressNumerical(1.5, 100, 0, z)).toBeCloseTo(circleAxisStress(1.5, 100, z), 8)
    }
  })

  it('under the edge at z = R: influence value ≈ 0.332', () => {
    // Tabulated influence value for a uniformly loaded circle, r/R = 1, z/R = 1 ≈ 0.332 (memory).
    expect(circleStress(1, 1, 1, 1)).toBeCloseTo(0.332, 3)
  })

  const cases: [number, number][] = [
    [0.5, 0.5], [0.5, 2], [0.99, 0.3], [1, 0.5], [1, 1], [1.5, 1], [3, 2],
  ]
  for (const [rr, zr] of cases) {
    it(`off-axis r/R = ${rr}, z/R = ${zr} agrees with the independent quadrature to 0.1 %`, () => {
      const radius = 2
      const value = circleStress(radius, 100, rr * radius, zr * radius)
      const expected = circleByQuadrature(radius, 100, rr * radius, zr * radius)
      expect(Math.abs(value - expected) / expected).toBeLessThan(0.001)
      // In practice far closer than the 0.1 % required:
      expect(Math.abs(value - expected)).toBeLessThan(1e-4)
    })
  }

  it('at plan point (x, y) depends only on the distance from the centre', () => {
    const a = stressIncrease({ type: 'circle', radius: 3, pressure: 80, at: { x: 1.8, y: 2.4 } }, 2)
    const b = stressIncrease({ type: 'circle', radius: 3, pressure: 80, at: { x: 3, y: 0 } }, 2)
    expect(a).toBeCloseTo(b, 10)
  })

  it('surface values: q inside, q/2 on the rim, 0 outside', () => {
    expect(circleStress(2, 100, 1, 0)).toBe(100)
    expect(circleStress(2, 100, 2, 0)).toBe(50)
    expect(circleStress(2, 100, 3, 0)).toBe(0)
    expect(circleStress(2, 100, 0, 0)).toBe(100)
    expect(circleStress(2, 100, 2, 1e-6)).toBeCloseTo(50, 3)
  })
})

describe('strip', () => {
  it('closed form agrees with the integrated Flamant line load', () => {
    for (const [x, z] of [[0, 1], [0, 4], [1, 1], [1, 0.2], [3, 2], [-2.5, 1.5]] as [number, number][]) {
      expect(stripStress(2, 100, x, z)).toBeCloseTo(stripByQuadrature(2, 100, x, z), 6)
    }
  })

  it('centre line at z = B: (q/π)(α + sin α), α = 2 atan(1/2)', () => {
    // Δσz = (q/π)[α + sin α cos(α + 2δ)] with δ = −α/2 on the centre line (common practice).
    const alpha = 2 * Math.atan(0.5)
    expect(stripStress(2, 100, 0, 2)).toBeCloseTo((100 / Math.PI) * (alpha + Math.sin(alpha)), 12)
    expect(stripStress(2, 100, 0, 2)).toBeCloseTo(55.0, 1)
  })

  it('surface values and symmetry', () => {
    expect(stripStress(2, 100, 0.2, 0)).toBe(100)
    expect(stripStress(2, 100, 1, 0)).toBe(50)
    expect(stripStress(2, 100, 1.5, 0)).toBe(0)
    expect(stripStress(2, 100, 0.7, 3)).toBeCloseTo(stripStress(2, 100, -0.7, 3), 12)
  })
})

describe('uniform and 2:1', () => {
  it('uniform load is the same at every depth', () => {
    expect(stressIncrease({ type: 'uniform', pressure: 120 }, 0)).toBe(120)
    expect(stressIncrease({ type: 'uniform', pressure: 120 }, 30)).toBe(120)
  })

  it('2:1: 100 kPa on 2 m × 3 m at z = 2 m gives 100·6/(4·5) = 30 kPa (common practice)', () => {
    expect(twoToOne({ width: 2, length: 3, pressure: 100 }, 2)).toBeCloseTo(30, 12)
    expect(twoToOne({ width: 2, pressure: 100 }, 2)).toBeCloseTo(50, 12)
  })

  it('2:1 is within ~30 % of Boussinesq at the centre for a square at z = B (common practice: rough check only)', () => {
    const exact = rectangleStress(2, 2, 100, 0, 0, 2)
    const rough = twoToOne({ width: 2, length: 2, pressure: 100 }, 2)
    expect(Math.abs(rough - exact) / exact).toBeLessThan(0.3)
  })
})

describe('load validation', () => {
  it('rejects non-positive dimensions and negative depth', () => {
    expectGeotechError(() => stressIncrease({ type: 'rectangle', width: 0, length: 2, pressure: 10 }, 1), 'load-dimension-not-positive')
    expectGeotechError(() => stressIncrease({ type: 'circle', radius: -1, pressure: 10 }, 1), 'load-dimension-not-positive')
    expectGeotechError(() => stressIncrease({ type: 'strip', width: 0, pressure: 10 }, 1), 'load-dimension-not-positive')
    expectGeotechError(() => stressIncrease({ type: 'uniform', pressure: 10 }, -0.5), 'depth-negative')
    expectGeotechError(() => stressIncrease({ type: 'uniform', pressure: Number.NaN }, 1), 'load-invalid')
  })
})
