import { GeotechError } from './errors'

/**
 * In-situ vertical stresses of a layered profile (Terzaghi's effective-stress
 * principle, σ'v0 = σv − u). Depth z is positive downward from the ground
 * surface, in metres; stresses in kPa; unit weights in kN/m³.
 */

/** One stratum of the profile, listed from the surface down. */
export interface StressLayer {
  name: string
  /** Thickness in m (> 0). */
  thickness: number
  /** Bulk (moist) unit weight used above the water table, kN/m³. */
  unitWeight: number
  /** Saturated unit weight used below the water table, kN/m³. */
  unitWeightSaturated: number
}

/** A measured pore pressure at a depth (a piezometric control point). */
export interface Piezometer {
  /** m below ground, at or below the water table; may lie below the base (e.g. in an aquifer under the model). */
  depth: number
  /** kPa (≥ 0). */
  porePressure: number
}

export interface Groundwater {
  /** Depth of the (possibly perched) water table, m (≥ 0). */
  waterTableDepth: number
  /** Control points of a piezometric profile; hydrostatic when absent or empty. */
  piezometers?: Piezometer[]
}

export interface StressProfileInput {
  /** Uniform pressure already acting on the surface, kPa (default 0). */
  surcharge?: number
  /** Unit weight of water, kN/m³ (default 9.81). */
  gammaW?: number
  layers: StressLayer[]
  groundwater: Groundwater
  /** Extra depths (m) to report besides the breakpoints. */
  depths?: number[]
}

export interface StressProfilePoint {
  depth: number
  /** Name of the layer the point belongs to (see the boundary rule on `computeStressProfile`). */
  layer: string
  /** Index of that layer in `input.layers`. */
  layerIndex: number
  totalStress: number
  porePressure: number
  effectiveStress: number
}

export interface StressProfile {
  points: StressProfilePoint[]
  warnings: string[]
}

export interface StressAtDepth {
  totalStress: number
  porePressure: number
  effectiveStress: number
  layerIndex: number
}

/**
 * The piecewise-linear profile as flat arrays: values at every breakpoint and,
 * per segment [depth[i], depth[i+1]], the layer and the gradients. Shared by the
 * profile, the evaluator and the settlement loop so all three agree bit for bit.
 */
export interface StressModel {
  /** Breakpoint depths, strictly increasing, first 0, last the base. */
  depth: Float64Array
  total: Float64Array
  pore: Float64Array
  /** Layer of the segment starting at breakpoint i; the last entry repeats the last layer. */
  layerIndex: Int32Array
  /** dσv/dz of segment i (kPa/m). */
  totalGradient: Float64Array
  /** du/dz of segment i (kPa/m). */
  poreGradient: Float64Array
  /** Layer boundaries from the surface to the base (layers.length + 1 values). */
  boundaries: Float64Array
  base: number
  layerNames: string[]
  warnings: string[]
}

/** Depths closer than this (m) are one breakpoint: far below any field measurement. */
const DEPTH_EPS = 1e-9

const DEFAULT_GAMMA_W = 9.81

/** Rounds a depth to the nanometre so that sums such as 1.2 + 2.2 land on 3.4 (common practice for decimal input). */
function roundDepth(value: number): number {
  return Math.round(value * 1e9) / 1e9
}

function formatDepth(depth: number): string {
  return `${Number(depth.toFixed(3))} m`
}

function requireFinite(value: number, code: string, what: string): void {
  if (!Number.isFinite(value)) {
    throw new GeotechError(code, `${what} must be a finite number (got ${String(value)}).`)
  }
}

/** u(z) from the water table and piezometric control points (domain §1). */
interface PoreModel {
  /** Control depths starting at the water table. */
  depth: number[]
  /** u at each control depth. */
  pore: number[]
  gammaW: number
}

function buildPoreModel(groundwater: Groundwater, gammaW: number): PoreModel {
  const zw = groundwater.waterTableDepth
  requireFinite(zw, 'water-table-invalid', 'The water table depth')
  if (zw < 0) {
    throw new GeotechError(
      'water-table-above-ground',
      `The water table depth is ${formatDepth(zw)}, above the ground surface; enter ponded water as a surcharge and the table at 0 m.`,
      { depth: zw },
    )
  }
  const controls = [...(groundwater.piezometers ?? [])]
  for (const p of controls) {
    requireFinite(p.depth, 'piezometer-invalid', 'A piezometer depth')
    requireFinite(p.porePressure, 'piezometer-invalid', `The pore pressure at ${formatDepth(p.depth)}`)
    if (p.porePressure < 0) {
      throw new GeotechError(
        'piezometer-pressure-negative',
        `The piezometer at ${formatDepth(p.depth)} reads ${p.porePressure} kPa; suction is not modelled, pore pressure must be ≥ 0.`,
        { depth: p.depth },
      )
    }
    if (p.depth < zw || (p.depth === zw && p.porePressure !== 0)) {
      throw new GeotechError(
        'piezometer-above-water-table',
        `The piezometer at ${formatDepth(p.depth)} lies above the water table at ${formatDepth(zw)}: control points must be at or below it (and read 0 at it).`,
        { depth: p.depth },
      )
    }
  }
  controls.sort((a, b) => a.depth - b.depth)
  const depth = [zw]
  const pore = [0]
  for (const p of controls) {
    const last = depth.length - 1
    if (p.depth - depth[last]! <= DEPTH_EPS) {
      if (Math.abs(p.porePressure - pore[last]!) > 1e-9) {
        throw new GeotechError(
          'piezometer-duplicate-depth',
          `Two piezometric control points at ${formatDepth(p.depth)} disagree (${pore[last]} and ${p.porePressure} kPa).`,
          { depth: p.depth },
        )
      }
      continue
    }
    depth.push(p.depth)
    pore.push(p.porePressure)
  }
  return { depth, pore, gammaW }
}

/** u at depth z: 0 above the table, linear between control points, hydrostatic gradient beyond the last. */
function poreAt(model: PoreModel, z: number): number {
  const d = model.depth
  if (z <= d[0]!) return 0
  const last = d.length - 1
  if (z >= d[last]!) return model.pore[last]! + model.gammaW * (z - d[last]!)
  let lo = 0
  let hi = last
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (d[mid]! <= z) lo = mid
    else hi = mid
  }
  const t = (z - d[lo]!) / (d[hi]! - d[lo]!)
  return model.pore[lo]! + t * (model.pore[hi]! - model.pore[lo]!)
}

/**
 * Builds the breakpoint model and validates it: σ'v0 ≤ 0 at any depth > 0 is
 * an error at the first such depth (uplift or basal heave, never clipped).
 * Linear segments mean checking the breakpoints suffices.
 */
export function buildStressModel(input: Omit<StressProfileInput, 'depths'>): StressModel {
  const surcharge = input.surcharge ?? 0
  const gammaW = input.gammaW ?? DEFAULT_GAMMA_W
  requireFinite(surcharge, 'surcharge-invalid', 'The surcharge')
  requireFinite(gammaW, 'unit-weight-invalid', 'The unit weight of water')
  if (surcharge < 0) {
    throw new GeotechError('surcharge-negative', `The surface surcharge is ${surcharge} kPa; it must be ≥ 0.`)
  }
  if (gammaW <= 0) {
    throw new GeotechError('unit-weight-invalid', `The unit weight of water is ${gammaW} kN/m³; it must be positive.`)
  }
  const layers = input.layers
  if (!Array.isArray(layers) || layers.length === 0) {
    throw new GeotechError('profile-empty', 'The profile has no layers.')
  }
  const boundaries = new Float64Array(layers.length + 1)
  let sum = 0
  for (let i = 0; i < layers.length; i++) {
    const layer = layers[i]!
    requireFinite(layer.thickness, 'layer-thickness-invalid', `The thickness of layer "${layer.name}"`)
    requireFinite(layer.unitWeight, 'unit-weight-invalid', `The unit weight of layer "${layer.name}"`)
    requireFinite(layer.unitWeightSaturated, 'unit-weight-invalid', `The saturated unit weight of layer "${layer.name}"`)
    if (layer.thickness <= 0) {
      throw new GeotechError(
        'layer-thickness-not-positive',
        `Layer "${layer.name}" (from ${formatDepth(boundaries[i]!)}) has thickness ${layer.thickness} m; it must be positive.`,
        { depth: boundaries[i]!, detail: { layer: layer.name, layerIndex: i } },
      )
    }
    if (layer.unitWeight < 0 || layer.unitWeightSaturated < 0) {
      throw new GeotechError(
        'unit-weight-negative',
        `Layer "${layer.name}" (from ${formatDepth(boundaries[i]!)}) has a negative unit weight.`,
        { depth: boundaries[i]!, detail: { layer: layer.name, layerIndex: i } },
      )
    }
    sum += layer.thickness
    boundaries[i + 1] = roundDepth(sum)
    if (boundaries[i + 1]! <= boundaries[i]!) {
      throw new GeotechError(
        'layer-thickness-not-positive',
        `Layer "${layer.name}" is thinner than a nanometre.`,
        { depth: boundaries[i]!, detail: { layer: layer.name, layerIndex: i } },
      )
    }
  }
  const base = boundaries[layers.length]!
  const pore = buildPoreModel(input.groundwater, gammaW)
  const zw = pore.depth[0]!
  const warnings: string[] = []
  if (zw >= base) {
    warnings.push(
      `The water table at ${formatDepth(zw)} is at or below the base of the profile (${formatDepth(base)}): the whole profile is taken as dry.`,
    )
  }

  // Breakpoints: layer boundaries first so they win a near-tie, then the table and control depths.
  const candidates: number[] = Array.from(boundaries)
  for (const d of pore.depth) if (d > 0 && d < base) candidates.push(d)
  candidates.sort((a, b) => a - b)
  const depths: number[] = []
  for (const d of candidates) {
    const last = depths.length - 1
    if (last >= 0 && d - depths[last]! <= DEPTH_EPS) continue
    depths.push(d)
  }
  // Near-ties were resolved in favour of the earlier value; make sure the base is exact.
  depths[depths.length - 1] = base

  const n = depths.length
  const model: StressModel = {
    depth: Float64Array.from(depths),
    total: new Float64Array(n),
    pore: new Float64Array(n),
    layerIndex: new Int32Array(n),
    totalGradient: new Float64Array(n),
    poreGradient: new Float64Array(n),
    boundaries,
    base,
    layerNames: layers.map(l => l.name),
    warnings,
  }
  model.total[0] = surcharge
  model.pore[0] = poreAt(pore, 0)
  let layer = 0
  for (let i = 0; i < n - 1; i++) {
    const top = model.depth[i]!
    const bottom = model.depth[i + 1]!
    while (layer < layers.length - 1 && boundaries[layer + 1]! <= top + DEPTH_EPS) layer++
    const mid = 0.5 * (top + bottom)
    const gamma = mid > zw ? layers[layer]!.unitWeightSaturated : layers[layer]!.unitWeight
    model.layerIndex[i] = layer
    model.totalGradient[i] = gamma
    model.total[i + 1] = model.total[i]! + gamma * (bottom - top)
    model.pore[i + 1] = poreAt(pore, bottom)
    model.poreGradient[i] = (model.pore[i + 1]! - model.pore[i]!) / (bottom - top)
  }
  model.layerIndex[n - 1] = layers.length - 1
  model.totalGradient[n - 1] = model.totalGradient[n - 2]!
  model.poreGradient[n - 1] = model.poreGradient[n - 2]!

  for (let i = 1; i < n; i++) {
    const s = model.total[i]! - model.pore[i]!
    if (s > 0) continue
    const prev = model.total[i - 1]! - model.pore[i - 1]!
    // First depth where σ' reaches 0: interpolate within the segment when it starts positive.
    const at = prev > 0
      ? model.depth[i - 1]! + (prev / (prev - s)) * (model.depth[i]! - model.depth[i - 1]!)
      : model.depth[i - 1]!
    const where = at === 0 ? 'just below the ground surface' : `at ${formatDepth(at)}`
    const layerName = layers[model.layerIndex[i - 1]!]!.name
    throw new GeotechError(
      'effective-stress-not-positive',
      `The vertical effective stress falls to zero ${where} in layer "${layerName}" (σv = ${round2(model.total[i]!)} kPa, u = ${round2(model.pore[i]!)} kPa at ${formatDepth(model.depth[i]!)}): uplift or basal heave, not a valid in-situ state.`,
      { depth: at, detail: { layer: layerName } },
    )
  }
  return model
}

function round2(v: number): number {
  return Math.round(v * 100) / 100
}

/** In ascending depths, the segment holding z: the largest i with depths[i] ≤ z, at least 0 and at most n − 2 (binary search). */
export function bracketIndex(depths: ArrayLike<number>, z: number): number {
  let lo = 0
  let hi = depths.length - 1
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1
    if (depths[mid]! <= z) lo = mid
    else hi = mid
  }
  return lo
}

/** Index of the model's segment holding z (see `bracketIndex`). */
export function segmentIndex(model: StressModel, z: number): number {
  return bracketIndex(model.depth, z)
}

function checkDepth(model: StressModel, z: number): number {
  if (!Number.isFinite(z) || z < -DEPTH_EPS || z > model.base + DEPTH_EPS) {
    throw new GeotechError(
      'depth-outside-profile',
      `Depth ${Number.isFinite(z) ? formatDepth(z) : String(z)} is outside the profile (0 to ${formatDepth(model.base)}).`,
      { depth: Number.isFinite(z) ? z : undefined },
    )
  }
  return z < 0 ? 0 : z > model.base ? model.base : z
}

/** σv and u at z in segment i; exact stored values at breakpoints (including the base). */
function valuesAt(model: StressModel, i: number, z: number, out: StressAtDepth): StressAtDepth {
  if (z === model.depth[i + 1]) {
    out.totalStress = model.total[i + 1]!
    out.porePressure = model.pore[i + 1]!
  }
  else {
    const dz = z - model.depth[i]!
    out.totalStress = model.total[i]! + model.totalGradient[i]! * dz
    out.porePressure = model.pore[i]! + model.poreGradient[i]! * dz
  }
  out.effectiveStress = out.totalStress - out.porePressure
  // A point at the base belongs to the last layer; elsewhere to the segment's layer.
  out.layerIndex = z === model.base ? model.layerIndex[model.depth.length - 1]! : model.layerIndex[i]!
  return out
}

/** Requested depths checked and in ascending order; already-sorted input (the usual case) skips the sort. */
function sortedDepths(model: StressModel, depths: readonly number[]): Float64Array {
  const out = new Float64Array(depths.length)
  let sorted = true
  for (let i = 0; i < depths.length; i++) {
    out[i] = checkDepth(model, depths[i]!)
    if (i > 0 && out[i]! < out[i - 1]!) sorted = false
  }
  // A typed array sorts numerically without a comparator call per pair.
  return sorted ? out : out.sort()
}

/**
 * Vertical stress profile with exact values at every breakpoint (surface, layer
 * boundaries, water table, piezometer depths) plus the requested depths, sorted
 * by depth. Boundary rule: a point on a layer boundary is reported in the layer
 * below it; the base of the profile is reported in the last layer.
 * O((n + m) log(n + m)) for n breakpoints and m requested depths.
 */
export function computeStressProfile(input: StressProfileInput): StressProfile {
  const model = buildStressModel(input)
  const requested = sortedDepths(model, input.depths ?? [])
  const points: StressProfilePoint[] = []
  const scratch: StressAtDepth = { totalStress: 0, porePressure: 0, effectiveStress: 0, layerIndex: 0 }
  const n = model.depth.length
  let r = 0
  const push = (z: number, v: StressAtDepth) => {
    points.push({
      depth: z,
      layer: model.layerNames[v.layerIndex]!,
      layerIndex: v.layerIndex,
      totalStress: v.totalStress,
      porePressure: v.porePressure,
      effectiveStress: v.effectiveStress,
    })
  }
  for (let i = 0; i < n; i++) {
    const bp = model.depth[i]!
    // Requested depths strictly before this breakpoint and not within DEPTH_EPS of it.
    while (r < requested.length && requested[r]! < bp - DEPTH_EPS) {
      const z = requested[r]!
      if (points.length === 0 || z - points[points.length - 1]!.depth > DEPTH_EPS) {
        push(z, valuesAt(model, Math.max(0, i - 1), z, scratch))
      }
      r++
    }
    while (r < requested.length && requested[r]! <= bp + DEPTH_EPS) r++
    const seg = Math.min(i, n - 2)
    push(bp, valuesAt(model, seg, bp, scratch))
  }
  return { points, warnings: [...model.warnings] }
}

/**
 * A fast σv, u, σ'v0 lookup for many depths: validates once, then each call is
 * a binary search over the breakpoints and a linear interpolation.
 * Depth outside the profile throws `depth-outside-profile`.
 */
export function createStressEvaluator(input: Omit<StressProfileInput, 'depths'>): (depth: number) => StressAtDepth {
  const model = buildStressModel(input)
  return (depth: number) => {
    const z = checkDepth(model, depth)
    const out: StressAtDepth = { totalStress: 0, porePressure: 0, effectiveStress: 0, layerIndex: 0 }
    return valuesAt(model, segmentIndex(model, z), z, out)
  }
}

