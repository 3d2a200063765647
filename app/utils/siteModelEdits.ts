import type { Compressibility, CompressibilityKey, DepthTrend, ModelStratum, SiteModelDefinition, StratumTrend } from '#shared/site-model/definition'
import { SITE_MODEL_SCHEMA_VERSION, stratumBounds } from '#shared/site-model/definition-plain'
import type { Quantity } from '#shared/units'
import { configure } from 'safe-stable-stringify'
import { toRaw } from 'vue'

/**
 * Pure edits of a site-model definition, one function per gesture of the stress
 * workspace. Each takes a definition and returns a new one (the input is never
 * changed), so the editing session can keep snapshots for undo and redo.
 * Depths in m, stresses in kPa, unit weights in kN/m³ (SI inside, always).
 */

/** Thinnest band a drag or a split may leave, m. */
export const MIN_BAND_THICKNESS = 0.05

const round = (v: number, digits: number) => {
  const f = 10 ** digits
  return Math.round(v * f) / f
}
/** Depths are kept to the millimetre. */
export const roundDepth = (z: number) => round(z, 3)

function clone(def: SiteModelDefinition): SiteModelDefinition {
  return structuredClone(toRaw(def))
}

function band(def: SiteModelDefinition, i: number): ModelStratum {
  const s = def.strata[i]
  if (!s) throw new RangeError(`No band ${i} in a model of ${def.strata.length}.`)
  return s
}

/** Total depth of the model (the base of its last band). */
export function modelBase(def: Pick<SiteModelDefinition, 'strata'>): number {
  return roundDepth(def.strata.reduce((a, s) => a + s.thickness, 0))
}

export function setWaterTable(def: SiteModelDefinition, depth: number): SiteModelDefinition {
  const out = clone(def)
  out.groundwater.waterTableDepth = roundDepth(Math.max(0, depth))
  return out
}

/**
 * Moves the bottom of band `i` to `depth`. An inner break keeps the bottom of the
 * band below fixed (its thickness takes up the difference); the base of the model
 * moves alone. Both bands keep at least MIN_BAND_THICKNESS.
 */
export function moveBoundary(def: SiteModelDefinition, i: number, depth: number): SiteModelDefinition {
  const out = clone(def)
  const bounds = stratumBounds(out)
  const b = bounds[i]
  if (!b) throw new RangeError(`No band ${i} in a model of ${out.strata.length}.`)
  const upper = band(out, i)
  const lowerBand = out.strata[i + 1]
  const lowerBound = bounds[i + 1]
  const min = b.top + MIN_BAND_THICKNESS
  const max = lowerBand && lowerBound ? lowerBound.bottom - MIN_BAND_THICKNESS : 500
  const z = roundDepth(Math.min(Math.max(depth, min), max))
  upper.thickness = roundDepth(z - b.top)
  if (lowerBand && lowerBound) lowerBand.thickness = roundDepth(lowerBound.bottom - z)
  return out
}

/** Splits band `i` at `depth` into two bands of the same stratum; the lower part starts without a trend. */
export function splitBand(def: SiteModelDefinition, i: number, depth: number): SiteModelDefinition {
  const out = clone(def)
  const b = stratumBounds(out)[i]
  const s = band(out, i)
  if (!b) throw new RangeError(`No band ${i}.`)
  const z = roundDepth(depth)
  if (z - b.top < MIN_BAND_THICKNESS || b.bottom - z < MIN_BAND_THICKNESS) return out
  const lower: ModelStratum = { ...structuredClone(toRaw(s)), thickness: roundDepth(b.bottom - z) }
  delete lower.trend
  s.thickness = roundDepth(z - b.top)
  out.strata.splice(i + 1, 0, lower)
  return out
}

/** Removes the break at the bottom of band `i`: the band below joins it and takes its properties. */
export function removeBoundary(def: SiteModelDefinition, i: number): SiteModelDefinition {
  const out = clone(def)
  const upper = band(out, i)
  const lower = out.strata[i + 1]
  if (!lower) return out
  upper.thickness = roundDepth(upper.thickness + lower.thickness)
  out.strata.splice(i + 1, 1)
  return out
}

export interface StratumChoice {
  code: string
  name: string
  unitWeight: number
  unitWeightSaturated: number
}

/**
 * Gives band `i` another stratum of the project: its code, name and the strata
 * list's unit weights. The σ'p trend belonged to the old stratum's points and the
 * compressibility depth trends to its tests, so they go (the constants stay).
 */
export function setBandStratum(def: SiteModelDefinition, i: number, choice: StratumChoice): SiteModelDefinition {
  const out = clone(def)
  const s = band(out, i)
  if (s.code === choice.code) return out
  s.code = choice.code
  s.name = choice.name
  s.unitWeight = choice.unitWeight
  s.unitWeightSaturated = choice.unitWeightSaturated
  delete s.trend
  if (s.compressibility) delete s.compressibility.trends
  return out
}

export type UnitWeightKey = 'unitWeight' | 'unitWeightSaturated'

/** Bounds of the definition's schema (shared/site-model/definition.ts). */
export const UNIT_WEIGHT_RANGE = { min: 5, max: 30 } as const

export function setUnitWeight(def: SiteModelDefinition, i: number, key: UnitWeightKey, value: number): SiteModelDefinition {
  const out = clone(def)
  band(out, i)[key] = round(Math.min(Math.max(value, UNIT_WEIGHT_RANGE.min), UNIT_WEIGHT_RANGE.max), 2)
  return out
}

export interface PiezometerPoint { depth: number, porePressure: number }

export function addPiezometer(def: SiteModelDefinition, p: PiezometerPoint): SiteModelDefinition {
  const out = clone(def)
  out.groundwater.piezometers.push(cleanPiezometer(p))
  return out
}

export function movePiezometer(def: SiteModelDefinition, i: number, p: PiezometerPoint): SiteModelDefinition {
  const out = clone(def)
  if (!out.groundwater.piezometers[i]) throw new RangeError(`No piezometric control point ${i}.`)
  out.groundwater.piezometers[i] = cleanPiezometer(p)
  return out
}

export function removePiezometer(def: SiteModelDefinition, i: number): SiteModelDefinition {
  const out = clone(def)
  out.groundwater.piezometers.splice(i, 1)
  return out
}

function cleanPiezometer(p: PiezometerPoint): PiezometerPoint {
  return { depth: roundDepth(Math.max(0, p.depth)), porePressure: round(Math.max(0, p.porePressure), 1) }
}

export function setTrend(def: SiteModelDefinition, i: number, trend: StratumTrend | null): SiteModelDefinition {
  const out = clone(def)
  const s = band(out, i)
  if (trend) s.trend = structuredClone(toRaw(trend))
  else delete s.trend
  return out
}

export function setCompressible(def: SiteModelDefinition, i: number, compressible: boolean): SiteModelDefinition {
  const out = clone(def)
  band(out, i).compressible = compressible
  return out
}

/** Sets or clears fields of a band's adopted compressibility; Cc, Cr and e0 start at 0, 0 and 1 when absent. */
export function setCompressibility(def: SiteModelDefinition, i: number, patch: Partial<Compressibility>): SiteModelDefinition {
  const out = clone(def)
  const s = band(out, i)
  const next: Compressibility = { cc: 0, cr: 0, e0: 1, drainage: 'double', source: 'manual', ...s.compressibility, ...patch }
  for (const key of ['cv', 'calpha', 'n'] as const) {
    if (key in patch && patch[key] === undefined) delete next[key]
  }
  s.compressibility = next
  return out
}

/**
 * One parameter of a band's compressibility becomes a depth trend (`trend`) or
 * goes back to its constant (null). A trend needs schema version 2, so the
 * definition moves to it; Cc, Cr and e0 start at 0, 0 and 1 when absent, and cv
 * or Cα take the trend's mean as their constant when they have none.
 */
export function setCompressibilityTrend(def: SiteModelDefinition, i: number, key: CompressibilityKey, trend: DepthTrend | null): SiteModelDefinition {
  const out = clone(def)
  const s = band(out, i)
  const c: Compressibility = { cc: 0, cr: 0, e0: 1, drainage: 'double', source: 'manual', ...s.compressibility }
  const trends = { ...c.trends }
  if (trend) {
    trends[key] = structuredClone(toRaw(trend))
    if ((key === 'cv' || key === 'calpha') && c[key] === undefined) c[key] = trend.value
    out.schemaVersion = SITE_MODEL_SCHEMA_VERSION
  }
  else delete trends[key]
  if (Object.keys(trends).length) c.trends = trends
  else delete c.trends
  s.compressibility = c
  return out
}

export function setCptFactor(def: SiteModelDefinition, i: number, k: number): SiteModelDefinition {
  const out = clone(def)
  band(out, i).cptFactor = round(Math.min(Math.max(k, 0.01), 2), 3)
  return out
}

export function setSurcharge(def: SiteModelDefinition, q: number): SiteModelDefinition {
  const out = clone(def)
  out.surcharge = round(Math.max(0, q), 2)
  return out
}

/** Band index holding a depth (a break belongs to the band below it); the last band below the base. */
export function bandAt(def: Pick<SiteModelDefinition, 'strata'>, depth: number): number {
  const bounds = stratumBounds(def)
  const i = bounds.findIndex(b => depth >= b.top && depth < b.bottom)
  return i === -1 ? Math.max(0, bounds.length - 1) : i
}

const sortedJson = configure({ deterministic: true, circularValue: TypeError, bigint: false })

/** JSON with object keys sorted, so two equal definitions serialise alike whatever order the keys came in. */
export function stableJson(value: unknown): string {
  return sortedJson(value) ?? ''
}

/** The numbers of a model definition the page shows in the project's units, by their own key: their range messages quote bounds in those units. */
export const MODEL_QUANTITIES: Readonly<Record<string, Quantity>> = {
  thickness: 'length', waterTableDepth: 'length', depth: 'length', referenceDepth: 'length',
  unitWeight: 'unitWeight', unitWeightSaturated: 'unitWeight',
  surcharge: 'stress', porePressure: 'stress', preconsolidation: 'stress',
}
