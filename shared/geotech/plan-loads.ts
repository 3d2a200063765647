import { GeotechError } from './errors'
import { gaussLegendre, rectangleStress } from './loads'

/**
 * Loads placed on the site plan (site grid, m; pressures kPa; rotation in degrees,
 * anticlockwise from the grid's x axis) and Δσz under any plan point by superposition
 * of Boussinesq (1885) solutions for a homogeneous, isotropic, linear-elastic half-space.
 *
 * - uniform: Δσ = q at every depth.
 * - rectangle: Newmark (1935) corner superposition, closed form.
 * - embankment: a truncated pyramid of fill — γh over the crest, falling linearly to
 *   zero across the side slopes on all four sides (hip lines at the corners). The
 *   footprint is split into five polygons with a linear surface pressure each (crest
 *   and four side trapezoids), and each polygon is integrated exactly: in polar
 *   co-ordinates about the plan point the radial Boussinesq integral is closed, and
 *   along each straight edge the angular integral is closed as well (the polygon
 *   method of e.g. Poulos & Davis 1974 §3, extended to a linear pressure; derivation
 *   in the comments of `edgeTerm`). No quadrature, so the result is exact to rounding
 *   at every depth; per depth it costs one atan2 and one sqrt per edge end.
 * - circle: on the axis the closed form; off it the exact radial integral along rays
 *   from the point and Gauss–Legendre in angle on panels chosen once per plan point.
 *
 * `planStressIncrease(loads, x, y)` does the per-point work once and returns a cheap
 * Δσz(depth) closure for loops over many depths.
 */
export type PlanLoad =
  | { type: 'uniform', pressure: number }
  | { type: 'rectangle', x: number, y: number, width: number, length: number, rotation: number, pressure: number }
  | { type: 'circle', x: number, y: number, radius: number, pressure: number }
  | { type: 'embankment', x: number, y: number, crestWidth: number, crestLength: number, height: number, sideSlope: number, unitWeight: number, rotation: number }

export interface PlanXY { x: number, y: number }

const TWO_PI = 2 * Math.PI

/** A plan point in a load's own frame (origin at its centre, x along its width). */
function toLocal(load: { x: number, y: number, rotation: number }, x: number, y: number): PlanXY {
  const a = (-load.rotation * Math.PI) / 180
  const dx = x - load.x
  const dy = y - load.y
  return { x: dx * Math.cos(a) - dy * Math.sin(a), y: dx * Math.sin(a) + dy * Math.cos(a) }
}

/** A point of a load's own frame on the site plan. */
function toSite(load: { x: number, y: number, rotation: number }, u: number, v: number): PlanXY {
  const a = (load.rotation * Math.PI) / 180
  return { x: load.x + u * Math.cos(a) - v * Math.sin(a), y: load.y + u * Math.sin(a) + v * Math.cos(a) }
}

function requireFinite(value: number, what: string): void {
  if (!Number.isFinite(value)) throw new GeotechError('load-invalid', `${what} must be a finite number (got ${String(value)}).`)
}
function requirePositive(value: number, what: string): void {
  requireFinite(value, what)
  if (value <= 0) throw new GeotechError('load-dimension-not-positive', `${what} is ${value} m; it must be positive.`)
}

// ------------------------------------------------------------ embankment

/** The embankment in its own frame: crest half-sizes, slope width s = n·h, toe half-sizes, q = γh. */
interface EmbankmentShape { hx: number, hy: number, s: number, HX: number, HY: number, q: number }

function embankmentShape(load: Extract<PlanLoad, { type: 'embankment' }>): EmbankmentShape {
  requirePositive(load.crestWidth, 'The crest width')
  requirePositive(load.crestLength, 'The crest length')
  requirePositive(load.height, 'The embankment height')
  requireFinite(load.unitWeight, 'The unit weight')
  requireFinite(load.sideSlope, 'The side slope')
  if (load.sideSlope < 0) throw new GeotechError('load-invalid', `The side slope is ${load.sideSlope}; it must be 0 or more.`)
  const hx = load.crestWidth / 2
  const hy = load.crestLength / 2
  const s = load.sideSlope * load.height
  return { hx, hy, s, HX: hx + s, HY: hy + s, q: load.unitWeight * load.height }
}

/** Surface pressure of the embankment at a local point: q·min(1, distance inside the toe / s), 0 outside (geometry). */
function embankmentSurface(e: EmbankmentShape, u: number, v: number): number {
  const inside = Math.min(e.HX - Math.abs(u), e.HY - Math.abs(v))
  if (inside <= 0) return 0
  return e.q * Math.min(1, inside / e.s)
}

/** One polygon edge (local frame), with the pressure field p(ξ) = a + b·ξx + c·ξy of the polygon it bounds. */
interface FieldEdge { ax: number, ay: number, bx: number, by: number, a: number, b: number, c: number }

/**
 * The five polygons of the embankment footprint (anticlockwise), each with its linear
 * pressure, merged into the twelve distinct edges (4 toe, 4 crest, 4 hip lines): an edge
 * shared by two polygons carries the difference of their fields (it is traversed in
 * opposite senses, and the edge term is linear in the field and odd in the sense).
 */
function embankmentEdges(e: EmbankmentShape): FieldEdge[] {
  const { hx, hy, HX, HY, q, s } = e
  const k = q / s
  const polys: { v: [number, number][], a: number, b: number, c: number }[] = [
    { v: [[-hx, -hy], [hx, -hy], [hx, hy], [-hx, hy]], a: q, b: 0, c: 0 },
    { v: [[hx, -hy], [HX, -HY], [HX, HY], [hx, hy]], a: k * HX, b: -k, c: 0 },
    { v: [[-hx, hy], [-HX, HY], [-HX, -HY], [-hx, -hy]], a: k * HX, b: k, c: 0 },
    { v: [[hx, hy], [HX, HY], [-HX, HY], [-hx, hy]], a: k * HY, b: 0, c: -k },
    { v: [[-hx, -hy], [-HX, -HY], [HX, -HY], [hx, -hy]], a: k * HY, b: 0, c: k },
  ]
  const merged = new Map<string, FieldEdge>()
  for (const p of polys) {
    for (let i = 0; i < 4; i++) {
      const [x1, y1] = p.v[i]!
      const [x2, y2] = p.v[(i + 1) % 4]!
      const fwd = x1 < x2 || (x1 === x2 && y1 < y2)
      const key = fwd ? `${x1},${y1},${x2},${y2}` : `${x2},${y2},${x1},${y1}`
      const sign = fwd ? 1 : -1
      let edge = merged.get(key)
      if (!edge) {
        edge = fwd ? { ax: x1, ay: y1, bx: x2, by: y2, a: 0, b: 0, c: 0 } : { ax: x2, ay: y2, bx: x1, by: y1, a: 0, b: 0, c: 0 }
        merged.set(key, edge)
      }
      edge.a += sign * p.a
      edge.b += sign * p.b
      edge.c += sign * p.c
    }
  }
  return [...merged.values()].filter(ed => ed.a !== 0 || ed.b !== 0 || ed.c !== 0)
}

/**
 * Per-point constants of the edges, packed 9 per edge:
 * [d², Δφ·p0, p0, gn·d³, gt·d, tA, cA, tB, cB] → see `edgeSum`. gn, gt: the pressure
 * gradient along the normal from P to the edge and along the edge (anticlockwise about P).
 *
 * Derivation (Boussinesq 1885 point load 3Pz³/(2πρ⁵) integrated over the triangle
 * formed by the plan point P and the edge, in polar co-ordinates about P): with the
 * pressure p = p0 + g·(ξ − P), the radial integrals to the edge distance S are
 *   ∫₀ˢ 3z³r/(2π(r²+z²)^{5/2}) dr = [1 − z³/(S²+z²)^{3/2}]/(2π)
 *   ∫₀ˢ 3z³r²/(2π(r²+z²)^{5/2}) dr = z·S³/(2π(S²+z²)^{3/2}).
 * Along an edge at perpendicular distance d, S = d/cos φ (φ from the foot of the
 * perpendicular), and with t = sin φ, c = cos φ, D² = d² + z², Q = √(d² + z²c²):
 *   ∫ z³c³/(d² + z²c²)^{3/2} dφ = atan2(z t, Q) − z d² t/(D² Q)
 *   ∫ z d³ c/(d² + z²c²)^{3/2} dφ = z d³ t/(D² Q)
 *   ∫ z d³ t/(d² + z²c²)^{3/2} dφ = −z d c/Q
 * (elementary substitutions t = sin φ and c = cos φ). The triangle's signed sweep
 * makes the sum over a polygon's edges the integral over the polygon, inside or out.
 */
const EDGE_STRIDE = 9

function edgeConstants(edges: readonly FieldEdge[], px: number, py: number, scale: number): Float64Array {
  const out = new Float64Array(edges.length * EDGE_STRIDE)
  let n = 0
  for (const e of edges) {
    const ex = e.bx - e.ax
    const ey = e.by - e.ay
    const len = Math.hypot(ex, ey)
    const ux = ex / len
    const uy = ey / len
    // Foot of the perpendicular from P and the unit normal n̂ from P towards the edge line.
    const along = (px - e.ax) * ux + (py - e.ay) * uy
    const fx = e.ax + along * ux - px
    const fy = e.ay + along * uy - py
    const d = Math.hypot(fx, fy)
    if (d <= 1e-12 * scale) continue // P on the edge line: the triangle has no area
    const nx = fx / d
    const ny = fy / d
    // t̂ = n̂ turned anticlockwise: φ grows anticlockwise about P.
    const tx = -ny
    const ty = nx
    const sA = (e.ax - px) * tx + (e.ay - py) * ty
    const sB = (e.bx - px) * tx + (e.by - py) * ty
    const rA = Math.hypot(sA, d)
    const rB = Math.hypot(sB, d)
    const p0 = e.a + e.b * px + e.c * py
    const gn = e.b * nx + e.c * ny
    const gt = e.b * tx + e.c * ty
    const dPhi = Math.atan2(sB, d) - Math.atan2(sA, d)
    out[n++] = d * d
    out[n++] = dPhi * p0
    out[n++] = p0
    out[n++] = gn * d * d * d
    out[n++] = gt * d
    out[n++] = sA / rA
    out[n++] = d / rA
    out[n++] = sB / rB
    out[n++] = d / rB
  }
  return out.subarray(0, n)
}

/** Δσz at depth z > 0 from packed edge constants (see `edgeConstants`). */
function edgeSum(k: Float64Array, z: number): number {
  const z2 = z * z
  let sum = 0
  for (let i = 0; i < k.length; i += EDGE_STRIDE) {
    const d2 = k[i]!
    const zOverD2 = z / (d2 + z2)
    const tA = k[i + 5]!
    const cA = k[i + 6]!
    const tB = k[i + 7]!
    const cB = k[i + 8]!
    const QA = Math.sqrt(d2 + z2 * cA * cA)
    const QB = Math.sqrt(d2 + z2 * cB * cB)
    const iA = 1 / QA
    const iB = 1 / QB
    const dA = tB * iB - tA * iA
    // atan2(z·tB, QB) − atan2(z·tA, QA) as one atan2: both angles lie in (−π/2, π/2).
    const ztA = z * tA
    const ztB = z * tB
    const angle = Math.atan2(ztB * QA - ztA * QB, QA * QB + ztA * ztB)
    const uniform = angle - zOverD2 * d2 * dA
    sum += k[i + 1]! - k[i + 2]! * uniform + k[i + 3]! * zOverD2 * dA - k[i + 4]! * z * (cB * iB - cA * iA)
  }
  return sum / TWO_PI
}

/**
 * Δσz(depth) under an embankment at a point of its own frame. With sideSlope 0 it is the
 * rectangle (Newmark 1935) exactly; at depth 0 the surface pressure itself.
 */
function embankmentStressLocal(e: EmbankmentShape, u: number, v: number, edges?: readonly FieldEdge[]): (z: number) => number {
  // A slope narrower than a millionth of the crest is the rectangle to that order; the
  // ramp's steep gradient q/s would only cost rounding in the edge sums.
  if (e.s <= 1e-6 * Math.max(e.hx, e.hy)) {
    const w = 2 * e.hx
    const l = 2 * e.hy
    return (z: number) => rectangleStress(w, l, e.q, u, v, z)
  }
  const k = edgeConstants(edges ?? embankmentEdges(e), u, v, Math.max(e.HX, e.HY))
  const surface = embankmentSurface(e, u, v)
  return (z: number) => (z === 0 ? surface : edgeSum(k, z))
}

/** Δσz (kPa) under an embankment at site point (x, y), depth z (m). */
export function embankmentStress(load: Extract<PlanLoad, { type: 'embankment' }>, x: number, y: number, depth: number): number {
  const p = toLocal(load, x, y)
  return embankmentStressLocal(embankmentShape(load), p.x, p.y)(depth)
}

// ---------------------------------------------------------------- circle

const PANEL_ORDER = 8
const GL8 = gaussLegendre(PANEL_ORDER)
/** Depths (as fractions of the radius) the circle's angular panels are checked at; between them the integrand changes smoothly. */
const CIRCLE_CHECK_DEPTHS = Array.from({ length: 8 }, (_, i) => 0.002 * 4 ** i)
/** Absolute tolerance on Δσ/q per panel check. */
const CIRCLE_PANEL_TOLERANCE = 1e-6

/** (z²/(s² + z²))^{3/2}: the closed radial integral's depth term (Boussinesq 1885). */
function cubeTerm(s: number, z: number): number {
  const r = (z * z) / (s * s + z * z)
  return r * Math.sqrt(r)
}

/**
 * Angular panels on [a, b] for integrand(θ, z), refined until each panel's 8-point
 * Gauss–Legendre sum agrees with its halves at every check depth. Returns nodes and
 * weights for a fixed rule valid at all depths.
 */
function angularRule(f: (t: number, z: number) => number, a: number, b: number, depths: readonly number[]): { t: number[], w: number[] } {
  const t: number[] = []
  const w: number[] = []
  const panel = (lo: number, hi: number) => {
    const h = 0.5 * (hi - lo)
    const c = 0.5 * (hi + lo)
    return depths.map((z) => {
      let s = 0
      for (let i = 0; i < PANEL_ORDER; i++) s += GL8.w[i]! * f(c + h * GL8.x[i]!, z)
      return s * h
    })
  }
  const refine = (lo: number, hi: number, whole: number[], level: number) => {
    const m = 0.5 * (lo + hi)
    const left = panel(lo, m)
    const right = panel(m, hi)
    const ok = level >= 30 || whole.every((v, i) => Math.abs(left[i]! + right[i]! - v) <= CIRCLE_PANEL_TOLERANCE)
    if (ok) {
      for (const [l, r] of [[lo, m], [m, hi]] as const) {
        const h = 0.5 * (r - l)
        const c = 0.5 * (r + l)
        for (let i = 0; i < PANEL_ORDER; i++) {
          t.push(c + h * GL8.x[i]!)
          w.push(GL8.w[i]! * h)
        }
      }
      return
    }
    refine(lo, m, left, level + 1)
    refine(m, hi, right, level + 1)
  }
  refine(a, b, panel(a, b), 0)
  return { t, w }
}

/**
 * Δσz(depth) at distance d from the centre of a circle of radius R loaded by q.
 * On the axis the closed form q[1 − (1/(1 + (R/z)²))^{3/2}] (from Boussinesq 1885;
 * Poulos & Davis 1974). Off the axis, rays from the point: along each the radial
 * integral is closed, [1 − (z/√(S² + z²))³]/(2π); the angular integral uses a fixed
 * Gauss–Legendre rule set up once for the point (panels refined until the rule is
 * good to 1e-6·q at depths 0.002R…33R). Inside the rim the ray length is
 * S(θ) = d cos θ + √(R² − d² sin² θ); outside, rays with |θ| < α = asin(R/d) cross the
 * disc between s₁,₂ = d cos θ ∓ √(R² − d² sin² θ), and θ = α sin φ removes the
 * square-root ends.
 */
function circleStressAt(radius: number, q: number, d: number): (z: number) => number {
  const R2 = radius * radius
  if (d <= 1e-12 * radius) {
    return (z: number) => {
      if (z === 0) return q
      const c = z / Math.sqrt(z * z + R2)
      return q * (1 - c * c * c)
    }
  }
  const depths = CIRCLE_CHECK_DEPTHS.map(f => f * radius)
  if (d < radius) {
    const S = (theta: number) => {
      const sn = Math.sin(theta)
      return d * Math.cos(theta) + Math.sqrt(Math.max(0, R2 - d * d * sn * sn))
    }
    const rule = angularRule((th, z) => cubeTerm(S(th), z), 0, Math.PI, depths)
    const s = Float64Array.from(rule.t, S)
    const w = Float64Array.from(rule.w, v => v / Math.PI)
    return (z: number) => {
      if (z === 0) return q
      let sum = 0
      for (let i = 0; i < s.length; i++) sum += w[i]! * cubeTerm(s[i]!, z)
      return q * (1 - sum)
    }
  }
  const alpha = Math.asin(Math.min(1, radius / d))
  const ends = (phi: number): [number, number, number] => {
    const theta = alpha * Math.sin(phi)
    const sn = Math.sin(theta)
    const root = Math.sqrt(Math.max(0, R2 - d * d * sn * sn))
    const mid = d * Math.cos(theta)
    return [Math.max(0, mid - root), mid + root, alpha * Math.cos(phi)]
  }
  const g = (phi: number, z: number) => {
    const [s1, s2, j] = ends(phi)
    return (cubeTerm(s1, z) - cubeTerm(s2, z)) * j
  }
  const rule = angularRule(g, 0, Math.PI / 2, depths)
  const n = rule.t.length
  const s1 = new Float64Array(n)
  const s2 = new Float64Array(n)
  const w = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const [a, b, j] = ends(rule.t[i]!)
    s1[i] = a
    s2[i] = b
    w[i] = (rule.w[i]! * j) / Math.PI
  }
  const surface = d === radius ? q / 2 : 0
  return (z: number) => {
    if (z === 0) return surface
    let sum = 0
    for (let i = 0; i < n; i++) sum += w[i]! * (cubeTerm(s1[i]!, z) - cubeTerm(s2[i]!, z))
    return q * sum
  }
}

/** Δσz (kPa) under a uniformly loaded circle at site point (x, y), depth z (m). */
export function circleStressPlan(load: Extract<PlanLoad, { type: 'circle' }>, x: number, y: number, depth: number): number {
  requirePositive(load.radius, 'The circle radius')
  return circleStressAt(load.radius, load.pressure, Math.hypot(x - load.x, y - load.y))(depth)
}

// --------------------------------------------------------------- dispatch

/**
 * Shape and edges per embankment object, so a grid of points sets them up once. Keyed by the
 * object and checked against its dimensions, so a load edited in place is set up afresh
 * (position and rotation are applied per point and need no check).
 */
const preparedEmbankments = new WeakMap<PlanLoad, { key: string, shape: EmbankmentShape, edges: FieldEdge[] }>()

function stressAt(load: PlanLoad, x: number, y: number): (z: number) => number {
  switch (load.type) {
    case 'uniform': {
      requireFinite(load.pressure, 'The load pressure')
      const q = load.pressure
      return () => q
    }
    case 'rectangle': {
      requirePositive(load.width, 'The rectangle width')
      requirePositive(load.length, 'The rectangle length')
      requireFinite(load.pressure, 'The load pressure')
      const p = toLocal(load, x, y)
      const { width, length, pressure } = load
      return (z: number) => rectangleStress(width, length, pressure, p.x, p.y, z)
    }
    case 'circle':
      requirePositive(load.radius, 'The circle radius')
      requireFinite(load.pressure, 'The load pressure')
      return circleStressAt(load.radius, load.pressure, Math.hypot(x - load.x, y - load.y))
    case 'embankment': {
      let prepared = preparedEmbankments.get(load)
      const key = `${load.crestWidth},${load.crestLength},${load.height},${load.sideSlope},${load.unitWeight}`
      if (!prepared || prepared.key !== key) {
        const shape = embankmentShape(load)
        prepared = { key, shape, edges: embankmentEdges(shape) }
        preparedEmbankments.set(load, prepared)
      }
      const p = toLocal(load, x, y)
      return embankmentStressLocal(prepared.shape, p.x, p.y, prepared.edges)
    }
    default: throw new GeotechError('load-invalid', 'Unknown load type.')
  }
}

/**
 * Δσz(depth) at plan point (x, y) under all `loads` (superposition). The set-up per
 * (load, point) is done here; the returned function is cheap per depth (z ≥ 0, m).
 */
export function planStressIncrease(loads: readonly PlanLoad[], x: number, y: number): (depth: number) => number {
  const parts = loads.map(load => stressAt(load, x, y))
  if (parts.length === 1) return parts[0]!
  return (z: number) => {
    let s = 0
    for (const f of parts) s += f(z)
    return s
  }
}

// --------------------------------------------------------------- outlines

const CIRCLE_OUTLINE_SEGMENTS = 48

function rectOutline(load: { x: number, y: number, rotation: number }, hw: number, hl: number): PlanXY[] {
  return [[-hw, -hl], [hw, -hl], [hw, hl], [-hw, hl]].map(([u, v]) => toSite(load, u!, v!))
}

/**
 * A load's outlines on the plan (site grid, m, anticlockwise): `toe` the footprint,
 * `crest` the full-pressure region. The same for a rectangle or circle; null for a uniform fill.
 */
export function loadOutlines(load: PlanLoad): { toe: PlanXY[] | null, crest: PlanXY[] | null } {
  switch (load.type) {
    case 'uniform': return { toe: null, crest: null }
    case 'rectangle': {
      const r = rectOutline(load, load.width / 2, load.length / 2)
      return { toe: r, crest: r }
    }
    case 'circle': {
      const c = Array.from({ length: CIRCLE_OUTLINE_SEGMENTS }, (_, i) => ({
        x: load.x + load.radius * Math.cos((i * TWO_PI) / CIRCLE_OUTLINE_SEGMENTS),
        y: load.y + load.radius * Math.sin((i * TWO_PI) / CIRCLE_OUTLINE_SEGMENTS),
      }))
      return { toe: c, crest: c }
    }
    case 'embankment': {
      const t = load.sideSlope * load.height
      return {
        toe: rectOutline(load, load.crestWidth / 2 + t, load.crestLength / 2 + t),
        crest: rectOutline(load, load.crestWidth / 2, load.crestLength / 2),
      }
    }
  }
}

/** The load's footprint on the plan (toe outline, site grid, m), or null for a uniform fill. */
export function loadFootprint(load: PlanLoad): PlanXY[] | null {
  return loadOutlines(load).toe
}

/** The plan box around all loads' footprints (a circle's exact box), or null when no load has a footprint. */
export function footprintExtent(loads: readonly PlanLoad[]): { x0: number, x1: number, y0: number, y1: number } | null {
  let x0 = Infinity
  let x1 = -Infinity
  let y0 = Infinity
  let y1 = -Infinity
  for (const load of loads) {
    if (load.type === 'uniform') continue
    if (load.type === 'circle') {
      x0 = Math.min(x0, load.x - load.radius)
      x1 = Math.max(x1, load.x + load.radius)
      y0 = Math.min(y0, load.y - load.radius)
      y1 = Math.max(y1, load.y + load.radius)
      continue
    }
    for (const p of loadOutlines(load).toe ?? []) {
      x0 = Math.min(x0, p.x)
      x1 = Math.max(x1, p.x)
      y0 = Math.min(y0, p.y)
      y1 = Math.max(y1, p.y)
    }
  }
  return x0 <= x1 ? { x0, x1, y0, y1 } : null
}
