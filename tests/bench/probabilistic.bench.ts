// Monte Carlo settlement speed: the engine (shared/probabilistic/monte-carlo.ts) against a bare loop
// of the same formulas — lognormal draws (Box–Muller), the NC / OC / OC-NC law per sublayer, t90
// by bisection over the consolidation units, one sort for the quantiles. Run by `npm run bench`.
import { performance } from 'node:perf_hooks'
import { computeSettlement, type SettlementInput } from '../../shared/geotech/settlement'
import { MONTE_CARLO_CHUNK, planMonteCarlo, runMonteCarlo, simulateChunks, type MonteCarloOptions } from '../../shared/probabilistic/monte-carlo'
import { RunProbabilisticSchema } from '../../shared/schemas/settlement-runs'
import type { RunComputeInput } from '../../shared/settlement-run/compute'
import { pointChunks, resolveScatter, runMonteCarloOptions, runSettlementInputAt } from '../../shared/settlement-run/probabilistic'
import { scenarioDefinition } from '../helpers/scenario-definition'
import type { BenchRow } from './engine.bench'

const REALIZATIONS = 10_000

/** Four compressible strata of 50 sublayers each (200 in all) under a 100 kPa fill. */
export function monteCarloProfile(): SettlementInput {
  const clay = (name: string, cc: number, cr: number, e0: number, pop: number, cv: number) => ({ name, thickness: 5, unitWeight: 16.5, unitWeightSaturated: 16.5, compressible: true, cc, cr, e0, preconsolidation: { type: 'pop' as const, value: pop }, cv })
  return {
    layers: [
      { name: 'Fill', thickness: 1, unitWeight: 19, unitWeightSaturated: 20, compressible: false },
      clay('Upper clay', 0.6, 0.07, 1.6, 30, 1.5),
      clay('Soft clay', 0.85, 0.09, 2.1, 20, 1.2),
      clay('Silty clay', 0.4, 0.05, 1.2, 40, 3),
      clay('Lower clay', 0.3, 0.04, 0.9, 60, 5),
    ],
    groundwater: { waterTableDepth: 1 },
    load: { type: 'uniform', pressure: 100 },
    sublayers: { count: 50 },
  }
}

export function monteCarloOptions(realizations = REALIZATIONS): MonteCarloOptions {
  const all = { cc: { cov: 0.3 }, cr: { cov: 0.3 }, e0: { cov: 0.1 }, cv: { cov: 0.5 }, preconsolidation: { cov: 0.2 } }
  return { realizations, seed: 1, strata: { 'Upper clay': all, 'Soft clay': all, 'Silty clay': all, 'Lower clay': all } }
}

function bestOf(fn: () => number, reps: number): number {
  let ms = Infinity
  for (let i = 0; i < reps; i++) {
    const t0 = performance.now()
    fn()
    ms = Math.min(ms, performance.now() - t0)
  }
  return ms
}

/** Terzaghi's U(Tv), the series written out (Terzaghi 1925). */
function degree(tv: number): number {
  if (tv < 1e-4) return Math.sqrt((4 * tv) / Math.PI)
  let sum = 0
  for (let m = 0; ; m++) {
    const M = (Math.PI * (2 * m + 1)) / 2
    const term = (2 / (M * M)) * Math.exp(-M * M * tv)
    sum += term
    if (term < 1e-12) break
  }
  return 1 - sum
}

export function monteCarloBench(): BenchRow {
  const input = monteCarloProfile()
  const options = monteCarloOptions()
  const rows = computeSettlement(input, { convergence: false }).sublayers
  const n = rows.length
  if (n !== 200) throw new Error(`Monte Carlo bench: expected 200 sublayers, got ${n}`)
  const s0 = Float64Array.from(rows, r => r.effectiveStress)
  const sf = Float64Array.from(rows, r => r.finalEffectiveStress)
  const sp = Float64Array.from(rows, r => r.preconsolidation)
  const h = Float64Array.from(rows, r => r.thickness)
  const strata = input.layers.filter(l => l.compressible)
  const tv90 = 0.848
  const ours = () => runMonteCarlo(input, options).quantiles.p95
  const bare = () => {
    let x = 2463534242
    const uniform = () => {
      x ^= x << 13
      x ^= x >>> 17
      x ^= x << 5
      return (x >>> 0) / 4294967296
    }
    const normal = () => Math.sqrt(-2 * Math.log(1 - uniform())) * Math.cos(2 * Math.PI * uniform())
    const lognormal = (cov: number) => {
      const s = Math.sqrt(Math.log1p(cov * cov))
      return (z: number) => Math.exp(s * z - 0.5 * s * s)
    }
    const fcc = lognormal(0.3)
    const fe0 = lognormal(0.1)
    const fcv = lognormal(0.5)
    const fsp = lognormal(0.2)
    const settlement = new Float64Array(REALIZATIONS)
    const t90 = new Float64Array(REALIZATIONS)
    const layerS = new Float64Array(4)
    const cvs = new Float64Array(4)
    for (let r = 0; r < REALIZATIONS; r++) {
      let total = 0
      for (let j = 0; j < 4; j++) {
        const st = strata[j]!
        const zc = normal()
        const ze = 0.5 * zc + Math.sqrt(0.75) * normal()
        const cc = st.cc! * fcc(zc)
        const cr = st.cr! * fcc(normal())
        const e0 = st.e0! * fe0(ze)
        cvs[j] = st.cv! * fcv(normal())
        const k = fsp(normal())
        let s = 0
        for (let i = j * 50; i < j * 50 + 50; i++) {
          const a = s0[i]!
          const b = sf[i]!
          const p = Math.max(sp[i]! * k, a)
          const de = b < a ? cr * Math.log10(b / a) : p <= a ? cc * Math.log10(b / a) : b <= p ? cr * Math.log10(b / a) : cr * Math.log10(p / a) + cc * Math.log10(b / p)
          s += (de / (1 + e0)) * h[i]!
        }
        layerS[j] = s
        total += s
      }
      settlement[r] = total
      let lo = Infinity
      let hi = 0
      for (let j = 0; j < 4; j++) {
        const t = (tv90 * 2.5 * 2.5) / cvs[j]!
        lo = Math.min(lo, t)
        hi = Math.max(hi, t)
      }
      for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
        const mid = 0.5 * (lo + hi)
        let u = 0
        for (let j = 0; j < 4; j++) u += layerS[j]! * degree((cvs[j]! * mid) / (2.5 * 2.5))
        if (u / total < 0.9) lo = mid
        else hi = mid
      }
      t90[r] = 0.5 * (lo + hi)
    }
    settlement.sort()
    t90.sort()
    return settlement[Math.floor(0.95 * REALIZATIONS)]!
  }
  ours(); bare()
  let o = Infinity
  let b = Infinity
  for (let r = 0; r < 5; r++) {
    o = Math.min(o, bestOf(ours, 1))
    b = Math.min(b, bestOf(bare, 1))
  }
  return {
    name: `Monte Carlo settlement, ${REALIZATIONS.toLocaleString('en')} realisations × 200 sublayers, Cc, Cr, e0, cv, σ'p random in 4 strata, with t90 and sensitivity`,
    ours: o,
    baseline: b,
    ratio: o / b,
    goal: 2,
    note: `target also: ≤ 2000 ms on 2 cores — ${o <= 2000 ? 'met' : 'not met'}`,
  }
}

// `npx tsx tests/bench/probabilistic.bench.ts` prints the row alone.
if (process.argv[1]?.endsWith('probabilistic.bench.ts')) console.log(JSON.stringify(monteCarloBench()))

/**
 * A probabilistic settlement run's named point (shared/settlement-run/probabilistic.ts): the demo
 * yard embankment over the scenario's ground model at 0.1 m sublayers (about 200), 10,000
 * realisations with Cc, Cr, e0, cv and σ'p varying in every compressible stratum, drawn as the pool's
 * tasks do it (a plan per chunk, Δσ from the plan loads), against the same draws from one plan made
 * beforehand. Goal: the run's path ≤ 1.3× (its chunks re-plan; the threads share them out).
 */
export function runProbabilisticBench(): BenchRow {
  const input: RunComputeInput = {
    definition: scenarioDefinition(),
    loads: [{ type: 'embankment', x: 0, y: 0, crestWidth: 96, crestLength: 56, sideSlope: 2, height: 6, unitWeight: 20, rotation: 0 }],
    points: [{ label: 'Centre', x: 0, y: 0 }],
    grid: null,
    options: { maxSublayerThickness: 0.1, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 },
  }
  const all = { cc: { cov: 0.3 }, cr: { cov: 0.3 }, e0: { cov: 0.1 }, cv: { cov: 0.5 }, preconsolidation: { cov: 0.2 } }
  const p = RunProbabilisticSchema.parse({ realizations: REALIZATIONS, seed: 1, layers: { CRUST: all, EST: all, GLA: all } })
  const options = runMonteCarloOptions(p, resolveScatter(input.definition, p, null).variation)
  const chunks = Math.ceil(REALIZATIONS / MONTE_CARLO_CHUNK)
  const plan = planMonteCarlo(runSettlementInputAt(input, 0, 0), options)
  const ours = () => {
    let s = 0
    for (let c = 0; c < chunks; c++) s += pointChunks(input, options, 0, 0, c, c + 1).settlement[0]!
    return s
  }
  const bare = () => simulateChunks(plan, 0, chunks).settlement[0]!
  const o = bestOf(ours, 3)
  const b = bestOf(bare, 3)
  return { name: `probabilistic run, one named point: ${REALIZATIONS} realisations of ${plan.count} sublayers in chunk tasks vs one plan`, ours: o, baseline: b, ratio: o / b, goal: 1.3, note: 'baseline: the same draws from a plan made beforehand (one thread)' }
}
