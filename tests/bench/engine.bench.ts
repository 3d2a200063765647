// Engine speed against minimal hand-written loops of the same formulas, measured
// in one run (best of several interleaved repetitions). Run by `npm run bench`.
import { performance } from 'node:perf_hooks'
import { linearRegression } from 'simple-statistics'
import { cornerFactor } from '../../shared/geotech/loads'
import { computeSettlement } from '../../shared/geotech/settlement'
import { planStressIncrease, type PlanLoad } from '../../shared/geotech/plan-loads'
import { computeStressProfile, createStressEvaluator } from '../../shared/geotech/stress'
import type { RunLoad } from '../../shared/schemas/settlement-runs'
import { computeRun, resolveLoads } from '../../shared/settlement-run/compute'
import { toStressInput } from '../../shared/site-model/convert'
import { scenarioDefinition } from '../helpers/scenario-definition'
import { fitTrend } from '../../shared/geotech/trends'
import { runReportBench } from './report.bench'
import { monteCarloBench, runProbabilisticBench } from './probabilistic.bench'

export interface BenchRow { name: string, ours: number, baseline: number, ratio: number, goal: number, note?: string }

function best(fn: () => number, reps: number): { ms: number, sink: number } {
  let ms = Infinity
  let sink = 0
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now()
    sink += fn()
    ms = Math.min(ms, performance.now() - t0)
  }
  return { ms, sink }
}

function compare(name: string, goal: number, ours: () => number, baseline: () => number, reps = 15, note?: string): BenchRow {
  // Warm up both, then interleave so machine load affects both alike.
  ours(); baseline(); ours(); baseline()
  let o = Infinity
  let b = Infinity
  for (let r = 0; r < reps; r++) {
    o = Math.min(o, best(ours, 1).ms)
    b = Math.min(b, best(baseline, 1).ms)
  }
  return { name, ours: o, baseline: b, ratio: o / b, goal, note }
}

const GAMMA_W = 9.81

/** Settlement of one NC-with-POP layer in N sublayers: the engine against the bare formula loop. */
function settlementBench(n: number): BenchRow[] {
  const thickness = 25
  const gsat = 16
  const cc = 0.85
  const cr = 0.09
  const e0 = 2.1
  const pop = 25
  const q = 120
  const input = {
    layers: [{ name: 'Estuarine clay', thickness, unitWeight: gsat, unitWeightSaturated: gsat, compressible: true, cc, cr, e0, preconsolidation: { type: 'pop' as const, value: pop } }],
    groundwater: { waterTableDepth: 0 },
    load: { type: 'uniform' as const, pressure: q },
    sublayers: { count: n },
  }
  const bare = () => {
    const h = thickness / n
    const gEff = gsat - GAMMA_W
    let s = 0
    for (let i = 0; i < n; i++) {
      const z = (i + 0.5) * h
      const s0 = gEff * z
      const sp = s0 + pop
      const sf = s0 + q
      const de = sf <= sp ? cr * Math.log10(sf / s0) : cr * Math.log10(sp / s0) + cc * Math.log10(sf / sp)
      s += de / (1 + e0) * h
    }
    return s
  }
  const engineCore = () => computeSettlement(input, { convergence: false }).settlement
  const engineFull = () => computeSettlement(input).settlement
  const check = Math.abs(engineCore() - bare()) / bare()
  if (check > 1e-9) throw new Error(`settlement bench: engine and bare loop disagree (${check})`)
  return [
    compare(`settlement, ${n.toLocaleString('en')} sublayers (core)`, 2, engineCore, bare),
    compare(`settlement, ${n.toLocaleString('en')} sublayers + convergence check`, 2, engineFull, bare, 10, 'the convergence report evaluates 2n more sublayers: 3n in all'),
  ]
}

/** σv, u, σ'v0 at N depths through a 5-layer profile with a water table. */
function stressBench(n: number): BenchRow {
  const layers = [
    { name: 'Made ground', thickness: 1.2, unitWeight: 19, unitWeightSaturated: 20 },
    { name: 'Crust', thickness: 2.2, unitWeight: 18, unitWeightSaturated: 18.5 },
    { name: 'Estuarine clay', thickness: 11.6, unitWeight: 16, unitWeightSaturated: 16 },
    { name: 'Glacial clay', thickness: 6.5, unitWeight: 20.5, unitWeightSaturated: 20.5 },
    { name: 'Sand', thickness: 8.5, unitWeight: 20, unitWeightSaturated: 20 },
  ]
  const wt = 1.6
  const depths = Array.from({ length: n }, (_, i) => (30 * (i + 0.5)) / n)
  const input = { layers, groundwater: { waterTableDepth: wt }, depths }
  const bare = () => {
    // Walk the sorted depths and the layers together (the same formulas, no breakpoints),
    // building the same output rows the engine returns.
    const out: { depth: number, layer: string, totalStress: number, porePressure: number, effectiveStress: number }[] = []
    let li = 0
    let top = 0
    let sigmaTop = 0
    for (let i = 0; i < n; i++) {
      const z = depths[i]!
      while (z > top + layers[li]!.thickness && li < layers.length - 1) {
        const L = layers[li]!
        const b = top + L.thickness
        const dry = Math.max(0, Math.min(b, wt) - top)
        sigmaTop += dry * L.unitWeight + (L.thickness - dry) * L.unitWeightSaturated
        top = b
        li++
      }
      const L = layers[li]!
      const dry = Math.max(0, Math.min(z, wt) - top)
      const sv = sigmaTop + dry * L.unitWeight + (z - top - dry) * L.unitWeightSaturated
      const u = z > wt ? GAMMA_W * (z - wt) : 0
      out.push({ depth: z, layer: L.name, totalStress: sv, porePressure: u, effectiveStress: sv - u })
    }
    return out[out.length - 1]!.effectiveStress
  }
  const ours = () => {
    const r = computeStressProfile(input)
    return r.points[r.points.length - 1]!.effectiveStress
  }
  return compare(`stress profile, ${n.toLocaleString('en')} depths`, 2, ours, bare, 10)
}

/** Linear σ'p trend on N points against simple-statistics' linear regression. */
function trendBench(n: number): BenchRow {
  let seed = 417
  const uniform = () => {
    seed = (seed * 16807) % 2147483647 // Park & Miller (1988) minimal standard generator
    return seed / 2147483647
  }
  const pts = Array.from({ length: n }, (_, i) => {
    const depth = 1 + (20 * i) / n
    return { depth, preconsolidation: 40 + 6 * depth + 10 * (uniform() - 0.5) }
  })
  const data = pts.map(p => [p.depth, p.preconsolidation])
  return compare(`trend fit (linear), ${n.toLocaleString('en')} points`, 2, () => fitTrend(pts, { model: 'linear' }).parameters.gradient!, () => linearRegression(data).m, 15, 'baseline: simple-statistics linearRegression')
}

/**
 * Δσz under plan loads on a settlement grid: 41 × 41 points × 100 depths per load, set-up per
 * point included. Baseline: a bare loop of Newmark's (1935) corner formula (the engine's own
 * `cornerFactor`) for a rectangle of the same footprint at the same points and depths (the cheapest
 * exact area formula).
 */
function planLoadBench(): BenchRow[] {
  const side = 41
  const depths = Array.from({ length: 100 }, (_, i) => 0.125 + 0.25 * i)
  const points: [number, number][] = []
  for (let i = 0; i < side; i++) for (let j = 0; j < side; j++) points.push([-40 + 2 * i, -40 + 2 * j])
  const evals = points.length * depths.length
  const signed = (dx: number, dy: number, z: number) => Math.sign(dx) * Math.sign(dy) * cornerFactor(Math.abs(dx), Math.abs(dy), z)
  const bareRectangle = (hx: number, hy: number, q: number) => () => {
    let s = 0
    for (const [x, y] of points) {
      for (const z of depths) s += q * (signed(hx - x, hy - y, z) - signed(-hx - x, hy - y, z) - signed(hx - x, -hy - y, z) + signed(-hx - x, -hy - y, z))
    }
    return s
  }
  const engine = (load: PlanLoad) => () => {
    let s = 0
    for (const [x, y] of points) {
      const f = planStressIncrease([load], x, y)
      for (const z of depths) s += f(z)
    }
    return s
  }
  // Goals: the rectangle is the same formula (2×); the embankment sums 12 edges against the
  // baseline's 4 corners (5×); the circle adds an angular rule set up per point (4×).
  const rows: [string, PlanLoad, number, number, number][] = [
    ['rectangle 20 m × 30 m, rotated 30°', { type: 'rectangle', x: 0, y: 0, width: 20, length: 30, rotation: 30, pressure: 50 }, 10, 15, 2],
    ['embankment crest 10 m × 40 m, 3 m high at 2:1, rotated 20°', { type: 'embankment', x: 0, y: 0, crestWidth: 10, crestLength: 40, height: 3, sideSlope: 2, unitWeight: 20, rotation: 20 }, 11, 26, 5],
    ['circle radius 15 m', { type: 'circle', x: 0, y: 0, radius: 15, pressure: 50 }, 15, 15, 4],
  ]
  return rows.map(([label, load, hx, hy, goal]) => {
    const row = compare(`Δσz under a plan load, ${label}: ${side}×${side} points × ${depths.length} depths`, goal, engine(load), bareRectangle(hx, hy, 50), 7)
    row.note = `${((row.ours * 1000) / evals).toFixed(2)} µs per depth, point set-up included; baseline a bare Newmark rectangle loop`
    return row
  })
}

/**
 * A settlement run's grid: 41 × 41 points under an embankment and two rectangles on the demo
 * ground model, 102 sublayers a point (0.2 m), against a bare loop of the same Δσ (the plan-load
 * superposition) and the same NC / OC / OC-NC formulas over hand-set σ'v0, σ'p, Cc, Cr, e0.
 * Target besides the ratio: the whole grid ≤ 1 s.
 */
function runGridBench(): BenchRow {
  const definition = scenarioDefinition()
  const loads: RunLoad[] = [
    { type: 'embankment', x: 0, y: 0, crestWidth: 40, crestLength: 60, height: 3, sideSlope: 2, unitWeight: 20, rotation: 0 },
    { type: 'rectangle', x: 40, y: 40, width: 20, length: 20, rotation: 0, pressure: 50 },
    { type: 'rectangle', x: -40, y: -40, width: 20, length: 20, rotation: 0, pressure: 50 },
  ]
  // Footprints span −50…50 m both ways: 2.5 m spacing gives 41 × 41.
  const grid = { spacing: 2.5, margin: 0 }
  const options = { maxSublayerThickness: 0.2, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 }
  const ours = () => {
    const g = computeRun({ definition, loads, points: [], grid, options }).results.grid!
    if (g.xs.length !== 41 || g.ys.length !== 41) throw new Error('run grid bench: expected 41 × 41')
    return g.settlement[20]![20]!
  }
  const bare = () => {
    // The demo's compressible strata (tests/helpers/scenario-definition.ts): top, bottom, Cc, Cr, e0, σ'p(z, σ'v0).
    const strata = [
      { top: 3.4 - 2.2, bottom: 3.4, cc: 0.35, cr: 0.04, e0: 1.1, sp: (z: number) => 210 + (115 / 2.2) * 1.2 - (115 / 2.2) * z },
      { top: 3.4, bottom: 15, cc: 0.85, cr: 0.09, e0: 2.1, sp: (_z: number, s0: number) => s0 + 25 },
      { top: 15, bottom: 21.5, cc: 0.22, cr: 0.03, e0: 0.65, sp: (_z: number, s0: number) => 2.4 * s0 },
    ]
    const ev = createStressEvaluator(toStressInput(definition))
    const z: number[] = []
    const s0: number[] = []
    const sp: number[] = []
    const cc: number[] = []
    const cr: number[] = []
    const f: number[] = []
    for (const st of strata) {
      const n = Math.ceil((st.bottom - st.top) / 0.2 - 1e-9)
      const h = (st.bottom - st.top) / n
      for (let i = 0; i < n; i++) {
        const zm = st.top + (i + 0.5) * h
        const e = ev(zm).effectiveStress
        z.push(zm); s0.push(e); sp.push(Math.max(e, st.sp(zm, e))); cc.push(st.cc); cr.push(st.cr); f.push(h / (1 + st.e0))
      }
    }
    const planLoads = resolveLoads(loads)
    let centre = 0
    for (let j = 0; j <= 40; j++) {
      for (let i = 0; i <= 40; i++) {
        const loadAt = planStressIncrease(planLoads, -50 + 2.5 * i, -50 + 2.5 * j)
        let s = 0
        for (let k = 0; k < z.length; k++) {
          const a = s0[k]!
          const p = sp[k]!
          const b = a + loadAt(z[k]!)
          const de = b < a ? cr[k]! * Math.log10(b / a) : p <= a ? cc[k]! * Math.log10(b / a) : b <= p ? cr[k]! * Math.log10(b / a) : cr[k]! * Math.log10(p / a) + cc[k]! * Math.log10(b / p)
          s += de * f[k]!
        }
        if (i === 20 && j === 20) centre = s
      }
    }
    return centre
  }
  const check = Math.abs(ours() - bare()) / bare()
  if (check > 1e-9) throw new Error(`run grid bench: run and bare loop disagree (${check})`)
  return compare('settlement run grid, 41 × 41 points × 102 sublayers, embankment + 2 rectangles', 2, ours, bare, 7, 'target also: the grid ≤ 1 s')
}

/**
 * A treated named point: the demo yard's 6 m embankment in two lifts, a 1.5 m surcharge taken off
 * at 9 months and 1.5 m triangular drains through the estuarine clay (the staged engine: about
 * 300 load increments, with and without drains), against the same point with the whole load
 * placed at once and no drains (the plain engine). Goal: a treated point ≤ 100× a plain one
 * (its curve superposes some 300 increments, twice: with and without the drains).
 */
function runStagedBench(): BenchRow {
  const definition = scenarioDefinition()
  const yard = { x: 0, y: 0, crestWidth: 96, crestLength: 56, sideSlope: 2, unitWeight: 20, rotation: 0 }
  const staged: RunLoad[] = [
    { type: 'embankment', ...yard, height: 6, stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }] },
    { type: 'embankment', ...yard, crestWidth: 90, crestLength: 50, height: 1.5, stages: [{ start: 0.35, duration: 0.05, fraction: 1 }], removeAt: 0.75 },
  ]
  const plain: RunLoad[] = [{ type: 'embankment', ...yard, height: 6 }]
  const points = [{ label: 'Centre', x: 0, y: 0 }]
  const options = { maxSublayerThickness: 0.25, years: [0.25, 0.5, 0.75, 1, 5, 20], designLife: 50, angularDistortionLimit: 1 / 500 }
  const drains = { strata: ['EST'], pattern: 'triangular' as const, spacing: 1.5, diameter: 0.052, smearRatio: 3, permeabilityRatio: 3, chRatio: 1 }
  const ours = () => computeRun({ definition, loads: staged, points, grid: null, options: { ...options, drains } }).results.points[0]!.t90!
  const bare = () => computeRun({ definition, loads: plain, points, grid: null, options }).results.points[0]!.t90!
  return compare('settlement run, one treated point (two lifts, surcharge off, drains) vs the same point loaded at once', 100, ours, bare, 5, 'baseline: the plain engine (computeSettlement) at the same point')
}

/** Each benchmark runs in its own process (tests/bench/one.ts). */
export const BENCHES: Record<string, () => BenchRow[] | Promise<BenchRow[]>> = {
  settlement: () => settlementBench(100_000),
  stress: () => [stressBench(100_000)],
  trend: () => [trendBench(50_000)],
  planLoads: () => planLoadBench(),
  runGrid: () => [runGridBench()],
  runStaged: () => [runStagedBench()],
  runReport: async () => [await runReportBench()],
  monteCarlo: () => [monteCarloBench()],
  runProbabilistic: () => [runProbabilisticBench()],
}
