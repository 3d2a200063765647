// A settlement run on the demo ground model (tests/helpers/scenario-definition.ts): named points
// against the engine, the grid's kernel against the engine, symmetry, the time curve and progress.
import { describe, expect, it } from 'vitest'
import { computeSettlement } from '../../shared/geotech/settlement'
import { planStressIncrease } from '../../shared/geotech/plan-loads'
import { createStressEvaluator } from '../../shared/geotech/stress'
import type { RunLoad, RunOptions } from '../../shared/schemas/settlement-runs'
import { buildSettlementKernel, computeRun, describeConvergence, kernelSettlement, resolveLoads, type RunComputeInput } from '../../shared/settlement-run/compute'
import { toSettlementLayers, toStressInput } from '../../shared/site-model/convert'
import { scenarioDefinition } from '../helpers/scenario-definition'

const OPTIONS: RunOptions = { maxSublayerThickness: 0.25, years: [0.5, 1, 5, 10, 50], designLife: 50, angularDistortionLimit: 1 / 500 }
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b)

function run(loads: RunLoad[], extra: Partial<RunComputeInput> = {}): RunComputeInput {
  return { definition: scenarioDefinition(), loads, points: [], grid: null, options: OPTIONS, ...extra }
}

function engineLayers(maxThickness = 0.25) {
  const def = scenarioDefinition()
  const ev = createStressEvaluator(toStressInput(def))
  return { def, stress: toStressInput(def), layers: toSettlementLayers(def, z => ev(z).effectiveStress, { maxThickness }) }
}

const embankment: RunLoad = { type: 'embankment', x: 0, y: 0, crestWidth: 20, crestLength: 28, height: 3, sideSlope: 2, unitWeight: 20, rotation: 0 }

describe('computeRun on the demo ground model', () => {
  it('under a uniform fill a point settles as computeSettlement says (same sublayers, t50, t90, time, secondary)', () => {
    const out = computeRun(run([{ type: 'uniform', fill: { thickness: 2, unitWeight: 20 } }], { points: [{ label: 'A', x: 12, y: -5 }] }))
    const { stress, layers } = engineLayers()
    const r = computeSettlement({ ...stress, layers, load: { type: 'uniform', pressure: 40 }, sublayers: { maxThickness: 0.25 }, time: { years: OPTIONS.years }, designLife: 50 })
    const p = out.results.points[0]!
    expect(p.settlement).toBe(r.settlement)
    expect(p.convergence).toEqual(r.convergence)
    expect(p.t50).toBe(r.times!.t50)
    expect(p.t90).toBe(r.times!.t90)
    expect(p.time).toEqual(r.time)
    expect(p.secondary).toBe(r.secondary!.settlement)
    expect(p.surfaceStressIncrease).toBe(40)
    expect(out.details[0]!.sublayers).toEqual(r.sublayers)
    // By stratum: the strata in order, the slices summed, the rigid strata 0.
    expect(p.layers.map(l => l.name)).toEqual(['Made ground', 'Desiccated crust', 'Estuarine clay', 'Older glacial clay', 'Dense sand'])
    expect(p.layers[0]!.settlement).toBe(0)
    expect(p.layers[4]!.settlement).toBe(0)
    expect(rel(p.layers.reduce((a, l) => a + l.settlement, 0), p.settlement)).toBeLessThan(1e-12)
    expect(describeConvergence(p.convergence)).toMatch(/^Halving every sublayer changes the total by [\d.e-]+ %\.$/)
    expect(out.results.maximum).toEqual({ settlement: p.settlement, x: 12, y: -5, label: 'A' })
  })

  it('the grid kernel gives the engine\'s settlement (no convergence) at any plan point, to 1e-12', () => {
    const { stress, layers } = engineLayers(0.2)
    const base = { ...stress, layers, sublayers: { maxThickness: 0.2 } }
    const kernel = buildSettlementKernel(base)
    const loads = resolveLoads([embankment, { type: 'rectangle', x: 15, y: 10, width: 8, length: 6, rotation: 30, pressure: 60 }])
    for (const [x, y] of [[0, 0], [13, 9], [-20, 4], [40, 40]] as const) {
      const loadAt = planStressIncrease(loads, x, y)
      const want = computeSettlement({ ...base, load: { type: 'uniform', pressure: 0 }, stressIncrease: loadAt }, { convergence: false }).settlement
      const got = kernelSettlement(kernel, loadAt)
      expect(rel(got, want)).toBeLessThan(1e-12)
    }
    expect(kernel.count).toBe(11 + 58 + 33) // 2.2 m, 11.6 m, 6.5 m at ≤ 0.2 m
  })

  it('a centred embankment gives a grid symmetric about both axes, largest at the centre', () => {
    const out = computeRun(run([embankment], { grid: { spacing: 2, margin: 6 } }))
    const g = out.results.grid!
    const nx = g.xs.length
    const ny = g.ys.length
    expect(g.xs[0]).toBeCloseTo(-(embankment.crestWidth / 2 + 6 + 6), 9)
    expect(g.xs[(nx - 1) / 2]).toBeCloseTo(0, 9)
    expect(g.ys[(ny - 1) / 2]).toBeCloseTo(0, 9)
    for (let j = 0; j < ny; j++) {
      for (let i = 0; i < nx; i++) {
        const s = g.settlement[j]![i]!
        expect(rel(g.settlement[j]![nx - 1 - i]!, s)).toBeLessThan(1e-9)
        expect(rel(g.settlement[ny - 1 - j]![i]!, s)).toBeLessThan(1e-9)
      }
    }
    const centre = g.settlement[(ny - 1) / 2]![(nx - 1) / 2]!
    expect(out.results.maximum.settlement).toBe(centre)
    expect(out.results.maximum.label).toBeNull()
    // Neighbours differ most at the toe; the worst pair and the limit check follow from the values.
    expect(g.maxDifferential).toBeGreaterThan(0)
    expect(g.maxAngularDistortion).toBeCloseTo(g.worstAngularDistortion!.value, 15)
    expect(g.exceedsLimit).toBe(g.maxAngularDistortion > 1 / 500)
    expect(out.results.stats.sublayers).toBe(nx * ny * (9 + 47 + 26))
  })

  it('calls onProgress after the points and per grid row, rising to 1', () => {
    const calls: number[] = []
    const out = computeRun(run([embankment], { grid: { spacing: 4, margin: 0 }, points: [{ label: 'C', x: 0, y: 0 }] }), f => calls.push(f))
    const rows = out.results.grid!.ys.length
    expect(calls).toHaveLength(1 + rows + 1)
    for (let i = 1; i < calls.length; i++) expect(calls[i]!).toBeGreaterThanOrEqual(calls[i - 1]!)
    expect(calls.at(-1)).toBe(1)
    expect(calls.at(-2)).toBeCloseTo(1, 12)
  })

  it('the time curve rises monotonically to the final settlement; secondary starts after 95 % primary', () => {
    const out = computeRun(run([embankment], { points: [{ label: 'C', x: 0, y: 0 }] }))
    const p = out.results.points[0]!
    const c = p.curve!
    expect(c.years.length).toBeGreaterThan(50)
    for (let i = 1; i < c.years.length; i++) {
      expect(c.years[i]!).toBeGreaterThan(c.years[i - 1]!)
      expect(c.primary[i]!).toBeGreaterThanOrEqual(c.primary[i - 1]!)
      expect(c.total[i]!).toBeGreaterThanOrEqual(c.total[i - 1]!)
    }
    expect(c.primary[0]! / p.settlement).toBeLessThan(0.02)
    expect(rel(c.primary.at(-1)!, p.settlement)).toBeLessThan(1e-4)
    expect(c.years.at(-1)!).toBeGreaterThanOrEqual(OPTIONS.designLife)
    c.total.forEach((t, i) => expect(t).toBeCloseTo(c.primary[i]! + c.secondary[i]!, 15))
    // Only the estuarine clay has Cα: its secondary starts at its 95 % primary, t = Tv95·Hdr²/cv = 1.129·5.8²/1.2 (Tv95 ≈ 1.129, Terzaghi 1925; recalled).
    const tp = (1.129 * 5.8 * 5.8) / 1.2
    c.years.forEach((t, i) => {
      if (t < 0.99 * tp) expect(c.secondary[i]).toBe(0)
      if (t > 1.01 * tp) expect(c.secondary[i]!).toBeGreaterThan(0)
    })
    // The per-stratum rows add up to the primary curve; each ends at its stratum's settlement.
    expect(c.layers.map(l => l.name)).toEqual(['Desiccated crust', 'Estuarine clay', 'Older glacial clay'])
    c.primary.forEach((s, i) => expect(c.layers.reduce((a, l) => a + l.settlement[i]!, 0)).toBeCloseTo(s, 12))
    const est = c.layers[1]!
    expect(rel(est.settlement.at(-1)!, p.layers[2]!.settlement)).toBeLessThan(1e-4)
    // The options' years: degree 0–1, rising, settlement = degree × final.
    for (const [i, t] of p.time.entries()) {
      expect(t.years).toBe(OPTIONS.years[i])
      expect(t.degree).toBeGreaterThan(0)
      expect(t.degree).toBeLessThan(1)
      expect(t.settlement).toBeCloseTo(t.degree * p.settlement, 15)
      if (i > 0) expect(t.degree).toBeGreaterThan(p.time[i - 1]!.degree)
    }
    // t90 is set by the 11.6 m estuarine clay draining both ways (decades), not by its slices.
    expect(p.t90!).toBeGreaterThan(15)
    expect(p.t50!).toBeLessThan(p.t90!)
  })

  it('hand check of one sublayer under a 60 kPa fill: the top estuarine-clay sublayer crosses σ\'p (OC-NC; Terzaghi & Peck 1967, domain §3)', () => {
    const out = computeRun(run([{ type: 'uniform', pressure: 60 }], { points: [{ label: 'A', x: 0, y: 0 }] }))
    const row = out.details[0]!.sublayers.find(r => r.layer === 'Estuarine clay')!
    // Estuarine clay 3.4–15.0 m, 47 sublayers of 11.6/47 m; the first at mid-depth 3.4 + 11.6/94.
    const h = 11.6 / 47
    const z = 3.4 + h / 2
    expect(row.depth).toBeCloseTo(z, 12)
    // σ'v0 by hand: made ground 1.2 × 19 = 22.8; crust 0.4 × 18 (to the water table at 1.6 m) + 1.8 × 18.5;
    // estuarine clay (z − 3.4) × 16; u = 9.81 (z − 1.6) (hydrostatic above 12 m).
    const s0 = 22.8 + 0.4 * 18 + 1.8 * 18.5 + (z - 3.4) * 16 - 9.81 * (z - 1.6)
    expect(row.effectiveStress).toBeCloseTo(s0, 9)
    const sp = s0 + 25 // POP 25 kPa
    const sf = s0 + 60
    expect(row.case).toBe('OC-NC')
    // Δe = Cr·log10(σ'p/σ'v0) + Cc·log10(σ'vf/σ'p); Δh = Δe/(1 + e0)·h.
    const de = 0.09 * Math.log10(sp / s0) + 0.85 * Math.log10(sf / sp)
    expect(row.voidRatioChange).toBeCloseTo(de, 12)
    expect(row.compression).toBeCloseTo((de / 3.1) * h, 12)
    // And an OC row: the glacial clay (OCR 2.4) stays below σ'p: Δe = Cr·log10(σ'vf/σ'v0).
    const gla = out.details[0]!.sublayers.find(r => r.layer === 'Older glacial clay')!
    expect(gla.case).toBe('OC')
    expect(gla.voidRatioChange).toBeCloseTo(0.03 * Math.log10((gla.effectiveStress + 60) / gla.effectiveStress), 12)
  })
})
