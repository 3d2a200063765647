import { degreeOfConsolidation } from '../geotech/consolidation'
import { GeotechError } from '../geotech/errors'
import { combinedDegree, radialDegree } from '../geotech/radial-consolidation'
import { voidRatioChange } from '../geotech/settlement'

/**
 * Time–settlement under loads placed on a construction schedule, with surcharge removal and
 * vertical drains: superposition in time of load increments. Units: m, kPa, years, m²/yr.
 *
 * - Each increment's final settlement follows the nonlinear Cc/Cr law of every sublayer
 *   (`voidRatioChange`, domain §3) from the state the earlier increments left: σ'v after all of
 *   them, and σ'p = max(σ'p, σ'v) carried forward (domain §2).
 * - An increment placed at tᵢ develops with its consolidating unit's average degree
 *   U(t − tᵢ): Terzaghi (1925) vertically; with drains, combined with Hansbo's (1981) radial
 *   degree by Carrillo (1942). Superposing increments this way is the classical treatment of
 *   time-dependent loading (Terzaghi 1943; for a linear ramp it converges to Olson 1977).
 * - A ramp is cut into increments of at most 1 % of its duration (`RAMP_STEPS`), each placed
 *   at the middle of its slice of time.
 * - Removal of a load at `removeAt` (a surcharge): every sublayer's settlement reached then is
 *   turned back into the effective stress it reached along its own Cc/Cr law. From that stress
 *   the sublayer moves to the stress of the loads left in place: along Cr up to σ'p (= the
 *   largest stress reached) and Cc beyond — a rebound where the reached stress is higher, the
 *   primary settlement still to come where it is lower — developing with U(t − removeAt).
 *   This is the usual reasoning for sizing a surcharge (Johnson 1970, common practice).
 */

/** Increments per ramp: each at most 1 % of the ramp's duration. */
export const RAMP_STEPS = 100

export interface ScheduleStage { start: number, duration: number, fraction: number }
export interface LoadSchedule {
  /** Left out or empty: the whole load placed at time 0. */
  stages?: readonly ScheduleStage[]
  removeAt?: number
}

/** One sublayer of the profile under the point, at its mid-depth. */
export interface StagedSublayer {
  depth: number
  thickness: number
  /** σ'v0, kPa. */
  effectiveStress: number
  /** σ'p before loading, kPa (≥ σ'v0). */
  preconsolidation: number
  cc: number
  cr: number
  e0: number
  /** Index into `units`. */
  unit: number
}

/** A unit that consolidates as one (a stratum): vertical cv and path; with drains, ch, De and μ. */
export interface StagedUnit {
  cv: number
  hdr: number
  drains?: { ch: number, influenceDiameter: number, mu: number }
}

export interface StagedLoad extends LoadSchedule {
  /** Δσ of the whole load at a depth under the point, kPa. */
  stressAt: (depth: number) => number
}

export interface StagedInput {
  sublayers: readonly StagedSublayer[]
  units: readonly StagedUnit[]
  loads: readonly StagedLoad[]
  /** Count the drains (default true; false gives the curve without them). */
  useDrains?: boolean
}

/** The stages of a schedule, the default (all at time 0) filled in. */
export function scheduleStages(s: LoadSchedule): readonly ScheduleStage[] {
  return s.stages && s.stages.length > 0 ? s.stages : [{ start: 0, duration: 0, fraction: 1 }]
}

/** The fraction of a load in place at time t (years): the stages' ramps summed; 0 from `removeAt` on. */
export function loadFraction(s: LoadSchedule, t: number): number {
  if (s.removeAt !== undefined && t >= s.removeAt) return 0
  let f = 0
  for (const st of scheduleStages(s)) {
    if (t < st.start) continue
    f += st.duration > 0 ? st.fraction * Math.min(1, (t - st.start) / st.duration) : st.fraction
  }
  return f
}

/** The times (years) at which a schedule changes course: stage starts and ends, and the removal. */
export function scheduleTimes(s: LoadSchedule): number[] {
  const out: number[] = []
  for (const st of scheduleStages(s)) out.push(st.start, st.start + st.duration)
  if (s.removeAt !== undefined) out.push(s.removeAt)
  return out
}

/** A schedule as increments of load fraction: `{ time, fraction }`, ramps cut into RAMP_STEPS. */
export function scheduleIncrements(s: LoadSchedule): { time: number, fraction: number }[] {
  const out: { time: number, fraction: number }[] = []
  for (const st of scheduleStages(s)) {
    if (st.duration > 0) {
      const dt = st.duration / RAMP_STEPS
      for (let i = 0; i < RAMP_STEPS; i++) out.push({ time: st.start + (i + 0.5) * dt, fraction: st.fraction / RAMP_STEPS })
    }
    else out.push({ time: st.start, fraction: st.fraction })
  }
  return out.sort((a, b) => a.time - b.time)
}

/**
 * The effective stress an element reached after a void-ratio change `de` from (σ'0, σ'p):
 * the inverse of `voidRatioChange` (Cr below σ'p, Cc beyond; Cr on the way down).
 */
export function stressForVoidRatioChange(cc: number, cr: number, s0: number, sp: number, de: number): number {
  const p = Math.max(sp, s0)
  if (de <= 0) return cr > 0 ? s0 * 10 ** (de / cr) : s0
  const toP = p > s0 ? cr * Math.log10(p / s0) : 0
  if (de <= toP) return cr > 0 ? s0 * 10 ** (de / cr) : p
  return cc > 0 ? p * 10 ** ((de - toP) / cc) : p
}

/**
 * Below this Tv the short-time form U = √(4Tv/π) equals Terzaghi's series to within about
 * exp(−1/Tv) ≈ 1e-14 (Terzaghi 1925; the series' first correction term is of that order), and
 * costs one square root instead of the dozens of series terms a small Tv needs.
 */
const SHORT_TIME_TV = 0.03

/** Terzaghi's U(Tv), the short-time form for small Tv (see SHORT_TIME_TV). */
function verticalDegree(tv: number): number {
  return tv <= SHORT_TIME_TV ? Math.sqrt((4 * tv) / Math.PI) : degreeOfConsolidation(tv)
}

/** Average degree of a unit Δt after an increment: Terzaghi (1925), with drains combined with Hansbo (1981) by Carrillo (1942). */
export function unitDegree(unit: StagedUnit, dt: number, useDrains = true): number {
  if (!(dt > 0)) return 0
  const uv = verticalDegree((unit.cv * dt) / (unit.hdr * unit.hdr))
  if (!useDrains || !unit.drains) return uv
  const d = unit.drains
  const ur = radialDegree((d.ch * dt) / (d.influenceDiameter * d.influenceDiameter), d.mu)
  return combinedDegree(uv, ur)
}

/** Settlement increments placed at one time: per sublayer (m), summed per unit. */
interface Increment { time: number, perUnit: Float64Array }

/** One stretch of time between removals: what it started from and its increments. */
interface Phase {
  start: number
  /** Settlement reached per unit when the phase began (frozen), m. */
  base: Float64Array
  increments: Increment[]
}

export interface StagedResult {
  /** Primary settlement at time t (years), m; `perUnit` receives each unit's share when given. */
  settlementAt: (t: number, perUnit?: Float64Array) => number
  /** Final primary settlement under the loads in place at the end, m. */
  final: number
  /** Each unit's final primary settlement, m. */
  unitFinal: number[]
  /** Each sublayer's final primary settlement, m. */
  sublayerFinal: Float64Array
  /** At the last removal: when, the rebound (m, upward positive) and the primary settlement still to come under the loads left (m). */
  removal: { at: number, rebound: number, residual: number } | null
  /** Every time the loading changes course (stage starts and ends, removals), sorted. */
  eventTimes: number[]
  /** Δσ at a depth from the loads in place at time t (years), kPa. */
  stressAt: (t: number, depth: number) => number
}

const SAME_TIME = 1e-12

/** Superposition in time of the schedule's load increments at one point (see the module comment). */
export function computeStaged(input: StagedInput): StagedResult {
  const { sublayers, units, loads } = input
  const useDrains = input.useDrains ?? true
  const n = sublayers.length
  const nu = units.length
  for (const u of units) {
    if (!(u.cv > 0) || !(u.hdr > 0)) throw new GeotechError('time-rate-missing', 'Every consolidating stratum needs cv and a drainage path for a staged run.')
  }
  // Full Δσ of each load at each sublayer's mid-depth.
  const full = loads.map(l => Float64Array.from(sublayers, s => l.stressAt(s.depth)))

  // Events in time order: loading increments (fractions of loads) and removals.
  interface Event { time: number, adds: { load: number, fraction: number }[], removes: number[] }
  const raw: { time: number, load: number, fraction: number, remove: boolean }[] = []
  loads.forEach((l, k) => {
    for (const inc of scheduleIncrements(l)) raw.push({ time: inc.time, load: k, fraction: inc.fraction, remove: false })
    if (l.removeAt !== undefined) raw.push({ time: l.removeAt, load: k, fraction: 0, remove: true })
  })
  raw.sort((a, b) => a.time - b.time || Number(a.remove) - Number(b.remove))
  const events: Event[] = []
  for (const r of raw) {
    let e = events[events.length - 1]
    if (!e || Math.abs(e.time - r.time) > SAME_TIME) {
      e = { time: r.time, adds: [], removes: [] }
      events.push(e)
    }
    if (r.remove) e.removes.push(r.load)
    else e.adds.push({ load: r.load, fraction: r.fraction })
  }

  // State carried forward: σ'v as if every increment so far had consolidated, and σ'p.
  const current = Float64Array.from(sublayers, s => s.effectiveStress)
  const pre = Float64Array.from(sublayers, s => Math.max(s.preconsolidation, s.effectiveStress))
  const placed = new Float64Array(loads.length)
  const sublayerFinal = new Float64Array(n)
  // Per sublayer, the increments of the current phase (for the settlement reached at a removal).
  let phaseSublayer: { time: number, ds: Float64Array }[] = []
  // Each sublayer's state at the start of the phase, and its settlement then.
  const phaseStress = Float64Array.from(current)
  const phasePre = Float64Array.from(pre)
  const phaseSettled = new Float64Array(n)
  const phases: Phase[] = [{ start: 0, base: new Float64Array(nu), increments: [] }]
  let removal: StagedResult['removal'] = null

  const factor = (s: StagedSublayer) => s.thickness / (1 + s.e0)
  const checkStress = (s: StagedSublayer, sf: number) => {
    if (!(sf > 0)) {
      throw new GeotechError('final-effective-stress-not-positive', `The loads bring σ'v to ${sf.toFixed(1)} kPa at ${Number(s.depth.toFixed(3))} m; it must stay positive.`, { depth: s.depth })
    }
  }

  for (const e of events) {
    if (e.removes.length === 0) {
      const ds = new Float64Array(n)
      const perUnit = new Float64Array(nu)
      for (let j = 0; j < n; j++) {
        const s = sublayers[j]!
        let dq = 0
        for (const a of e.adds) dq += a.fraction * full[a.load]![j]!
        const sf = current[j]! + dq
        checkStress(s, sf)
        const d = (voidRatioChange(s.cc, s.cr, current[j]!, pre[j]!, sf) * factor(s))
        ds[j] = d
        perUnit[s.unit] = perUnit[s.unit]! + d
        sublayerFinal[j] = sublayerFinal[j]! + d
        current[j] = sf
        if (sf > pre[j]!) pre[j] = sf
      }
      for (const a of e.adds) placed[a.load] = placed[a.load]! + a.fraction
      phaseSublayer.push({ time: e.time, ds })
      phases[phases.length - 1]!.increments.push({ time: e.time, perUnit })
      continue
    }
    // A removal (with any increments placed at the same moment): the settlement reached now,
    // the stress it stands for, and the way from there to the loads left in place.
    const t = e.time
    const degree = units.map((_, u) => phaseSublayer.map(inc => unitDegree(units[u]!, t - inc.time, useDrains)))
    for (const a of e.adds) placed[a.load] = placed[a.load]! + a.fraction
    for (const k of e.removes) placed[k] = 0
    const base = new Float64Array(nu)
    const perUnit = new Float64Array(nu)
    let rebound = 0
    let residual = 0
    for (let j = 0; j < n; j++) {
      const s = sublayers[j]!
      let settled = phaseSettled[j]!
      const du = degree[s.unit]!
      for (let i = 0; i < phaseSublayer.length; i++) settled += du[i]! * phaseSublayer[i]!.ds[j]!
      const gained = settled - phaseSettled[j]!
      const reached = stressForVoidRatioChange(s.cc, s.cr, phaseStress[j]!, phasePre[j]!, gained / factor(s))
      // σ'p after what the sublayer went through: the largest stress it reached (σ'p only grows).
      const p = Math.max(phasePre[j]!, reached)
      let target = s.effectiveStress
      for (let k = 0; k < loads.length; k++) target += placed[k]! * full[k]![j]!
      checkStress(s, target)
      const d = voidRatioChange(s.cc, s.cr, reached, p, target) * factor(s)
      if (d < 0) rebound -= d
      else residual += d
      base[s.unit] = base[s.unit]! + settled
      perUnit[s.unit] = perUnit[s.unit]! + d
      sublayerFinal[j] = settled + d
      phaseSettled[j] = settled
      phaseStress[j] = reached
      phasePre[j] = p
      current[j] = target
      pre[j] = Math.max(p, target)
    }
    removal = { at: t, rebound, residual }
    phaseSublayer = [{ time: t, ds: Float64Array.from(sublayers, (s, j) => sublayerFinal[j]! - phaseSettled[j]!) }]
    phases.push({ start: t, base, increments: [{ time: t, perUnit }] })
  }

  const unitFinal = new Array<number>(nu).fill(0)
  sublayers.forEach((s, j) => {
    unitFinal[s.unit] = unitFinal[s.unit]! + sublayerFinal[j]!
  })
  const final = unitFinal.reduce((a, b) => a + b, 0)

  const settlementAt = (t: number, perUnit?: Float64Array): number => {
    let phase = phases[0]!
    for (const p of phases) if (p.start <= t && p !== phases[0]) phase = p
    // A removal acts from its own time on: at t = removeAt the drop has not yet developed.
    let total = 0
    for (let u = 0; u < nu; u++) {
      let s = phase.base[u]!
      for (const inc of phase.increments) {
        if (inc.time >= t) break
        s += unitDegree(units[u]!, t - inc.time, useDrains) * inc.perUnit[u]!
      }
      if (perUnit) perUnit[u] = s
      total += s
    }
    return total
  }

  const eventTimes = [...new Set(loads.flatMap(l => scheduleTimes(l)))].sort((a, b) => a - b)
  const stressAt = (t: number, depth: number) => loads.reduce((sum, l) => sum + loadFraction(l, t) * l.stressAt(depth), 0)
  return { settlementAt, final, unitFinal, sublayerFinal, removal, eventTimes, stressAt }
}

/**
 * The first time (years) the settlement reaches `fraction` of the final primary, by a scan
 * over `grid` (increasing times; `values`, when given, are the settlements there already
 * computed) and bisection inside the bracketing step; null when it
 * never does within the grid or there is no settlement.
 */
export function timeToFraction(r: StagedResult, fraction: number, grid: readonly number[], values?: readonly number[]): number | null {
  if (!(r.final > 0)) return null
  const target = fraction * r.final
  let prev = 0
  for (const [k, t] of grid.entries()) {
    if ((values ? values[k]! : r.settlementAt(t)) >= target) {
      let lo = prev
      let hi = t
      for (let i = 0; i < 36 && hi - lo > 1e-12 * Math.max(1, hi); i++) {
        const mid = 0.5 * (lo + hi)
        if (r.settlementAt(mid) >= target) hi = mid
        else lo = mid
      }
      return 0.5 * (lo + hi)
    }
    prev = t
  }
  return null
}
