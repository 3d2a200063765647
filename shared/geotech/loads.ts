import { GeotechError } from './errors'

/**
 * Vertical stress increase Δσz (kPa) under surface loads on a homogeneous,
 * isotropic, linear-elastic half-space (Boussinesq 1885). Plan coordinates in
 * metres are measured from the centre of the loaded area; depth z positive down.
 *
 * Surface rule (z = 0), taken as the limit z → 0⁺: q inside the loaded area,
 * 0 outside, q/2 on an edge and q/4 on a rectangle corner.
 */

export interface PlanPoint {
  x: number
  y: number
}

/** Areal fill of great extent: Δσ = q at every depth. */
export interface UniformLoad {
  type: 'uniform'
  pressure: number
}

/** Uniformly loaded rectangle, `width` along x and `length` along y. */
export interface RectangleLoad {
  type: 'rectangle'
  width: number
  length: number
  pressure: number
  /** Plan point from the rectangle centre (default the centre). */
  at?: PlanPoint
}

/** Uniformly loaded circle. */
export interface CircleLoad {
  type: 'circle'
  radius: number
  pressure: number
  /** Plan point from the circle centre (default the centre). */
  at?: PlanPoint
}

/** Uniformly loaded strip of infinite length along y (plane strain). */
export interface StripLoad {
  type: 'strip'
  width: number
  pressure: number
  /** Offset across the strip from its centre line (default 0). */
  at?: { x: number }
}

export type Load = UniformLoad | RectangleLoad | CircleLoad | StripLoad

function requireFinite(value: number, what: string): void {
  if (!Number.isFinite(value)) {
    throw new GeotechError('load-invalid', `${what} must be a finite number (got ${String(value)}).`)
  }
}

function requirePositive(value: number, what: string): void {
  requireFinite(value, what)
  if (value <= 0) {
    throw new GeotechError('load-dimension-not-positive', `${what} is ${value} m; it must be positive.`)
  }
}

function requireDepth(depth: number): void {
  if (!Number.isFinite(depth) || depth < 0) {
    throw new GeotechError(
      'depth-negative',
      `Depth ${String(depth)} m is above the ground surface; the stress increase needs z ≥ 0.`,
      { depth: Number.isFinite(depth) ? depth : undefined },
    )
  }
}

/** Surface indicator along one axis for an interval [−half, half]: 1 inside, ½ on the edge, 0 outside. */
function surfaceFraction(offset: number, half: number): number {
  const a = Math.abs(offset)
  if (a < half) return 1
  if (a === half) return 0.5
  return 0
}

// ---------------------------------------------------------------- rectangle

/**
 * Influence factor under the corner of a uniformly loaded a × b rectangle at
 * depth z > 0 (Newmark 1935), written in lengths instead of m = a/z, n = b/z so
 * that very small z does not overflow. atan2 picks the (0, π) branch, which is
 * the "add π when m²n² > m² + n² + 1" rule of the tabulated formula.
 */
export function cornerFactor(a: number, b: number, z: number): number {
  if (a === 0 || b === 0) return 0
  const a2 = a * a
  const b2 = b * b
  const z2 = z * z
  const r2 = a2 + b2 + z2
  const r = Math.sqrt(r2)
  const ab = a * b
  const num = 2 * ab * z * r
  const first = (num * (a2 + b2 + 2 * z2)) / ((z2 * r2 + ab * ab) * r2)
  const second = Math.atan2(num, z2 * r2 - ab * ab)
  return (first + second) / (4 * Math.PI)
}

/**
 * Newmark's (1935) dimensionless corner influence factor I(m, n), m = B/z,
 * n = L/z, for Δσz = q·I under a corner of a B × L rectangle.
 */
export function newmarkFactor(m: number, n: number): number {
  requireFinite(m, 'm')
  requireFinite(n, 'n')
  if (m < 0 || n < 0) {
    throw new GeotechError('load-invalid', `Newmark's m and n must be ≥ 0 (got m = ${m}, n = ${n}).`)
  }
  return cornerFactor(m, n, 1)
}

/** Signed corner term: the rectangle from the point to (dx, dy) counts negative when it extends the "wrong" way. */
function signedCorner(dx: number, dy: number, z: number): number {
  const s = Math.sign(dx) * Math.sign(dy)
  return s === 0 ? 0 : s * cornerFactor(Math.abs(dx), Math.abs(dy), z)
}

/**
 * Δσz under a B × L rectangle (x along B, y along L, from the centre) by
 * superposition of four corner rectangles with signs, valid inside, outside and
 * on the edges (Newmark 1935).
 */
export function rectangleStress(width: number, length: number, pressure: number, x: number, y: number, depth: number): number {
  const hx = width / 2
  const hy = length / 2
  if (depth === 0) return pressure * surfaceFraction(x, hx) * surfaceFraction(y, hy)
  const x1 = -hx - x
  const x2 = hx - x
  const y1 = -hy - y
  const y2 = hy - y
  const f = signedCorner(x2, y2, depth) - signedCorner(x1, y2, depth) - signedCorner(x2, y1, depth) + signedCorner(x1, y1, depth)
  return pressure * f
}

// ------------------------------------------------------------------- circle

/** Closed form on the axis of a uniformly loaded circle: Δσ = q[1 − (1/(1 + (R/z)²))^{3/2}] (from Boussinesq 1885). */
export function circleAxisStress(radius: number, pressure: number, depth: number): number {
  if (depth === 0) return pressure
  const c = depth / Math.sqrt(depth * depth + radius * radius)
  return pressure * (1 - c * c * c)
}

/** Gauss–Legendre nodes and weights on [−1, 1] by Newton iteration on the Legendre polynomial Pₙ (classic method). */
export function gaussLegendre(n: number): { x: Float64Array, w: Float64Array } {
  const x = new Float64Array(n)
  const w = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    let t = Math.cos((Math.PI * (i + 0.75)) / (n + 0.5))
    let dp = 0
    for (let iter = 0; iter < 100; iter++) {
      let p0 = 1
      let p1 = t
      for (let k = 2; k <= n; k++) {
        const p2 = ((2 * k - 1) * t * p1 - (k - 1) * p0) / k
        p0 = p1
        p1 = p2
      }
      dp = (n * (t * p1 - p0)) / (t * t - 1)
      const dt = p1 / dp
      t -= dt
      if (Math.abs(dt) < 1e-16) break
    }
    x[i] = t
    w[i] = 2 / ((1 - t * t) * dp * dp)
  }
  return { x, w }
}

const GL = gaussLegendre(10)

function gaussPanel(f: (t: number) => number, a: number, b: number): number {
  const h = 0.5 * (b - a)
  const c = 0.5 * (a + b)
  let s = 0
  for (let i = 0; i < GL.x.length; i++) s += GL.w[i]! * f(c + h * GL.x[i]!)
  return s * h
}

/** Adaptive 10-point Gauss–Legendre: a panel is accepted when it agrees with its two halves to `tol`. */
function adaptiveGauss(f: (t: number) => number, a: number, b: number, tol: number, whole = gaussPanel(f, a, b), level = 0): number {
  const m = 0.5 * (a + b)
  const left = gaussPanel(f, a, m)
  const right = gaussPanel(f, m, b)
  const halves = left + right
  if (Math.abs(halves - whole) <= tol || level >= 40) return halves
  return adaptiveGauss(f, a, m, tol / 2, left, level + 1) + adaptiveGauss(f, m, b, tol / 2, right, level + 1)
}

/** Absolute tolerance on Δσ/q of the off-axis circle integration: far below the 0.1 % the method needs. */
const CIRCLE_TOLERANCE = 1e-10

/**
 * Δσz at horizontal distance r from the centre of a uniformly loaded circle by
 * numerical integration of the Boussinesq (1885) point-load solution
 * 3Pz³/(2πρ⁵) over the disc, in polar coordinates centred on the point's plan
 * position. Along each ray the radial integral is exact,
 * ∫₀ˢ 3z³s/(2π(s² + z²)^{5/2}) ds = [1 − (z/√(s² + z²))³]/(2π),
 * and the angular integral uses adaptive Gauss–Legendre to 1e-10·q, so the
 * result is accurate to far better than 0.1 %. For a point on or outside the rim
 * the rays span ±asin(R/r); θ = α·sin φ removes the square-root end behaviour.
 */
export function circleStressNumerical(radius: number, pressure: number, r: number, depth: number): number {
  const d = Math.abs(r)
  if (depth === 0) return pressure * surfaceFraction(d, radius)
  const z = depth
  const cube = (s: number) => {
    const c = z / Math.sqrt(s * s + z * z)
    return c * c * c
  }
  const R2 = radius * radius
  if (d < radius) {
    // Every ray leaves the disc once, at distance S(θ) = d cosθ + √(R² − d² sin²θ); symmetric in θ.
    const f = (theta: number) => {
      const sn = Math.sin(theta)
      const s = d * Math.cos(theta) + Math.sqrt(Math.max(0, R2 - d * d * sn * sn))
      return 1 - cube(s)
    }
    return (pressure / Math.PI) * adaptiveGauss(f, 0, Math.PI, CIRCLE_TOLERANCE)
  }
  // On or outside the rim: rays with |θ| < α cross the disc between s1 and s2.
  const alpha = Math.asin(Math.min(1, radius / d))
  const g = (phi: number) => {
    const theta = alpha * Math.sin(phi)
    const sn = Math.sin(theta)
    const root = Math.sqrt(Math.max(0, R2 - d * d * sn * sn))
    const mid = d * Math.cos(theta)
    const s1 = Math.max(0, mid - root)
    const s2 = mid + root
    return (cube(s1) - cube(s2)) * alpha * Math.cos(phi)
  }
  return (pressure / Math.PI) * adaptiveGauss(g, 0, Math.PI / 2, CIRCLE_TOLERANCE)
}

/** Δσz under a uniformly loaded circle: closed form on the axis, numerical integration off it. */
export function circleStress(radius: number, pressure: number, r: number, depth: number): number {
  if (Math.abs(r) <= 1e-12 * radius) return circleAxisStress(radius, pressure, depth)
  return circleStressNumerical(radius, pressure, r, depth)
}

// -------------------------------------------------------------------- strip

/**
 * Δσz under a uniformly loaded strip of width B at offset x from its centre
 * line, the integral of Flamant's (1892) line-load solution:
 * Δσz = (q/π)[α + sin α cos(α + 2δ)], α the angle the strip subtends at the
 * point and δ the angle from the vertical to its near edge; computed here as
 * (q/π)[θ + sin θ cos θ] between the edge angles θ = atan((xₑ − x)/z).
 */
export function stripStress(width: number, pressure: number, x: number, depth: number): number {
  const h = width / 2
  if (depth === 0) return pressure * surfaceFraction(x, h)
  const ta = Math.atan2(-h - x, depth)
  const tb = Math.atan2(h - x, depth)
  return (pressure / Math.PI) * ((tb - ta) + Math.sin(tb) * Math.cos(tb) - Math.sin(ta) * Math.cos(ta))
}

// ------------------------------------------------------------------- 2 : 1

/**
 * The 2:1 spread as a quick check (common practice): Δσ = q·B·L/((B + z)(L + z))
 * for a rectangle, or q·B/(B + z) for a strip when `length` is omitted. An
 * average over the spread area, not a point value.
 */
export function twoToOne(load: { width: number, length?: number, pressure: number }, depth: number): number {
  requirePositive(load.width, 'The load width')
  if (load.length !== undefined) requirePositive(load.length, 'The load length')
  requireFinite(load.pressure, 'The load pressure')
  requireDepth(depth)
  const b = load.width
  if (load.length === undefined) return (load.pressure * b) / (b + depth)
  return (load.pressure * b * load.length) / ((b + depth) * (load.length + depth))
}

// ---------------------------------------------------------------- dispatch

/**
 * Validates a load once and returns Δσz(depth) without further checks, for
 * loops over many depths (settlement sublayers). Depth must be ≥ 0.
 */
export function createStressIncrease(load: Load): (depth: number) => number {
  requireFinite(load.pressure, 'The load pressure')
  const q = load.pressure
  switch (load.type) {
    case 'uniform':
      return () => q
    case 'rectangle': {
      requirePositive(load.width, 'The rectangle width')
      requirePositive(load.length, 'The rectangle length')
      const x = load.at?.x ?? 0
      const y = load.at?.y ?? 0
      requireFinite(x, 'The plan x')
      requireFinite(y, 'The plan y')
      const { width, length } = load
      return (z: number) => rectangleStress(width, length, q, x, y, z)
    }
    case 'circle': {
      requirePositive(load.radius, 'The circle radius')
      const x = load.at?.x ?? 0
      const y = load.at?.y ?? 0
      requireFinite(x, 'The plan x')
      requireFinite(y, 'The plan y')
      const r = Math.hypot(x, y)
      const { radius } = load
      return (z: number) => circleStress(radius, q, r, z)
    }
    case 'strip': {
      requirePositive(load.width, 'The strip width')
      const x = load.at?.x ?? 0
      requireFinite(x, 'The plan x')
      const { width } = load
      return (z: number) => stripStress(width, q, x, z)
    }
    default: {
      const unknown: never = load
      throw new GeotechError('load-invalid', `Unknown load type ${JSON.stringify((unknown as { type?: unknown }).type)}.`)
    }
  }
}

/** Δσz (kPa) at `depth` (m) under `load`, at the load's plan point. */
export function stressIncrease(load: Load, depth: number): number {
  requireDepth(depth)
  return createStressIncrease(load)(depth)
}
