/**
 * Summaries of Monte Carlo samples: mean, standard deviation, quantiles, histogram, the probability
 * of exceeding a limit and Spearman's rank correlation. Written for typed arrays of many thousand
 * values; the unit tests check each against simple-statistics.
 */

export interface Quantiles {
  p05: number
  p10: number
  p50: number
  p90: number
  p95: number
}

export interface Histogram {
  /** k + 1 edges of k equal bins from the least to the greatest value. */
  edges: number[]
  /** Values in each bin [eᵢ, eᵢ₊₁), the last bin closed. */
  counts: number[]
}

export interface SampleSummary {
  mean: number
  /** Sample standard deviation (n − 1); 0 for one value. */
  sd: number
  quantiles: Quantiles
}

/** Arithmetic mean, summed about the first value (shifted data: equal values give that value exactly). */
export function sampleMean(x: ArrayLike<number>): number {
  if (x.length === 0) return Number.NaN
  const x0 = x[0]!
  let s = 0
  for (let i = 0; i < x.length; i++) s += x[i]! - x0
  return x0 + s / x.length
}

/** Sample standard deviation with n − 1 (two-pass, so no cancellation). */
export function sampleSd(x: ArrayLike<number>, mean = sampleMean(x)): number {
  if (x.length < 2) return 0
  let s = 0
  for (let i = 0; i < x.length; i++) {
    const d = x[i]! - mean
    s += d * d
  }
  return Math.sqrt(s / (x.length - 1))
}

/**
 * The p-quantile of sorted values by linear interpolation between order statistics at
 * h = (n − 1)·p (Hyndman & Fan 1996, definition 7).
 */
export function quantileOfSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length
  if (n === 0) return Number.NaN
  if (p <= 0) return sorted[0]!
  if (p >= 1) return sorted[n - 1]!
  const h = (n - 1) * p
  const lo = Math.floor(h)
  const hi = Math.ceil(h)
  if (lo === hi) return sorted[lo]!
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!)
}

/** Sorted copy of the finite values (NaN left out). */
export function sortedFinite(x: ArrayLike<number>): Float64Array {
  const out = new Float64Array(x.length)
  let k = 0
  for (let i = 0; i < x.length; i++) if (Number.isFinite(x[i]!)) out[k++] = x[i]!
  return out.subarray(0, k).sort()
}

/** Mean, sd and P5/P10/P50/P90/P95 of sorted values. */
export function summariseSorted(sorted: Float64Array): SampleSummary {
  const mean = sampleMean(sorted)
  return {
    mean,
    sd: sampleSd(sorted, mean),
    quantiles: {
      p05: quantileOfSorted(sorted, 0.05),
      p10: quantileOfSorted(sorted, 0.1),
      p50: quantileOfSorted(sorted, 0.5),
      p90: quantileOfSorted(sorted, 0.9),
      p95: quantileOfSorted(sorted, 0.95),
    },
  }
}

/** Bins for n values by the Rice rule, ⌈2·n^(1/3)⌉ (common practice), between 1 and 100. */
export function riceBins(n: number): number {
  return Math.min(100, Math.max(1, Math.ceil(2 * Math.cbrt(n))))
}

/**
 * Histogram of sorted values in `bins` equal bins from the least to the greatest value: the edges
 * are min + i·(max − min)/bins with the last edge the maximum; all values in one bin when they are
 * all equal.
 */
export function histogramOfSorted(sorted: Float64Array, bins = riceBins(sorted.length)): Histogram {
  const n = sorted.length
  if (n === 0) return { edges: [], counts: [] }
  const lo = sorted[0]!
  const hi = sorted[n - 1]!
  if (!(hi > lo)) return { edges: [lo, hi], counts: [n] }
  const step = (hi - lo) / bins
  const edges: number[] = [lo]
  for (let i = 1; i < bins; i++) edges.push(lo + step * i)
  edges.push(hi)
  const counts = new Array<number>(bins).fill(0)
  // Sorted values: walk the bins once. A value on an inner edge belongs to the bin above it.
  let b = 0
  for (let i = 0; i < n; i++) {
    const v = sorted[i]!
    while (b < bins - 1 && v >= edges[b + 1]!) b++
    counts[b]!++
  }
  return { edges, counts }
}

/** Share of the values strictly greater than `limit`. */
export function exceedanceProbability(x: ArrayLike<number>, limit: number): number {
  let k = 0
  let n = 0
  for (let i = 0; i < x.length; i++) {
    const v = x[i]!
    if (v !== v) continue
    n++
    if (v > limit) k++
  }
  return n === 0 ? Number.NaN : k / n
}

/**
 * Midranks (0-based) of finite values: ties share the average of the ranks they span. The values
 * are sorted once (a numeric typed-array sort) and each is placed by binary search: its first and
 * last positions among equal values give its midrank.
 */
export function midranks(x: ArrayLike<number>): Float64Array {
  const n = x.length
  const sorted = Float64Array.from(x).sort()
  const ranks = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    const v = x[i]!
    // First position with sorted ≥ v …
    let lo = 0
    let hi = n
    while (lo < hi) {
      const mid = (lo + hi) >>> 1
      if (sorted[mid]! < v) lo = mid + 1
      else hi = mid
    }
    // … and, when it has ties (rare in draws), the first position with sorted > v.
    let end = lo + 1
    if (end < n && sorted[end] === v) {
      hi = n
      while (end < hi) {
        const mid = (end + hi) >>> 1
        if (sorted[mid]! <= v) end = mid + 1
        else hi = mid
      }
    }
    ranks[i] = (lo + end - 1) / 2
  }
  return ranks
}

/** Pearson's product-moment correlation; NaN when either has no variance. */
export function pearson(x: ArrayLike<number>, y: ArrayLike<number>): number {
  const n = x.length
  const mx = sampleMean(x)
  const my = sampleMean(y)
  let sxy = 0
  let sxx = 0
  let syy = 0
  for (let i = 0; i < n; i++) {
    const dx = x[i]! - mx
    const dy = y[i]! - my
    sxy += dx * dy
    sxx += dx * dx
    syy += dy * dy
  }
  if (!(sxx > 0) || !(syy > 0)) return Number.NaN
  return sxy / Math.sqrt(sxx * syy)
}

/** Spearman's rank correlation: Pearson's correlation of the midranks (Spearman 1904). */
export function rankCorrelation(x: ArrayLike<number>, y: ArrayLike<number>): number {
  return pearson(midranks(x), midranks(y))
}
