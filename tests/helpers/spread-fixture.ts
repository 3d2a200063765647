import * as ss from 'simple-statistics'
import type { RunPointProbabilistic, RunProbabilisticSetup } from '../../shared/types/settlement-runs'

/**
 * A probabilistic point result whose settlement is exactly lognormal (the shape a single normally
 * consolidated layer with only Cc scattered gives): the quantiles, histogram and exceedance curve all
 * follow from the median and the COV, so tests can compare what the pages read with closed forms.
 * Lognormal with median m and σ = √ln(1 + COV²): Φ from simple-statistics' error function.
 */
export function normalCdf(z: number): number {
  return 0.5 * (1 + ss.errorFunction(z / Math.SQRT2))
}

export function lognormalSigma(cov: number): number {
  return Math.sqrt(Math.log(1 + cov * cov))
}

/** P(S > s) of a lognormal settlement. */
export function lognormalExceedance(s: number, median: number, cov: number): number {
  return 1 - normalCdf(Math.log(s / median) / lognormalSigma(cov))
}

/** The settlement with `p` of the realisations below it. */
export function lognormalQuantile(p: number, median: number, cov: number): number {
  return median * Math.exp(ss.probit(p) * lognormalSigma(cov))
}

export function lognormalSpread(o: { median: number, cov: number, realizations?: number, bins?: number, curvePoints?: number }): RunPointProbabilistic {
  const n = o.realizations ?? 5000
  const bins = o.bins ?? 20
  const sigma = lognormalSigma(o.cov)
  const q = (p: number) => lognormalQuantile(p, o.median, o.cov)
  const lo = q(0.0005)
  const hi = q(0.9995)
  const edges = Array.from({ length: bins + 1 }, (_v, i) => lo + (hi - lo) * i / bins)
  const cdf = (s: number) => normalCdf(Math.log(s / o.median) / sigma)
  const counts = edges.slice(0, -1).map((e, i) => Math.round(n * (cdf(edges[i + 1] ?? e) - cdf(e))))
  const k = o.curvePoints ?? 41
  const settlement = Array.from({ length: k }, (_v, i) => lo + (hi - lo) * i / (k - 1))
  const mean = o.median * Math.exp(sigma * sigma / 2)
  return {
    realizations: n,
    mean,
    sd: mean * o.cov,
    quantiles: { p05: q(0.05), p10: q(0.1), p50: o.median, p90: q(0.9), p95: q(0.95) },
    deterministic: mean,
    histogram: { edges, counts },
    exceedanceCurve: { settlement, probability: settlement.map(s => 1 - cdf(s)) },
    t90: { mean: 3.1, sd: 1.2, quantiles: { p05: 1.5, p10: 1.8, p50: 2.9, p90: 4.7, p95: 5.4 } },
    sensitivity: [
      { stratum: 'GLA', variable: 'cc', rankCorrelation: 0.21 },
      { stratum: 'EST', variable: 'cc', rankCorrelation: 0.83 },
      { stratum: 'EST', variable: 'preconsolidation', rankCorrelation: -0.41 },
      { stratum: 'EST', variable: 'e0', rankCorrelation: -0.08 },
    ],
    warnings: [],
  }
}

/** The set-up such a run reports: the demo's three compressible strata, one COV assumed on two tests. */
export function spreadSetup(): RunProbabilisticSetup {
  return {
    realizations: 5000,
    seed: 1,
    ccE0Correlation: 0.5,
    limit: 0.5,
    fromData: true,
    strata: [
      { code: 'CRUST', name: 'Desiccated crust', variables: [{ variable: 'cc', cov: 0.3, source: 'default', n: 2 }] },
      { code: 'EST', name: 'Estuarine clay', variables: [
        { variable: 'cc', cov: 0.22, source: 'data', n: 9 },
        { variable: 'e0', cov: 0.08, source: 'data', n: 9 },
        { variable: 'preconsolidation', cov: 0, source: 'data', n: 14, trend: true },
      ] },
      { code: 'GLA', name: 'Older glacial clay', variables: [{ variable: 'cc', cov: 0.25, source: 'entered', n: 0, correlationLength: 2 }] },
    ],
    warnings: [],
    threads: 2,
    computeMs: 840,
  }
}
