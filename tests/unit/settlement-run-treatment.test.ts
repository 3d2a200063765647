// A treated settlement run on the demo ground model: construction stages, a surcharge taken off
// and vertical drains through the estuarine clay, against the plain run (Terzaghi 1925) and the
// drain formulas (Barron 1948 De; Hansbo 1981 μ).
import { describe, expect, it } from 'vitest'
import { hansboMu } from '../../shared/geotech/radial-consolidation'
import { RunDrainsSchema, type RunLoad, type RunOptions } from '../../shared/schemas/settlement-runs'
import { checkRunInput, computeRun, type RunComputeInput } from '../../shared/settlement-run/compute'
import { scenarioDefinition } from '../helpers/scenario-definition'

const OPTIONS: RunOptions = { maxSublayerThickness: 0.25, years: [0.25, 0.5, 1, 5, 10, 50], designLife: 50, angularDistortionLimit: 1 / 500 }
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b)
const drains = RunDrainsSchema.parse({ strata: ['EST'], pattern: 'triangular', spacing: 1.5 })

const yard = { x: 0, y: 0, crestWidth: 80, crestLength: 120, sideSlope: 2, unitWeight: 20, rotation: 0 }
const embankment: RunLoad = { type: 'embankment', ...yard, height: 3 }

function run(loads: RunLoad[], options: Partial<RunOptions> = {}, extra: Partial<RunComputeInput> = {}): RunComputeInput {
  return { definition: scenarioDefinition(), loads, points: [{ label: 'Centre', x: 0, y: 0 }, { label: 'Edge', x: 38, y: 0 }], grid: null, options: { ...OPTIONS, ...options }, ...extra }
}

describe('a treated run', () => {
  it('one instant stage at time 0 is the plain run: settlement, t50, t90 and time (Terzaghi 1925, the instant-load limit)', () => {
    const plain = computeRun(run([embankment])).results.points
    const staged = computeRun(run([{ ...embankment, stages: [{ start: 0, duration: 0, fraction: 1 }] }])).results.points
    staged.forEach((p, i) => {
      const q = plain[i]!
      expect(rel(p.settlement, q.settlement)).toBeLessThan(1e-12)
      expect(rel(p.t50!, q.t50!)).toBeLessThan(1e-6)
      expect(rel(p.t90!, q.t90!)).toBeLessThan(1e-6)
      p.time.forEach((t, k) => expect(rel(t.settlement, q.time[k]!.settlement)).toBeLessThan(1e-9))
      p.layers.forEach((l, k) => expect(l.settlement).toBeCloseTo(q.layers[k]!.settlement, 12))
      // Secondary after 95 % primary: the same end of primary, so the same figure.
      expect(rel(p.secondary!, q.secondary!)).toBeLessThan(1e-6)
      expect(p.rebound).toBeUndefined()
      expect(p.t90WithoutDrains).toBeUndefined()
      expect(p.curve!.surfaceLoad![0]).toBeCloseTo(p.surfaceStressIncrease, 9)
    })
  })

  it('drains through the estuarine clay: De = 1.05 s (Barron 1948), μ of Hansbo (1981), t90 far shorter; without them, the plain t90', () => {
    const plain = computeRun(run([embankment])).results.points[0]!
    const out = computeRun(run([embankment], { drains })).results
    const d = out.drains!
    expect(d.influenceDiameter).toBeCloseTo(1.575, 12)
    expect(d.mu).toBeCloseTo(hansboMu({ n: 1.575 / 0.052, smearRatio: 3, permeabilityRatio: 3 }), 12)
    expect(d.strata).toEqual([{ name: 'Estuarine clay', cv: 1.2, ch: 1.2, drainagePath: expect.closeTo(5.8, 9) }])
    const p = out.points[0]!
    expect(rel(p.settlement, plain.settlement)).toBeLessThan(1e-12)
    expect(rel(p.t90WithoutDrains!, plain.t90!)).toBeLessThan(1e-6)
    expect(p.t90!).toBeLessThan(plain.t90! / 5)
    expect(p.curve!.withoutDrains).toHaveLength(p.curve!.years.length)
    // Drained curve at or above the undrained one at every time.
    p.curve!.primary.forEach((s, i) => expect(s).toBeGreaterThanOrEqual(p.curve!.withoutDrains![i]! - 1e-12))
  })

  it('two stages, a 1.5 m surcharge removed at 0.75 yr and drains: rebound and residual reported, load drops on the curve', () => {
    const loads: RunLoad[] = [
      { ...embankment, stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }] },
      { type: 'embankment', ...yard, height: 1.5, stages: [{ start: 0.35, duration: 0.05, fraction: 1 }], removeAt: 0.75 },
    ]
    const out = computeRun(run(loads, { drains }))
    const p = out.results.points[0]!
    expect(p.removedAt).toBe(0.75)
    expect(p.rebound! + p.residualAfterRemoval!).toBeGreaterThan(0)
    const c = p.curve!
    const before = c.years.findIndex(t => t >= 0.75 * (1 - 1e-6))
    const at = c.years.indexOf(0.75)
    expect(c.surfaceLoad![before]).toBeCloseTo(90, 6)
    expect(c.surfaceLoad![at]).toBeCloseTo(60, 6)
    // The final primary is that of the loads left, path included: at least the plain 3 m run's.
    const plain = computeRun(run([embankment])).results.points[0]!
    expect(p.settlement).toBeGreaterThanOrEqual(plain.settlement * (1 - 1e-9))
    // Degree relative to the final under the permanent load; past removal it ends at 1.
    expect(p.time[p.time.length - 1]!.degree).toBeCloseTo(1, 3)
    expect(out.details[0]!.sublayers.length).toBeGreaterThan(0)
  })
})

describe('checkRunInput: schedules and drains', () => {
  const problem = (loads: RunLoad[], options: Partial<RunOptions> = {}) => checkRunInput({ ...run(loads, options), version: 1 })
  it('fractions that do not sum to 1', () => {
    const p = problem([{ ...embankment, stages: [{ start: 0, duration: 0, fraction: 0.5 }, { start: 1, duration: 0, fraction: 0.4 }] }])
    expect(p).toMatchObject({ code: 'stage-fractions', path: ['loads', 0, 'stages'] })
    expect(p!.message).toBe('The stages of load 1 add 90 % of the load; their fractions must sum to 100 %.')
  })
  it('a stage starting after the removal', () => {
    const p = problem([embankment, { ...embankment, stages: [{ start: 1, duration: 0, fraction: 1 }], removeAt: 0.75 }])
    expect(p).toMatchObject({ code: 'stage-after-removal', path: ['loads', 1, 'stages', 0, 'start'] })
    expect(p!.message).toBe('Stage 1 of load 2 starts at 1 years (12 months), after the load is removed at 0.75 years (9 months).')
  })
  it('a drain spacing not larger than the drain', () => {
    const p = problem([embankment], { drains: { ...drains, spacing: 0.3, diameter: 0.4 } })
    expect(p).toMatchObject({ code: 'drain-spacing-too-small' })
  })
  it('drains through a stratum that is not in the version', () => {
    const p = problem([embankment], { drains: { ...drains, strata: ['EST', 'PEAT'] } })
    expect(p).toMatchObject({ code: 'drain-stratum-unknown', path: ['options', 'drains', 'strata', 1] })
    expect(p!.message).toMatch(/^The drains pass through stratum PEAT, which is not in version 1\./)
  })
  it('a sound treated run passes', () => {
    expect(problem([{ ...embankment, stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }], removeAt: 2 }], { drains })).toBeNull()
  })
})

describe('checkRunInput: a treated run needs the time rate', () => {
  it('refuses a schedule on a version whose compressible stratum has no cv, and accepts the same run without one', () => {
    const def = scenarioDefinition()
    delete def.strata.find(s => s.code === 'GLA')!.compressibility!.cv
    const loads: RunLoad[] = [{ ...embankment, stages: [{ start: 0, duration: 0.2, fraction: 1 }] }]
    const p = checkRunInput({ ...run(loads), definition: def })
    expect(p).toMatchObject({ code: 'cv-missing', path: ['model'] })
    expect(p!.message).toMatch(/^Stratum GLA \(Older glacial clay\) has no cv in this version: /)
    expect(checkRunInput({ ...run([embankment]), definition: def })).toBeNull()
  })
})
