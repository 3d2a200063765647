// Staged loading, surcharge removal and drains in time: superposition of load increments.
// Checks: Terzaghi (1925) for an instant load, Olson (1977) for a linear ramp, the Cc/Cr law
// (domain §3, Terzaghi & Peck) for the final and rebound, Hansbo (1981) + Carrillo (1942) with drains.
import { describe, expect, it } from 'vitest'
import { degreeOfConsolidation } from '../../shared/geotech/consolidation'
import { combinedDegree, radialDegree } from '../../shared/geotech/radial-consolidation'
import { primaryCompression } from '../../shared/geotech/settlement'
import {
  computeStaged, loadFraction, RAMP_STEPS, scheduleIncrements, stressForVoidRatioChange, timeToFraction, unitDegree,
  type StagedSublayer, type StagedUnit,
} from '../../shared/settlement-run/staged'
import { logSpace } from '../../shared/settlement-run/time-rate'

/** A 10 m clay layer cut into 20 sublayers, double drained (Hdr = 5 m), cv = 2 m²/yr. */
function clay(opts: { s0?: (z: number) => number, sp?: (z: number, s0: number) => number, cc?: number, cr?: number } = {}): { sublayers: StagedSublayer[], units: StagedUnit[] } {
  const s0 = opts.s0 ?? (z => 20 + 6 * z)
  const sp = opts.sp ?? ((_z, s) => s)
  const sublayers = Array.from({ length: 20 }, (_, i) => {
    const depth = 0.25 + 0.5 * i
    const e = s0(depth)
    return { depth, thickness: 0.5, effectiveStress: e, preconsolidation: sp(depth, e), cc: opts.cc ?? 0.8, cr: opts.cr ?? 0.08, e0: 2, unit: 0 }
  })
  return { sublayers, units: [{ cv: 2, hdr: 5 }] }
}
const scale = 25 / 2 // Hdr²/cv, years: Tv = t / scale

/** Olson (1977), linear ramp to the full load at Tc; U relative to the final settlement (recalled from memory, checked: Tc → 0 gives Terzaghi, the two branches meet at Tc). */
function olson(T: number, Tc: number): number {
  let sum = 0
  for (let m = 0; m < 200; m++) {
    const M = (Math.PI * (2 * m + 1)) / 2
    const M2 = M * M
    sum += T <= Tc ? (1 - Math.exp(-M2 * T)) / (M2 * M2) : (Math.exp(-M2 * (T - Tc)) - Math.exp(-M2 * T)) / (M2 * M2)
  }
  return T <= Tc ? (T / Tc) * (1 - (2 / T) * sum) : 1 - (2 / Tc) * sum
}

describe('schedules', () => {
  it('fractions in place over time: two stages and a removal', () => {
    const s = { stages: [{ start: 0, duration: 0.2, fraction: 0.5 }, { start: 0.4, duration: 0, fraction: 0.5 }], removeAt: 0.75 }
    expect(loadFraction(s, 0.1)).toBeCloseTo(0.25, 12)
    expect(loadFraction(s, 0.3)).toBeCloseTo(0.5, 12)
    expect(loadFraction(s, 0.4)).toBeCloseTo(1, 12)
    expect(loadFraction(s, 0.75)).toBe(0)
    expect(loadFraction({}, 0)).toBe(1)
  })
  it('a ramp is cut into increments of at most 1 % of its duration', () => {
    const inc = scheduleIncrements({ stages: [{ start: 1, duration: 2, fraction: 1 }] })
    expect(inc).toHaveLength(RAMP_STEPS)
    expect(RAMP_STEPS).toBeGreaterThanOrEqual(100)
    expect(inc.reduce((a, b) => a + b.fraction, 0)).toBeCloseTo(1, 12)
    expect(inc[1]!.time - inc[0]!.time).toBeLessThanOrEqual(0.02 + 1e-12)
  })
  it('the stress reached inverts the Cc/Cr law (OC, crossing σ\'p, NC, and rebound)', () => {
    for (const [s0, sp, sf] of [[50, 80, 70], [50, 80, 140], [50, 50, 90], [90, 120, 60]] as const) {
      const de = (cc: number, cr: number) => primaryCompression(cc, cr, 0, s0, sp, sf, 1)
      expect(stressForVoidRatioChange(0.8, 0.08, s0, sp, de(0.8, 0.08))).toBeCloseTo(sf, 9)
    }
  })
})

describe('instant load: Terzaghi (1925)', () => {
  it('one stage at time 0 gives S(t) = U(Tv)·S, S from the Cc/Cr law per sublayer', () => {
    const { sublayers, units } = clay({ sp: (_z, s) => s + 25 })
    const r = computeStaged({ sublayers, units, loads: [{ stressAt: () => 60 }] })
    const want = sublayers.reduce((a, s) => a + primaryCompression(s.cc, s.cr, s.e0, s.effectiveStress, s.preconsolidation, s.effectiveStress + 60, s.thickness), 0)
    expect(r.final).toBeCloseTo(want, 12)
    for (const t of [0.5, 2, 5, 20]) expect(r.settlementAt(t) / r.final).toBeCloseTo(degreeOfConsolidation(t / scale), 12)
    // U = 50 % at Tv = 0.197, 90 % at Tv = 0.848 (Terzaghi 1925; Das, U–Tv table).
    const grid = logSpace(1e-3, 100, 200)
    expect(timeToFraction(r, 0.5, grid)! / scale).toBeCloseTo(0.197, 3)
    expect(timeToFraction(r, 0.9, grid)! / scale).toBeCloseTo(0.848, 3)
  })
  it('a zero-duration stage later in time is the same curve shifted', () => {
    const { sublayers, units } = clay()
    const a = computeStaged({ sublayers, units, loads: [{ stressAt: () => 40 }] })
    const b = computeStaged({ sublayers, units, loads: [{ stressAt: () => 40, stages: [{ start: 1, duration: 0, fraction: 1 }] }] })
    expect(b.settlementAt(0.9)).toBe(0)
    expect(b.settlementAt(4)).toBeCloseTo(a.settlementAt(3), 12)
  })
  it('two instant stages at once add up to one: the state (σ\'v, σ\'p) is carried forward, OC crossing σ\'p', () => {
    const { sublayers, units } = clay({ sp: (_z, s) => s + 30 })
    const one = computeStaged({ sublayers, units, loads: [{ stressAt: () => 80 }] })
    const two = computeStaged({ sublayers, units, loads: [{ stressAt: () => 80, stages: [{ start: 0, duration: 0, fraction: 0.25 }, { start: 0, duration: 0, fraction: 0.75 }] }] })
    expect(two.final).toBeCloseTo(one.final, 12)
    const staged = computeStaged({ sublayers, units, loads: [{ stressAt: () => 80, stages: [{ start: 0, duration: 0, fraction: 0.25 }, { start: 3, duration: 0, fraction: 0.75 }] }] })
    expect(staged.final).toBeCloseTo(one.final, 12)
  })
})

describe('linear ramp: Olson (1977)', () => {
  it('a single layer on one compression line (NC, Δσ/σ\'v0 = 0.1 %) follows Olson\'s U(T, Tc) within 0.002', () => {
    const { sublayers, units } = clay({ s0: () => 1000, sp: (_z, s) => s })
    for (const Tc of [0.2, 1]) {
      const r = computeStaged({ sublayers, units, loads: [{ stressAt: () => 1, stages: [{ start: 0, duration: Tc * scale, fraction: 1 }] }] })
      for (const T of [0.05, 0.1, 0.2, 0.4, 0.8, 1.5]) {
        expect(Math.abs(r.settlementAt(T * scale) / r.final - olson(T, Tc))).toBeLessThan(0.002)
      }
    }
  })
  it('Olson\'s form gives Terzaghi as Tc → 0 (a check of the reference itself)', () => {
    expect(olson(0.848, 1e-6)).toBeCloseTo(0.9, 3)
  })
})

describe('surcharge removal', () => {
  // Permanent 60 kPa, surcharge 30 kPa on top, NC clay.
  const { sublayers, units } = clay()
  const permanent = { stressAt: () => 60 }
  it('removed once fully consolidated: the rebound is Cr·log10(σ\'v,sur/σ\'v,perm)·h/(1 + e0) per sublayer and nothing remains', () => {
    const r = computeStaged({ sublayers, units, loads: [permanent, { stressAt: () => 30, removeAt: 400 }] })
    const rebound = sublayers.reduce((a, s) => a + (s.cr * Math.log10((s.effectiveStress + 90) / (s.effectiveStress + 60)) / (1 + s.e0)) * s.thickness, 0)
    expect(r.removal!.at).toBe(400)
    expect(r.removal!.rebound).toBeCloseTo(rebound, 9)
    expect(r.removal!.residual).toBeLessThan(1e-9)
    // Settlement just at removal = the full 90 kPa settlement; at the end less the rebound.
    const all = sublayers.reduce((a, s) => a + primaryCompression(s.cc, s.cr, s.e0, s.effectiveStress, s.preconsolidation, s.effectiveStress + 90, s.thickness), 0)
    expect(r.settlementAt(400)).toBeCloseTo(all, 9)
    expect(r.final).toBeCloseTo(all - rebound, 9)
  })
  it('removed at once: the permanent load alone (no rebound), residual = its whole settlement', () => {
    const r = computeStaged({ sublayers, units, loads: [permanent, { stressAt: () => 30, removeAt: 1e-9 }] })
    const alone = computeStaged({ sublayers, units, loads: [permanent] })
    expect(r.final).toBeCloseTo(alone.final, 6)
    expect(r.removal!.rebound).toBeLessThan(1e-6)
    // What settled in 1e-9 years (U ≈ 1e-5) is no longer to come.
    expect(r.removal!.residual).toBeCloseTo(alone.final, 4)
  })
  it('removed early (U ≈ 55 %): every sublayer is still short of the permanent load\'s stress, no rebound', () => {
    const r = computeStaged({ sublayers, units, loads: [permanent, { stressAt: () => 30, removeAt: 3 }] })
    expect(r.removal!.rebound).toBe(0)
    expect(r.removal!.residual).toBeGreaterThan(0)
    expect(r.final).toBeCloseTo(r.settlementAt(3) + r.removal!.residual, 12)
  })
  it('removed at U ≈ 80 %: the shallow sublayers still compress, the deep ones rebound; final = reached + residual − rebound', () => {
    // Hand check of the split: the stress reached passes σ'v0 + 60 kPa where U > log10((σ'v0+60)/σ'v0)/log10((σ'v0+90)/σ'v0), 0.81 at the top and 0.74 at the base.
    const r = computeStaged({ sublayers, units, loads: [permanent, { stressAt: () => 30, removeAt: 7 }] })
    const alone = computeStaged({ sublayers, units, loads: [permanent] })
    const atRemoval = r.settlementAt(7)
    expect(r.final).toBeCloseTo(atRemoval + r.removal!.residual - r.removal!.rebound, 12)
    expect(r.removal!.residual).toBeGreaterThan(0)
    expect(r.removal!.rebound).toBeGreaterThan(0)
    // A sublayer that went past the permanent load's stress keeps more than that load alone would give (rebound along Cr only).
    expect(r.final).toBeGreaterThan(alone.final * 0.999)
    expect(r.settlementAt(1000)).toBeCloseTo(r.final, 9)
  })
})

describe('drains: Hansbo (1981) radial, combined by Carrillo (1942)', () => {
  it('a drained unit consolidates by U = 1 − (1 − Uv)(1 − Ur); without drains by Uv', () => {
    const unit: StagedUnit = { cv: 2, hdr: 5, drains: { ch: 2, influenceDiameter: 1.575, mu: 3.3 } }
    const t = 0.5
    const want = combinedDegree(degreeOfConsolidation(t / scale), radialDegree((2 * t) / (1.575 * 1.575), 3.3))
    expect(unitDegree(unit, t)).toBeCloseTo(want, 12)
    expect(unitDegree(unit, t, false)).toBeCloseTo(degreeOfConsolidation(t / scale), 12)
    const { sublayers } = clay()
    const drained = computeStaged({ sublayers, units: [unit], loads: [{ stressAt: () => 60 }] })
    const plain = computeStaged({ sublayers, units: [unit], loads: [{ stressAt: () => 60 }], useDrains: false })
    expect(drained.final).toBe(plain.final)
    expect(drained.settlementAt(t) / drained.final).toBeCloseTo(want, 12)
    const grid = logSpace(1e-3, 100, 200)
    expect(timeToFraction(drained, 0.9, grid)!).toBeLessThan(timeToFraction(plain, 0.9, grid)! / 5)
  })
})
