import { describe, it, expect } from 'vitest'
import { rectangleStress } from '../../shared/geotech/loads'
import {
  embankmentStress,
  footprintExtent,
  loadFootprint,
  loadOutlines,
  planStressIncrease,
  type PlanLoad,
} from '../../shared/geotech/plan-loads'
import { expectGeotechError } from '../helpers/geotech'

/*
 * Plan loads against the outside: Osterberg's (1957) plane-strain embankment, Newmark's
 * (1935) rectangle, the closed form on a circle's axis (from Boussinesq 1885; Poulos &
 * Davis 1974), and brute-force quadrature of the Boussinesq (1885) point-load solution
 * 3Pz³/(2πρ⁵) written here independently of the engine. No published chart values are
 * used for the circle off its axis: it is checked against brute force in this file.
 */

type Embankment = Extract<PlanLoad, { type: 'embankment' }>

/** Invented embankment: crest 10 m × 30 m, 3 m high at 2:1, γ = 20 kN/m³ → q = 60 kPa; slope width 6 m. */
const EMB: Embankment = { type: 'embankment', x: 0, y: 0, crestWidth: 10, crestLength: 30, height: 3, sideSlope: 2, unitWeight: 20, rotation: 0 }

/** Surface pressure of a truncated-pyramid embankment in its own frame (written independently of the engine). */
function embankmentPressure(e: Embankment, u: number, v: number): number {
  const s = e.sideSlope * e.height
  const inside = Math.min(e.crestWidth / 2 + s - Math.abs(u), e.crestLength / 2 + s - Math.abs(v))
  return inside <= 0 ? 0 : e.height * e.unitWeight * Math.min(1, inside / s)
}

/**
 * Brute force: Boussinesq's kernel over the plan in polar co-ordinates about the point,
 * with ρ = z·tan ψ so that 3z³ρ dρ/(2π(ρ² + z²)^{5/2}) = (3/2π) sin ψ cos² ψ dψ (bounded, no
 * singularity), dense midpoint rules in θ and ψ out to the farthest footprint corner.
 */
function bruteForce(pressure: (x: number, y: number) => number, px: number, py: number, z: number, reach: number, nTheta = 720, nPsi = 800): number {
  const psiMax = Math.atan(reach / z)
  const dT = (2 * Math.PI) / nTheta
  const dP = psiMax / nPsi
  const cos = Float64Array.from({ length: nTheta }, (_, i) => Math.cos((i + 0.5) * dT))
  const sin = Float64Array.from({ length: nTheta }, (_, i) => Math.sin((i + 0.5) * dT))
  let sum = 0
  for (let j = 0; j < nPsi; j++) {
    const psi = (j + 0.5) * dP
    const rho = z * Math.tan(psi)
    const w = Math.sin(psi) * Math.cos(psi) ** 2
    let ring = 0
    for (let i = 0; i < nTheta; i++) ring += pressure(px + rho * cos[i]!, py + rho * sin[i]!)
    sum += ring * w
  }
  return (3 / (2 * Math.PI)) * sum * dT * dP
}

/** Osterberg (1957) half-embankment under the vertical through its crest end: crest b1, slope b2, pressure q (plane strain). */
function osterberg(q: number, b1: number, b2: number, z: number): number {
  const a2 = Math.atan(b1 / z)
  const a1 = Math.atan((b1 + b2) / z) - a2
  return (q / Math.PI) * (((b1 + b2) / b2) * (a1 + a2) - (b1 / b2) * a2)
}

describe('embankment against brute-force quadrature of Boussinesq (1885)', () => {
  // Crest half-width 5, toe half-width 11 (x); crest half-length 15, toe 21 (y).
  const points: [string, number, number][] = [
    ['centre', 0, 0],
    ['crest edge', 5, 0],
    ['mid-slope', 8, 0],
    ['toe', 11, 0],
    ['outside the toe', 14, 3],
    ['on a hip line', 8, 18],
    ['end toe', 2, 21],
    ['crest corner', 5, 15],
    ['on the toe line beyond the toe corner', 11, 30],
  ]
  const depths = [0.1, 1, 5, 20, 40]
  for (const [name, px, py] of points) {
    it(`${name} (${px}, ${py}) within 0.5 % at z = ${depths.join(', ')} m`, () => {
      const f = planStressIncrease([EMB], px, py)
      const reach = Math.hypot(11 + Math.abs(px), 21 + Math.abs(py)) // the farthest toe corner
      for (const z of depths) {
        const ref = bruteForce((x, y) => embankmentPressure(EMB, x, y), px, py, z, reach)
        const got = f(z)
        // 0.5 % of the value, or 0.01 kPa where the value itself is nearly nil (far outside at shallow depth).
        expect(Math.abs(got - ref), `z = ${z}: ${got} vs ${ref}`).toBeLessThanOrEqual(Math.max(0.005 * ref, 0.01))
      }
    }, 30_000)
  }

  it('at depth 0 is the surface pressure: γh on the crest, linear on the slope, 0 outside', () => {
    expect(embankmentStress(EMB, 0, 0, 0)).toBe(60)
    expect(embankmentStress(EMB, 5, 0, 0)).toBe(60)
    expect(embankmentStress(EMB, 8, 0, 0)).toBeCloseTo(30, 12)
    expect(embankmentStress(EMB, 0, 19.5, 0)).toBeCloseTo(15, 12)
    expect(embankmentStress(EMB, 11, 0, 0)).toBe(0)
    expect(embankmentStress(EMB, 30, 0, 0)).toBe(0)
  })

  it('tends to the surface pressure as z → 0⁺ (continuity with depth 0)', () => {
    const f = planStressIncrease([EMB], 8, 0)
    expect(f(1e-4)).toBeCloseTo(30, 3)
    expect(planStressIncrease([EMB], 2, 3)(1e-4)).toBeCloseTo(60, 3)
  })
})

describe('very long embankment against Osterberg (1957), plane strain', () => {
  // crestLength 2000 m: at y = 0 the ends are ≥ 1000 m away, so plane strain holds to well under 0.1 % for z ≤ 40 m.
  const long: Embankment = { ...EMB, crestLength: 2000 }
  const q = 60
  const b1 = 5
  const b2 = 6
  const zs = [0.5, 1, 2, 4, 6].map(r => r * b2) // z/B2 = 0.5 … 6

  it('centreline: twice the half-embankment formula', () => {
    const f = planStressIncrease([long], 0, 0)
    for (const z of zs) {
      const ref = 2 * osterberg(q, b1, b2, z)
      expect(Math.abs(f(z) - ref) / ref, `z = ${z}`).toBeLessThan(0.001)
    }
  })

  it('beneath the slope and at the toe: superposed half-embankments (Osterberg 1957)', () => {
    // A point x0 from the centreline, b1 ≤ x0 ≤ b1 + b2, where the surface pressure is p0:
    // towards the toe a triangle p0 over (b1 + b2 − x0); away from it the half-embankment with
    // crest x0 + b1 and slope b2, less a triangle (q − p0) over (x0 − b1).
    for (const x0 of [5, 6.5, 8, 9.5, 11]) {
      const p0 = (q * (b1 + b2 - x0)) / b2
      const f = planStressIncrease([long], x0, 0)
      for (const z of zs) {
        const near = x0 < b1 + b2 ? osterberg(p0, 0, b1 + b2 - x0, z) : 0
        const back = x0 > b1 ? osterberg(q - p0, 0, x0 - b1, z) : 0
        const ref = near + osterberg(q, x0 + b1, b2, z) - back
        expect(Math.abs(f(z) - ref) / ref, `x0 = ${x0}, z = ${z}`).toBeLessThan(0.001)
      }
    }
  })
})

describe('rectangle and zero side slope (Newmark 1935)', () => {
  it('side slope 0 gives the Newmark rectangle exactly', () => {
    const flat: Embankment = { ...EMB, sideSlope: 0 }
    for (const [x, y] of [[0, 0], [5, 0], [3, 14], [9, -20]] as const) {
      const f = planStressIncrease([flat], x, y)
      for (const z of [0, 0.1, 1, 10, 40]) expect(f(z)).toBe(rectangleStress(10, 30, 60, x, y, z))
    }
  })

  it('a gentle slope tends to the rectangle (continuity in n)', () => {
    const gentle: Embankment = { ...EMB, sideSlope: 1e-4 }
    const f = planStressIncrease([gentle], 3, 14)
    for (const z of [0.5, 2, 10]) expect(f(z)).toBeCloseTo(rectangleStress(10, 30, 60, 3, 14, z), 2)
  })

  it('under the corner of a B × L rectangle: q·I(m, n) with Newmark\'s tabulated factors', () => {
    // I(1, 1) = 0.1752, I(0.5, 0.5) = 0.0840 (Newmark 1935 table, as in standard texts; memory).
    const rect: PlanLoad = { type: 'rectangle', x: 10, y: 20, width: 4, length: 4, rotation: 0, pressure: 100 }
    const f = planStressIncrease([rect], 12, 22)
    expect(f(4)).toBeCloseTo(17.52, 1)
    expect(f(8)).toBeCloseTo(8.40, 1)
  })

  it('rectangle against brute-force quadrature (Boussinesq 1885), inside and outside', () => {
    const rect: PlanLoad = { type: 'rectangle', x: 0, y: 0, width: 8, length: 12, rotation: 0, pressure: 50 }
    const pressure = (x: number, y: number) => (Math.abs(x) < 4 && Math.abs(y) < 6 ? 50 : 0)
    for (const [x, y] of [[1, 2], [6, 0]] as const) {
      const f = planStressIncrease([rect], x, y)
      for (const z of [2, 10]) {
        const ref = bruteForce(pressure, x, y, z, 20, 1440, 1200)
        expect(Math.abs(f(z) - ref) / ref).toBeLessThan(0.005)
      }
    }
  })
})

describe('circle', () => {
  const circle: PlanLoad = { type: 'circle', x: 5, y: -3, radius: 6, pressure: 80 }

  it('under the centre: q[1 − (1/(1 + (a/z)²))^{3/2}] (from Boussinesq 1885; Poulos & Davis 1974)', () => {
    const f = planStressIncrease([circle], 5, -3)
    // z = a: 1 − 2^{−3/2} = 0.64645.
    expect(f(6)).toBeCloseTo(80 * 0.646447, 3)
    for (const z of [0.1, 1, 3, 12, 40]) expect(f(z)).toBeCloseTo(80 * (1 - (1 / (1 + (6 / z) ** 2)) ** 1.5), 10)
  })

  it('off the axis (inside, near the rim, outside) against brute-force quadrature in this test', () => {
    // No chart values are used here: the reference is the Boussinesq kernel integrated over the
    // disc in polar co-ordinates about its centre (Simpson in r, the periodic trapezoid rule in φ).
    const disc = (d: number, z: number, nr = 600, nphi = 720) => {
      let total = 0
      const h = 6 / nr
      for (let k = 0; k <= nr; k++) {
        const r = k * h
        let ring = 0
        for (let j = 0; j < nphi; j++) {
          const phi = (2 * Math.PI * j) / nphi
          const dx = r * Math.cos(phi) - d
          const dy = r * Math.sin(phi)
          const rho2 = dx * dx + dy * dy + z * z
          ring += (3 * z ** 3) / (2 * Math.PI * rho2 * rho2 * Math.sqrt(rho2))
        }
        total += (k === 0 || k === nr ? 1 : k % 2 === 1 ? 4 : 2) * ring * r
      }
      return 80 * ((2 * Math.PI) / nphi) * (h / 3) * total
    }
    for (const d of [2, 5.5, 6, 7, 12]) {
      const f = planStressIncrease([circle], 5 + d * 0.6, -3 + d * 0.8)
      for (const z of [0.5, 3, 15]) {
        const ref = disc(d, z)
        // Agreement is ~1e-8 here; 1e-5 leaves room for rounding in the reference.
        expect(Math.abs(f(z) - ref), `d = ${d}, z = ${z}`).toBeLessThanOrEqual(1e-5 * ref)
      }
    }
  })

  it('at depth 0: q inside, q/2 on the rim, 0 outside', () => {
    expect(planStressIncrease([circle], 6, -3)(0)).toBe(80)
    expect(planStressIncrease([circle], 11, -3)(0)).toBe(40)
    expect(planStressIncrease([circle], 12, -3)(0)).toBe(0)
  })
})

describe('rotation, translation and superposition', () => {
  /** A site point given in a load's own frame (u along its width). */
  const site = (cx: number, cy: number, deg: number, u: number, v: number) => {
    const a = (deg * Math.PI) / 180
    return [cx + u * Math.cos(a) - v * Math.sin(a), cy + u * Math.sin(a) + v * Math.cos(a)] as const
  }

  it('a rotated, moved embankment gives the same Δσ at the rotated point', () => {
    const turned: Embankment = { ...EMB, x: 120, y: -40, rotation: 35 }
    for (const [u, v] of [[0, 0], [8, 0], [8, 18], [14, 3], [-9, -19]] as const) {
      const [x, y] = site(120, -40, 35, u, v)
      const a = planStressIncrease([turned], x, y)
      const b = planStressIncrease([EMB], u, v)
      for (const z of [0.3, 4, 25]) expect(a(z)).toBeCloseTo(b(z), 9)
    }
  })

  it('a rotated rectangle gives the same Δσ at the rotated point; 90° swaps width and length', () => {
    const rect: PlanLoad = { type: 'rectangle', x: -7, y: 3, width: 8, length: 20, rotation: -60, pressure: 45 }
    const [x, y] = site(-7, 3, -60, 3, 9)
    expect(planStressIncrease([rect], x, y)(5)).toBeCloseTo(rectangleStress(8, 20, 45, 3, 9, 5), 10)
    const quarter: PlanLoad = { type: 'rectangle', x: 0, y: 0, width: 8, length: 20, rotation: 90, pressure: 45 }
    expect(planStressIncrease([quarter], 9, 3)(5)).toBeCloseTo(rectangleStress(20, 8, 45, 9, -3, 5), 10)
  })

  it('several loads add up (superposition)', () => {
    const loads: PlanLoad[] = [EMB, { type: 'circle', x: 20, y: 0, radius: 4, pressure: 30 }, { type: 'uniform', pressure: 10 }]
    const all = planStressIncrease(loads, 12, 2)
    const parts = loads.map(l => planStressIncrease([l], 12, 2))
    for (const z of [0, 1, 10]) expect(all(z)).toBeCloseTo(parts.reduce((s, f) => s + f(z), 0), 12)
    expect(planStressIncrease([], 0, 0)(3)).toBe(0)
  })

  it('refuses an embankment without height (GeotechError)', () => {
    expectGeotechError(() => planStressIncrease([{ ...EMB, height: 0 }], 0, 0), 'load-dimension-not-positive')
    expectGeotechError(() => planStressIncrease([{ ...EMB, sideSlope: -1 }], 0, 0), 'load-invalid')
  })
})

describe('outlines and extent', () => {
  it('embankment: toe = crest grown by n·h on every side; footprint is the toe', () => {
    const o = loadOutlines({ ...EMB, x: 100, y: 50 })
    expect(o.crest).toEqual([{ x: 95, y: 35 }, { x: 105, y: 35 }, { x: 105, y: 65 }, { x: 95, y: 65 }])
    expect(o.toe).toEqual([{ x: 89, y: 29 }, { x: 111, y: 29 }, { x: 111, y: 71 }, { x: 89, y: 71 }])
    expect(loadFootprint({ ...EMB, x: 100, y: 50 })).toEqual(o.toe)
  })

  it('rotated outline corners are the rotated local corners', () => {
    const o = loadOutlines({ type: 'rectangle', x: 0, y: 0, width: 4, length: 2, rotation: 90, pressure: 1 })
    expect(o.toe![0]!.x).toBeCloseTo(1, 12)
    expect(o.toe![0]!.y).toBeCloseTo(-2, 12)
    expect(o.crest).toBe(o.toe)
  })

  it('circle: the same outline for toe and crest; uniform: none', () => {
    const o = loadOutlines({ type: 'circle', x: 1, y: 2, radius: 3, pressure: 5 })
    expect(o.toe).toBe(o.crest)
    for (const p of o.toe!) expect(Math.hypot(p.x - 1, p.y - 2)).toBeCloseTo(3, 12)
    expect(loadOutlines({ type: 'uniform', pressure: 5 })).toEqual({ toe: null, crest: null })
  })

  it('footprintExtent spans every footprint (a circle exactly) and is null for uniform loads only', () => {
    expect(footprintExtent([{ type: 'uniform', pressure: 5 }])).toBeNull()
    expect(footprintExtent([])).toBeNull()
    const box = footprintExtent([EMB, { type: 'circle', x: 30, y: 0, radius: 4, pressure: 5 }, { type: 'uniform', pressure: 5 }])
    expect(box).toEqual({ x0: -11, x1: 34, y0: -21, y1: 21 })
  })
})

describe('a load edited in place', () => {
  it('gives the new Δσ, not the one set up for its old dimensions', () => {
    const load: Embankment = { ...EMB }
    const before = planStressIncrease([load], 0, 0)(5)
    load.height = 6
    const after = planStressIncrease([load], 0, 0)(5)
    expect(after).toBeCloseTo(planStressIncrease([{ ...EMB, height: 6 }], 0, 0)(5), 12)
    expect(after).not.toBeCloseTo(before, 3)
  })
})
