import { consolidationUnits, secondaryCompression } from '../geotech/consolidation'
import { planStressIncrease, type PlanLoad } from '../geotech/plan-loads'
import { hansboMu, influenceDiameter, wellResistanceTerm } from '../geotech/radial-consolidation'
import type { SettlementLayer } from '../geotech/settlement'
import type { RunDrains, RunLoad } from '../schemas/settlement-runs'
import type { SiteModelDefinition } from '../site-model/definition'
import { stratumBounds } from '../site-model/definition'
import type { RunDrainDesign, RunTimeCurve, RunTimePoint } from '../types/settlement-runs'
import type { SettlementKernel } from './kernel'
import { computeStaged, scheduleTimes, timeToFraction, type StagedResult, type StagedSublayer, type StagedUnit } from './staged'
import { CURVE_POINTS, logSpace } from './time-rate'

/**
 * A run's treatment — loads on a construction schedule, surcharges taken off, vertical drains —
 * at a named point, on top of the run's profile (the grid kernel's sublayers, so the staged
 * engine sees exactly the sublayers, σ'v0 and σ'p of the plain run). See `staged.ts`.
 */

/** γw, kN/m³ (domain conventions). */
const UNIT_WEIGHT_WATER = 9.81
/** End of primary for secondary compression (common practice; the engine's value). */
const END_OF_PRIMARY_DEGREE = 0.95

/** Whether a run needs the staged engine: a schedule, a removal or drains. */
export function isTreated(loads: readonly RunLoad[], drains: RunDrains | undefined): boolean {
  return drains !== undefined || loads.some(l => (l.stages !== undefined && l.stages.length > 0) || l.removeAt !== undefined)
}

/** The loads still in place once every removal has happened. */
export function permanentLoads(loads: readonly RunLoad[], resolved: readonly PlanLoad[]): PlanLoad[] {
  return resolved.filter((_, i) => loads[i]!.removeAt === undefined)
}

/** The run's staged profile: sublayers with their consolidating unit, units with their drains. */
export interface TreatmentProfile {
  sublayers: StagedSublayer[]
  units: StagedUnit[]
  /** Stratum index of each unit and of each sublayer. */
  unitStratum: number[]
  /** Per compressible layer (profile order): its sublayer range, unit, e0, Cα, thickness. */
  layers: { start: number, end: number, unit: number, e0: number, calpha?: number, thickness: number }[]
  design: RunDrainDesign | null
}

/**
 * Builds the staged profile from the kernel of the run's profile. Units follow the engine's
 * drainage groups (a stratum consolidates as one, `consolidationUnits`). With drains, each
 * drained stratum's unit gets ch = (ch/cv)·cv, De (Barron 1948) and Hansbo's (1981) μ; the
 * well resistance (when qw is given) uses kh = ch·mv·γw with mv = 0.434·Cc/((1 + e0)·σ') at
 * the stratum's middle sublayer, σ' = max(σ'v0, σ'p) — the virgin compressibility, the cautious
 * side — and a drain discharging at the top over its whole length, from the surface to the base
 * of the deepest drained stratum (common practice).
 */
export function treatmentProfile(def: SiteModelDefinition, layers: readonly SettlementLayer[], stratumOf: readonly number[], kernel: SettlementKernel, drains: RunDrains | undefined): TreatmentProfile {
  const compressible: { layer: SettlementLayer, index: number }[] = []
  layers.forEach((layer, index) => {
    if (layer.compressible) compressible.push({ layer, index })
  })
  // Consecutive compressible layers only group when adjacent in the profile (as the engine does).
  let run = 0
  const units = consolidationUnits(compressible.map(({ layer, index }, j) => {
    if (j > 0 && compressible[j - 1]!.index + 1 !== index) run++
    return { thickness: layer.thickness, cv: layer.cv, drainage: layer.drainage, drainageGroup: layer.drainageGroup === undefined ? undefined : `${run}\u0000${layer.drainageGroup}` }
  }))
  const unitOfLayer = new Array<number>(compressible.length)
  units.forEach((u, k) => u.members.forEach((m) => {
    unitOfLayer[m] = k
  }))
  const unitStratum = units.map(u => stratumOf[compressible[u.members[0]!]!.index]!)
  const sublayers: StagedSublayer[] = []
  const profileLayers: TreatmentProfile['layers'] = []
  compressible.forEach(({ layer }, j) => {
    const start = kernel.layerStart[j]!
    const end = kernel.layerEnd[j]!
    for (let i = start; i < end; i++) {
      sublayers.push({
        depth: kernel.depth[i]!,
        thickness: kernel.thickness[i]!,
        effectiveStress: kernel.effectiveStress[i]!,
        preconsolidation: kernel.preconsolidation[i]!,
        cc: kernel.cc[i]!,
        cr: kernel.cr[i]!,
        e0: kernel.onePlusE0[i]! - 1,
        unit: unitOfLayer[j]!,
      })
    }
    profileLayers.push({ start, end, unit: unitOfLayer[j]!, e0: layer.e0!, calpha: layer.calpha, thickness: layer.thickness })
  })

  const drained = new Set<number>()
  if (drains) {
    def.strata.forEach((s, i) => {
      if (drains.strata.includes(s.code)) drained.add(i)
    })
  }
  const bounds = stratumBounds(def)
  const drainLength = Math.max(0, ...[...drained].map(i => bounds[i]!.bottom))
  let design: RunDrainDesign | null = null
  const stagedUnits: StagedUnit[] = units.map((u, k) => ({ cv: u.cv ?? 0, hdr: u.hdr, ...(drains && drained.has(unitStratum[k]!) ? { drains: { ch: 0, influenceDiameter: 0, mu: 0 } } : {}) }))
  if (drains) {
    const de = influenceDiameter(drains.pattern, drains.spacing)
    const n = de / drains.diameter
    const smearOnly = hansboMu({ n, smearRatio: drains.smearRatio, permeabilityRatio: drains.permeabilityRatio })
    let governing = smearOnly
    const strata: RunDrainDesign['strata'] = []
    stagedUnits.forEach((u, k) => {
      if (!u.drains) return
      const ch = drains.chRatio * u.cv
      let mu = smearOnly
      if (drains.dischargeCapacity !== undefined && drainLength > 0) {
        const mids = sublayers.filter(s => s.unit === k)
        const mid = mids[Math.floor(mids.length / 2)]
        if (mid) {
          const mv = (0.434 * mid.cc) / ((1 + mid.e0) * Math.max(mid.effectiveStress, mid.preconsolidation))
          const kh = ch * mv * UNIT_WEIGHT_WATER
          if (kh > 0) mu = hansboMu({ n, smearRatio: drains.smearRatio, permeabilityRatio: drains.permeabilityRatio, wellResistance: wellResistanceTerm({ kh, dischargeCapacity: drains.dischargeCapacity, drainLength }) })
        }
      }
      governing = Math.max(governing, mu)
      u.drains = { ch, influenceDiameter: de, mu }
      strata.push({ name: def.strata[unitStratum[k]!]!.name, cv: u.cv, ch, drainagePath: u.hdr })
    })
    design = { pattern: drains.pattern, spacing: drains.spacing, diameter: drains.diameter, influenceDiameter: de, mu: governing, strata }
  }
  return { sublayers, units: stagedUnits, unitStratum, layers: profileLayers, design }
}

export interface TreatedPoint {
  settlement: number
  /** Per stratum of the definition, m. */
  strata: number[]
  t50: number | null
  t90: number | null
  t50WithoutDrains?: number | null
  t90WithoutDrains?: number | null
  time: RunTimePoint[]
  secondary: number | null
  curve: RunTimeCurve
  removal: { at: number, rebound: number, residual: number } | null
}

/** Solves for the first time a unit's primary reaches `fraction` of its final, after `after` (years). */
function unitTime(r: StagedResult, unit: number, nu: number, fraction: number, after: number, hi: number): number {
  const per = new Float64Array(nu)
  const target = fraction * r.unitFinal[unit]!
  const at = (t: number) => {
    r.settlementAt(t, per)
    return per[unit]!
  }
  let lo = after
  let top = Math.max(hi, after * 2)
  for (let i = 0; i < 40 && at(top) < target; i++) top *= 2
  for (let i = 0; i < 36 && top - lo > 1e-10 * top; i++) {
    const mid = 0.5 * (lo + top)
    if (at(mid) >= target) top = mid
    else lo = mid
  }
  return top
}

/** The treated point: staged settlement with and without drains, removal figures, the curve, secondary. */
export function computeTreatedPoint(
  def: SiteModelDefinition,
  profile: TreatmentProfile,
  loads: readonly RunLoad[],
  resolved: readonly PlanLoad[],
  x: number,
  y: number,
  options: { years: readonly number[], designLife: number },
): TreatedPoint {
  const staged = resolved.map((l, i) => ({ stressAt: planStressIncrease([l], x, y), stages: loads[i]!.stages, removeAt: loads[i]!.removeAt }))
  const base = { sublayers: profile.sublayers, units: profile.units, loads: staged }
  const withDrains = computeStaged(base)
  const hasDrains = profile.units.some(u => u.drains)
  const without = hasDrains ? computeStaged({ ...base, useDrains: false }) : null

  // The curve's times: log-spaced from the fastest unit's early time to past the slowest's end
  // (and the design life, and twice the last event), with every schedule event on it.
  const scales = profile.units.flatMap(u => [(u.hdr * u.hdr) / u.cv, ...(u.drains ? [(u.drains.influenceDiameter ** 2) / u.drains.ch] : [])])
  const events = [...new Set(loads.flatMap(l => scheduleTimes(l)))].filter(t => t > 0)
  const lastEvent = Math.max(0, ...events)
  const t0 = Math.min(1e-4 * Math.min(...scales), ...events.map(t => t / 100))
  const t1 = Math.max(4 * Math.max(...scales), options.designLife, 2 * lastEvent)
  const removals = loads.flatMap(l => (l.removeAt !== undefined ? [l.removeAt] : []))
  const years = [...new Set([
    ...logSpace(t0, t1, CURVE_POINTS + 40),
    ...events,
    // Just before a removal (the load still on) and a little after it (the rebound under way).
    ...removals.flatMap(t => [t * (1 - 1e-6), t * 1.02, t * 1.05, t * 1.1, t * 1.25]),
  ])].filter(t => t > 0 && t <= t1).sort((a, b) => a - b)

  const nu = profile.units.length
  const per = new Float64Array(nu)
  const strataRows = def.strata.filter(s => s.compressible).map(s => ({ name: s.name, settlement: new Array<number>(years.length).fill(0) }))
  const rowOf = new Map(def.strata.map((s, i) => [i, strataRows.find(r => r.name === s.name)]))
  const primary = years.map((t, i) => {
    const s = withDrains.settlementAt(t, per)
    for (let u = 0; u < nu; u++) {
      const row = rowOf.get(profile.unitStratum[u]!)
      if (row) row.settlement[i] = row.settlement[i]! + per[u]!
    }
    return s
  })
  const surfaceLoad = years.map(t => withDrains.stressAt(t, 0))

  // Secondary compression after each unit's 95 % primary (drained), counted from the last change of load.
  const secondary = new Array<number>(years.length).fill(0)
  let secondaryAtLife: number | null = null
  const tp = profile.units.map((_, u) => (withDrains.unitFinal[u]! > 0 ? unitTime(withDrains, u, nu, END_OF_PRIMARY_DEGREE, lastEvent, t1) : null))
  for (const layer of profile.layers) {
    if (layer.calpha === undefined || !(layer.thickness > 0)) continue
    const tpu = tp[layer.unit]
    if (tpu === null || tpu === undefined) continue
    let s = 0
    for (let i = layer.start; i < layer.end; i++) s += withDrains.sublayerFinal[i]!
    const ep = layer.e0 - (s / layer.thickness) * (1 + layer.e0)
    if (!(ep > 0)) continue
    const at = (t: number) => secondaryCompression({ calpha: layer.calpha!, ep, thickness: layer.thickness, tp: tpu, t })
    years.forEach((t, i) => {
      secondary[i] = secondary[i]! + at(t)
    })
    secondaryAtLife = (secondaryAtLife ?? 0) + at(options.designLife)
  }

  const final = withDrains.final
  const time = options.years.map((t) => {
    const settlement = withDrains.settlementAt(t)
    return { years: t, degree: final !== 0 ? settlement / final : 0, settlement }
  })
  const strata = def.strata.map(() => 0)
  profile.sublayers.forEach((s, j) => {
    const k = profile.unitStratum[s.unit]!
    strata[k] = strata[k]! + withDrains.sublayerFinal[j]!
  })
  const withoutDrains = without ? years.map(t => without.settlementAt(t)) : null
  const curve: RunTimeCurve = {
    years,
    primary,
    secondary,
    total: primary.map((p, i) => p + secondary[i]!),
    layers: strataRows,
    surfaceLoad,
    ...(withoutDrains ? { withoutDrains } : {}),
  }
  return {
    settlement: final,
    strata,
    t50: timeToFraction(withDrains, 0.5, years, primary),
    t90: timeToFraction(withDrains, 0.9, years, primary),
    ...(without && withoutDrains ? { t50WithoutDrains: timeToFraction(without, 0.5, years, withoutDrains), t90WithoutDrains: timeToFraction(without, 0.9, years, withoutDrains) } : {}),
    time,
    secondary: secondaryAtLife,
    curve,
    removal: withDrains.removal,
  }
}

/** One row of a run's construction schedule, for exports and reports (years, fraction 0–1). */
export interface ScheduleRow {
  load: string
  stage: number
  start: number
  duration: number
  fraction: number
  /** When the load is taken off, years (on every row of a removed load). */
  removeAt: number | null
}

/** The schedule of every load, a row per stage (the default stage for a load without one). */
export function scheduleRows(loads: readonly RunLoad[]): ScheduleRow[] {
  return loads.flatMap((l, i) => {
    const stages = l.stages && l.stages.length > 0 ? l.stages : [{ start: 0, duration: 0, fraction: 1 }]
    return stages.map((st, k) => ({ load: l.label || `Load ${i + 1}`, stage: k + 1, start: st.start, duration: st.duration, fraction: st.fraction, removeAt: l.removeAt ?? null }))
  })
}
