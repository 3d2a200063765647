import { GeotechError } from './errors'
import { buildStressModel, segmentIndex, type StressLayer, type StressModel, type StressProfileInput } from './stress'
import { createStressIncrease, type Load } from './loads'
import { consolidationUnits, degreeOfConsolidation, secondaryCompression, timeFactorForDegree, type ConsolidationUnit, type Drainage } from './consolidation'

/**
 * 1-D primary consolidation settlement of a layered profile (Terzaghi & Peck;
 * any soil-mechanics text): each compressible layer is cut into thin sublayers,
 * σ'v0 and σ'p are taken at each sublayer's mid-depth, Δσ is added, and the
 * NC / OC / OC-NC void-ratio change is summed as Δh = Δe/(1 + e0)·h.
 */

/** How σ'p varies within a layer; σ'v0 is the in-situ vertical effective stress at the same depth. */
export type PreconsolidationModel =
  | { type: 'ocr', value: number } // σ'p = OCR·σ'v0
  | { type: 'pop', value: number } // σ'p = σ'v0 + POP (kPa)
  | { type: 'constant', value: number } // σ'p (kPa)
  | { type: 'linear', top: number, bottom: number } // σ'p at the layer top and bottom (kPa), linear between

export interface SettlementLayer extends StressLayer {
  compressible: boolean
  /** Compression index (virgin line slope, Δe per log10 cycle). */
  cc?: number
  /** Recompression index. */
  cr?: number
  /** Initial void ratio. */
  e0?: number
  preconsolidation?: PreconsolidationModel
  /** Coefficient of consolidation, m²/year. */
  cv?: number
  /** Drained faces (default double). */
  drainage?: Drainage
  /** Secondary compression index Cα. */
  calpha?: number
  /**
   * Consecutive layers with the same group consolidate as ONE layer of their combined
   * thickness (a stratum cut into slices): its drainage, the thickness-weighted harmonic
   * mean of cv (see `consolidationUnits`). Without a group a layer drains on its own.
   */
  drainageGroup?: string
}

/** Sublayering of each compressible layer: by maximum thickness (m) or a fixed count per layer. */
export type SublayerOptions = { maxThickness: number } | { count: number }

export interface SettlementInput extends Omit<StressProfileInput, 'layers' | 'depths'> {
  layers: SettlementLayer[]
  load: Load
  /**
   * Δσz(depth) of several plan loads at one point (settlement runs), used instead of `load`
   * when given; `load` then only names the case.
   */
  stressIncrease?: (depth: number) => number
  /** Default { maxThickness: 0.25 } m. */
  sublayers?: SublayerOptions
  /** Times (years after loading) at which to report consolidation settlement. */
  time?: { years: number[] }
  /** Years after loading at which secondary compression is reported (layers with Cα). */
  designLife?: number
}

export interface SettlementOptions {
  /**
   * Recompute with every sublayer halved to report convergence (default true).
   * Many-run callers (parameter studies, probabilistic runs) may skip it.
   */
  convergence?: boolean
}

export type CompressionCase = 'NC' | 'OC' | 'OC-NC'

export interface SublayerResult {
  layer: string
  top: number
  bottom: number
  /** Mid-depth, where the stresses are taken. */
  depth: number
  thickness: number
  effectiveStress: number
  stressIncrease: number
  finalEffectiveStress: number
  /** σ'p before loading (after raising to σ'v0 where it was lower). */
  preconsolidation: number
  /** σ'p after loading, max(σ'p, σ'vf). */
  finalPreconsolidation: number
  case: CompressionCase
  voidRatioChange: number
  strain: number
  /** m. */
  compression: number
}

export interface SettlementResult {
  /** Total primary consolidation settlement, m. */
  settlement: number
  /** The same computation with every sublayer halved, to show the answer has converged (null when skipped). */
  convergence: { halved: number, relativeChange: number } | null
  sublayers: SublayerResult[]
  layers: { name: string, settlement: number }[]
  /** Settlement at each requested time; `degree` = S(t)/S (0 when there is no settlement). */
  time?: { years: number, degree: number, settlement: number }[]
  /** Years to 50 % and 90 % of the total primary settlement (when every compressible layer has cv). */
  times?: { t50: number, t90: number }
  secondary?: {
    designLife: number
    /** m, over the layers with Cα. */
    settlement: number
    layers: { name: string, endOfPrimary: number, settlement: number }[]
  }
  warnings: string[]
}

/** Default sublayer thickness (m): fine enough for < 0.1 % discretisation error in usual profiles (see the convergence report). */
export const DEFAULT_MAX_SUBLAYER_THICKNESS = 0.25

/** End of primary consolidation for secondary compression: U = 95 % (common practice). */
const END_OF_PRIMARY_DEGREE = 0.95

/**
 * Void-ratio change of one element (domain §3): NC Cc·log(σ'vf/σ'v0); OC below
 * σ'p Cr·log(σ'vf/σ'v0); crossing σ'p Cr·log(σ'p/σ'v0) + Cc·log(σ'vf/σ'p).
 * Unloading (σ'vf < σ'v0) rebounds along Cr. σ'p is expected ≥ σ'v0.
 */
export function voidRatioChange(cc: number, cr: number, effectiveStress: number, preconsolidation: number, finalEffectiveStress: number): number {
  const s0 = effectiveStress
  const sp = preconsolidation
  const sf = finalEffectiveStress
  if (sf < s0) return cr * Math.log10(sf / s0)
  if (sp <= s0) return cc * Math.log10(sf / s0)
  if (sf <= sp) return cr * Math.log10(sf / s0)
  return cr * Math.log10(sp / s0) + cc * Math.log10(sf / sp)
}

/** Which branch `voidRatioChange` takes (unloading counts as OC: it follows Cr). */
export function compressionCase(effectiveStress: number, preconsolidation: number, finalEffectiveStress: number): CompressionCase {
  if (finalEffectiveStress < effectiveStress) return 'OC'
  if (preconsolidation <= effectiveStress) return 'NC'
  if (finalEffectiveStress <= preconsolidation) return 'OC'
  return 'OC-NC'
}

/** Compression Δh (m) of one sublayer of thickness h: Δe/(1 + e0)·h. */
export function primaryCompression(cc: number, cr: number, e0: number, effectiveStress: number, preconsolidation: number, finalEffectiveStress: number, thickness: number): number {
  return (voidRatioChange(cc, cr, effectiveStress, preconsolidation, finalEffectiveStress) / (1 + e0)) * thickness
}

/** Validated parameters of one compressible layer, σ'p(z) = c0 + c1·σ'v0 + c2·(z − top). */
interface CompressibleLayer {
  index: number
  name: string
  top: number
  bottom: number
  cc: number
  cr: number
  e0: number
  c0: number
  c1: number
  c2: number
  cv?: number
  drainage: Drainage
  calpha?: number
  drainageGroup?: string
}

/** Flags a layer's sublayer loop raises, so warnings are reported once per layer. */
interface LayerFlags {
  raised: boolean
  unloaded: boolean
}

function fail(code: string, layer: string, message: string, depth?: number): never {
  throw new GeotechError(code, `Layer "${layer}": ${message}`, { depth, detail: { layer } })
}

function formatDepth(depth: number): string {
  return `${Number(depth.toFixed(3))} m`
}

function requireParameter(value: number | undefined, layer: string, label: string): number {
  if (value === undefined || value === null) fail('compressibility-missing', layer, `a compressible layer needs ${label}.`)
  if (!Number.isFinite(value)) fail('compressibility-invalid', layer, `${label} must be a finite number (got ${String(value)}).`)
  return value
}

function compileLayer(layer: SettlementLayer, index: number, top: number, bottom: number, warnings: string[]): CompressibleLayer {
  const name = layer.name
  const cc = requireParameter(layer.cc, name, 'Cc')
  const cr = requireParameter(layer.cr, name, 'Cr')
  const e0 = requireParameter(layer.e0, name, 'e0')
  if (cc < 0) fail('compression-index-negative', name, `Cc is ${cc}; it must be ≥ 0.`)
  if (cr < 0) fail('compression-index-negative', name, `Cr is ${cr}; it must be ≥ 0.`)
  if (e0 <= 0) fail('void-ratio-not-positive', name, `e0 is ${e0}; it must be positive.`)
  if (cr > cc) warnings.push(`Layer "${name}": Cr (${cr}) exceeds Cc (${cc}); check the compressibility parameters.`)
  const pc = layer.preconsolidation
  if (!pc) fail('preconsolidation-missing', name, 'a compressible layer needs a preconsolidation model (σ\'p).')
  let c0 = 0
  let c1 = 0
  let c2 = 0
  switch (pc.type) {
    case 'ocr':
      requireParameter(pc.value, name, 'OCR')
      if (pc.value <= 0) fail('preconsolidation-negative', name, `OCR is ${pc.value}; σ'p must be positive.`)
      c1 = pc.value
      break
    case 'pop':
      requireParameter(pc.value, name, 'POP')
      c0 = pc.value
      c1 = 1
      break
    case 'constant':
      requireParameter(pc.value, name, 'σ\'p')
      if (pc.value <= 0) fail('preconsolidation-negative', name, `σ'p is ${pc.value} kPa; it must be positive.`)
      c0 = pc.value
      break
    case 'linear':
      requireParameter(pc.top, name, 'σ\'p at the top')
      requireParameter(pc.bottom, name, 'σ\'p at the bottom')
      if (pc.top <= 0 || pc.bottom <= 0) fail('preconsolidation-negative', name, `σ'p runs from ${pc.top} to ${pc.bottom} kPa; it must be positive.`)
      c0 = pc.top
      c2 = (pc.bottom - pc.top) / (bottom - top)
      break
    default: {
      const unknown: never = pc
      fail('preconsolidation-invalid', name, `unknown preconsolidation model ${JSON.stringify((unknown as { type?: unknown }).type)}.`)
    }
  }
  if (layer.cv !== undefined) {
    requireParameter(layer.cv, name, 'cv')
    if (layer.cv <= 0) fail('cv-not-positive', name, `cv is ${layer.cv} m²/yr; it must be positive.`)
  }
  const drainage = layer.drainage ?? 'double'
  if (drainage !== 'double' && drainage !== 'top' && drainage !== 'bottom') {
    fail('drainage-invalid', name, `unknown drainage "${String(drainage)}"; use double, top or bottom.`)
  }
  if (layer.calpha !== undefined) {
    requireParameter(layer.calpha, name, 'Cα')
    if (layer.calpha < 0) fail('calpha-negative', name, `Cα is ${layer.calpha}; it must be ≥ 0.`)
  }
  return { index, name, top, bottom, cc, cr, e0, c0, c1, c2, cv: layer.cv, drainage, calpha: layer.calpha, drainageGroup: layer.drainageGroup }
}

function sublayerCount(options: SublayerOptions, thickness: number): number {
  if ('count' in options) {
    const n = options.count
    if (!Number.isInteger(n) || n < 1) {
      throw new GeotechError('sublayers-invalid', `The sublayer count must be a whole number ≥ 1 (got ${String(n)}).`)
    }
    return n
  }
  const max = options.maxThickness
  if (!Number.isFinite(max) || max <= 0) {
    throw new GeotechError('sublayers-invalid', `The maximum sublayer thickness must be positive (got ${String(max)} m).`)
  }
  return Math.max(1, Math.ceil(thickness / max - 1e-9))
}

/**
 * Numbers the sublayer loop stores, one column per quantity; the rest of a row
 * (depths, σ'vf, final σ'p, strain, compression) is recomputed from these with
 * the same floating-point operations, so rows match the summed total exactly.
 */
interface SublayerColumns {
  effectiveStress: Float64Array
  stressIncrease: Float64Array
  preconsolidation: Float64Array
  voidRatioChange: Float64Array
  /** 0 NC, 1 OC, 2 OC-NC. */
  kind: Uint8Array
}

const CASES: readonly CompressionCase[] = ['NC', 'OC', 'OC-NC']

/**
 * Sums the compression of n equal sublayers of one layer, storing each
 * sublayer's numbers at `offset` in `columns` when given. The loop walks the
 * stress breakpoints in depth order and allocates nothing.
 */
function compressLayer(
  model: StressModel,
  layer: CompressibleLayer,
  loadAt: (z: number) => number,
  n: number,
  columns: SublayerColumns | null,
  offset: number,
  flags: LayerFlags,
): number {
  const d = model.depth
  const tot = model.total
  const pore = model.pore
  const tg = model.totalGradient
  const pg = model.poreGradient
  const lastSegment = d.length - 2
  const { top, bottom, cc, cr, e0, c0, c1, c2, name } = layer
  const h = (bottom - top) / n
  const onePlusE0 = 1 + e0
  let seg = segmentIndex(model, top)
  let raised = false
  let unloaded = false
  let sum = 0
  for (let i = 0; i < n; i++) {
    const zt = top + i * h
    const zb = i === n - 1 ? bottom : top + (i + 1) * h
    const zm = 0.5 * (zt + zb)
    while (seg < lastSegment && d[seg + 1]! <= zm) seg++
    const dz = zm - d[seg]!
    const s0 = (tot[seg]! + tg[seg]! * dz) - (pore[seg]! + pg[seg]! * dz)
    const ds = loadAt(zm)
    const sf = s0 + ds
    let sp = c0 + c1 * s0 + c2 * (zm - top)
    if (!(sp > 0)) fail('preconsolidation-negative', name, `σ'p is ${sp.toFixed(1)} kPa at ${formatDepth(zm)}; it must be positive.`, zm)
    if (sp < s0) {
      sp = s0
      raised = true
    }
    if (!(sf > 0)) fail('final-effective-stress-not-positive', name, `the load brings σ'v to ${sf.toFixed(1)} kPa at ${formatDepth(zm)}; it must stay positive.`, zm)
    let de: number
    let kind: number
    if (sf < s0) {
      de = cr * Math.log10(sf / s0)
      kind = 1
      unloaded = true
    }
    else if (sp <= s0) {
      de = cc * Math.log10(sf / s0)
      kind = 0
    }
    else if (sf <= sp) {
      de = cr * Math.log10(sf / s0)
      kind = 1
    }
    else {
      de = cr * Math.log10(sp / s0) + cc * Math.log10(sf / sp)
      kind = 2
    }
    sum += (de / onePlusE0) * (zb - zt)
    if (columns !== null) {
      const k = offset + i
      columns.effectiveStress[k] = s0
      columns.stressIncrease[k] = ds
      columns.preconsolidation[k] = sp
      columns.voidRatioChange[k] = de
      columns.kind[k] = kind
    }
  }
  if (raised) flags.raised = true
  if (unloaded) flags.unloaded = true
  return sum
}

/** Builds the output rows from the stored columns (same arithmetic as the loop). */
function materialiseRows(layers: CompressibleLayer[], counts: number[], columns: SublayerColumns): SublayerResult[] {
  const rows: SublayerResult[] = []
  let k = 0
  layers.forEach((layer, j) => {
    const n = counts[j]!
    const h = (layer.bottom - layer.top) / n
    for (let i = 0; i < n; i++, k++) {
      const zt = layer.top + i * h
      const zb = i === n - 1 ? layer.bottom : layer.top + (i + 1) * h
      const s0 = columns.effectiveStress[k]!
      const ds = columns.stressIncrease[k]!
      const sf = s0 + ds
      const sp = columns.preconsolidation[k]!
      const de = columns.voidRatioChange[k]!
      const strain = de / (1 + layer.e0)
      const thickness = zb - zt
      rows.push({
        layer: layer.name,
        top: zt,
        bottom: zb,
        depth: 0.5 * (zt + zb),
        thickness,
        effectiveStress: s0,
        stressIncrease: ds,
        finalEffectiveStress: sf,
        preconsolidation: sp,
        finalPreconsolidation: sf > sp ? sf : sp,
        case: CASES[columns.kind[k]!]!,
        voidRatioChange: de,
        strain,
        compression: strain * thickness,
      })
    }
  })
  return rows
}

/**
 * The compressible layers' consolidation units: consecutive layers (adjacent in the
 * profile) with the same drainage group consolidate as one (`consolidationUnits`).
 */
function compressibleUnits(compiled: readonly CompressibleLayer[]): ConsolidationUnit[] {
  let run = 0
  return consolidationUnits(compiled.map((l, j) => {
    if (j > 0 && compiled[j - 1]!.index + 1 !== l.index) run++
    return { thickness: l.bottom - l.top, cv: l.cv, drainage: l.drainage, drainageGroup: l.drainageGroup === undefined ? undefined : `${run}\u0000${l.drainageGroup}` }
  }))
}

/** Largest t in [0, hi] with f(t) < target, by bisection (f increasing). */
function solveTime(f: (t: number) => number, target: number, hi: number): number {
  let lo = 0
  for (let i = 0; i < 300 && hi - lo > 1e-13 * hi; i++) {
    const mid = 0.5 * (lo + hi)
    if (f(mid) < target) lo = mid
    else hi = mid
  }
  return 0.5 * (lo + hi)
}

/**
 * Primary consolidation settlement under `load` (domain §3), with a convergence
 * check (every sublayer halved), optional time rate (Terzaghi 1925, per layer,
 * S(t) = Σ Uᵢ(t)·Sᵢ) and optional secondary compression at `designLife`.
 * Terzaghi's U(Tv) assumes a uniform initial excess pore pressure in each layer,
 * an approximation under finite loads whose Δσ varies with depth.
 */
export function computeSettlement(input: SettlementInput, options: SettlementOptions = {}): SettlementResult {
  const checkConvergence = options.convergence ?? true
  const model = buildStressModel(input)
  const warnings: string[] = [...model.warnings]
  const loadAt = input.stressIncrease ?? createStressIncrease(input.load)
  const sublayering = input.sublayers ?? { maxThickness: DEFAULT_MAX_SUBLAYER_THICKNESS }

  const compiled: CompressibleLayer[] = []
  input.layers.forEach((layer, index) => {
    if (!layer.compressible) return
    compiled.push(compileLayer(layer, index, model.boundaries[index]!, model.boundaries[index + 1]!, warnings))
  })

  const years = input.time?.years
  if (years !== undefined) {
    for (const t of years) {
      if (!Number.isFinite(t) || t < 0) {
        throw new GeotechError('time-negative', `Times must be finite and ≥ 0 years (got ${String(t)}).`)
      }
    }
    for (const layer of compiled) {
      if (layer.cv === undefined) fail('cv-missing', layer.name, 'the time rate needs cv on every compressible layer.')
    }
  }
  if (input.designLife !== undefined && (!Number.isFinite(input.designLife) || input.designLife <= 0)) {
    throw new GeotechError('design-life-not-positive', `The design life must be a positive number of years (got ${String(input.designLife)}).`)
  }

  const counts = compiled.map(layer => sublayerCount(sublayering, layer.bottom - layer.top))
  const layerSettlement = new Float64Array(input.layers.length)
  let settlement = 0
  let halved = 0
  compiled.forEach((layer, j) => {
    const n = counts[j]!
    const flags: LayerFlags = { raised: false, unloaded: false }
    const s = compressLayer(model, layer, loadAt, n, null, 0, flags)
    if (checkConvergence) halved += compressLayer(model, layer, loadAt, 2 * n, null, 0, { raised: false, unloaded: false })
    layerSettlement[layer.index] = s
    settlement += s
    if (flags.raised) {
      warnings.push(`Layer "${layer.name}": σ'p below σ'v0 in places was raised to σ'v0 (taken as normally consolidated there).`)
    }
    if (flags.unloaded) {
      warnings.push(`Layer "${layer.name}": the load reduces σ'v in places; rebound there follows Cr.`)
    }
  })

  const result = {
    settlement,
    convergence: checkConvergence ? { halved, relativeChange: settlement === 0 ? 0 : Math.abs(halved - settlement) / Math.abs(settlement) } : null,
    sublayers: [] as SublayerResult[],
    layers: input.layers.map((l, i) => ({ name: l.name, settlement: layerSettlement[i]! })),
    warnings,
  } as SettlementResult
  // Rows are built on first read (then kept): the same loop runs again, this time filling the
  // columns, so a caller that wants only the totals (many-run studies) pays for no rows at all.
  let rows: SublayerResult[] | undefined
  const buildRows = (): SublayerResult[] => {
    const total = counts.reduce((a, b) => a + b, 0)
    const columns: SublayerColumns = {
      effectiveStress: new Float64Array(total),
      stressIncrease: new Float64Array(total),
      preconsolidation: new Float64Array(total),
      voidRatioChange: new Float64Array(total),
      kind: new Uint8Array(total),
    }
    let offset = 0
    compiled.forEach((layer, j) => {
      compressLayer(model, layer, loadAt, counts[j]!, columns, offset, { raised: false, unloaded: false })
      offset += counts[j]!
    })
    return materialiseRows(compiled, counts, columns)
  }
  Object.defineProperty(result, 'sublayers', {
    enumerable: true,
    configurable: true,
    get: () => (rows ??= buildRows()),
    set: (value: SublayerResult[]) => {
      rows = value
    },
  })

  const timed = compiled.every(l => l.cv !== undefined)
  const units = compressibleUnits(compiled)
  for (const unit of units) {
    if (unit.mixedDrainage) warnings.push(`Layer "${compiled[unit.members[0]!]!.name}": the layers of drainage group "${compiled[unit.members[0]!]!.drainageGroup}" give different drainage; the first layer's (${unit.drainage}) is used.`)
  }
  const unitSettlement = units.map(u => u.members.reduce((a, j) => a + layerSettlement[compiled[j]!.index]!, 0))
  const degreeAt = (t: number): number => {
    if (settlement === 0) return 0
    let s = 0
    units.forEach((unit, k) => {
      s += unitSettlement[k]! * degreeOfConsolidation((unit.cv! * t) / (unit.hdr * unit.hdr))
    })
    return s / settlement
  }
  if (years !== undefined) {
    result.time = years.map((t) => {
      const degree = degreeAt(t)
      return { years: t, degree, settlement: degree * settlement }
    })
  }
  if (timed && compiled.length > 0 && settlement !== 0) {
    let hi = 0
    for (const unit of units) hi = Math.max(hi, (timeFactorForDegree(0.9999) * unit.hdr * unit.hdr) / unit.cv!)
    result.times = { t50: solveTime(degreeAt, 0.5, hi), t90: solveTime(degreeAt, 0.9, hi) }
  }

  if (input.designLife !== undefined) {
    const designLife = input.designLife
    const layers: { name: string, endOfPrimary: number, settlement: number }[] = []
    let total = 0
    const unitOf = new Map<number, ConsolidationUnit>()
    for (const unit of units) for (const j of unit.members) unitOf.set(j, unit)
    for (const [j, layer] of compiled.entries()) {
      if (layer.calpha === undefined) continue
      if (layer.cv === undefined || unitOf.get(j)!.cv === undefined) {
        warnings.push(`Layer "${layer.name}": secondary compression needs cv to place the end of primary consolidation; left out.`)
        continue
      }
      const thickness = layer.bottom - layer.top
      // End of primary of the layer's drainage group (the whole stratum), not of a slice.
      const unit = unitOf.get(j)!
      const tp = (timeFactorForDegree(END_OF_PRIMARY_DEGREE) * unit.hdr * unit.hdr) / unit.cv!
      // Void ratio at the end of primary: e0 less the layer's mean Δe.
      const ep = layer.e0 - (layerSettlement[layer.index]! / thickness) * (1 + layer.e0)
      if (!(ep > 0)) fail('void-ratio-not-positive', layer.name, `the void ratio at the end of primary consolidation would be ${ep.toFixed(3)}; check Cc, e0 and the load.`)
      if (designLife <= tp) {
        warnings.push(`Layer "${layer.name}": the design life ends before primary consolidation (${Number(tp.toFixed(2))} years); no secondary compression.`)
      }
      const s = secondaryCompression({ calpha: layer.calpha, ep, thickness, tp, t: designLife })
      layers.push({ name: layer.name, endOfPrimary: tp, settlement: s })
      total += s
    }
    result.secondary = { designLife, settlement: total, layers }
  }
  return result
}
