import { GeotechError } from '../geotech/errors'

/**
 * A 1-D random field along depth with exponential autocorrelation ρ(τ) = exp(−2|τ|/θ), θ the scale
 * of fluctuation (the vertical correlation length), averaged over each sublayer (Vanmarcke 1977;
 * Vanmarcke 1983, §5.2). The field is that of ln X (a lognormal parameter): its local averages are
 * jointly normal with the covariance below, drawn through the Cholesky factor of that matrix.
 */

/**
 * T²·γ(T) for the exponential correlation: the double integral of ρ over a square of side T,
 * θ²/2·(2|T|/θ − 1 + exp(−2|T|/θ)) (Vanmarcke 1977, variance function γ(T) of the Markov correlation).
 */
export function squaredVarianceIntegral(length: number, theta: number): number {
  const a = (2 * Math.abs(length)) / theta
  // For short lengths the closed form loses digits: its series a²/2 − a³/6 + a⁴/24 …, times θ²/2.
  if (a < 1e-4) return ((theta * theta) / 2) * (a * a / 2 - (a * a * a) / 6 + (a * a * a * a) / 24)
  return ((theta * theta) / 2) * (a - 1 + Math.exp(-a))
}

/** Variance function γ(T) of the exponential correlation: the variance of a local average over T, per unit point variance. */
export function varianceFunction(length: number, theta: number): number {
  if (length === 0) return 1
  return squaredVarianceIntegral(length, theta) / (length * length)
}

/**
 * Correlation matrix (unit point variance) of the averages of the field over the intervals
 * [top, bottom]: Cov = ½[G(d − a) + G(c − b) − G(c − a) − G(d − b)]/(T₁T₂) for [a, b] and [c, d],
 * G(T) = T²γ(T) (Vanmarcke 1977, covariance of local averages). The diagonal is γ(T).
 */
export function localAverageCovariance(tops: ArrayLike<number>, bottoms: ArrayLike<number>, theta: number): Float64Array {
  if (!(theta > 0) || !Number.isFinite(theta)) {
    throw new GeotechError('correlation-length-invalid', `A correlation length must be a positive number of metres (got ${String(theta)}).`)
  }
  const n = tops.length
  const c = new Float64Array(n * n)
  const G = (t: number) => squaredVarianceIntegral(t, theta)
  for (let i = 0; i < n; i++) {
    const a = tops[i]!
    const b = bottoms[i]!
    for (let j = 0; j <= i; j++) {
      const cc = tops[j]!
      const d = bottoms[j]!
      const v = i === j
        ? G(b - a) / ((b - a) * (b - a))
        : (0.5 * (G(d - a) + G(cc - b) - G(cc - a) - G(d - b))) / ((b - a) * (d - cc))
      c[i * n + j] = v
      c[j * n + i] = v
    }
  }
  return c
}

/**
 * Lower Cholesky factor L of a symmetric positive semi-definite matrix (L·Lᵀ = A; Golub & Van Loan
 * 2013, Algorithm 4.2.1), row-major. Pivots that round to zero or below (a singular matrix, e.g.
 * two sublayers far inside one correlation length) leave their column at zero.
 */
export function cholesky(a: Float64Array, n: number): Float64Array {
  const l = new Float64Array(n * n)
  for (let j = 0; j < n; j++) {
    let d = a[j * n + j]!
    for (let k = 0; k < j; k++) d -= l[j * n + k]! * l[j * n + k]!
    const pivot = d > 1e-12 * a[j * n + j]! ? Math.sqrt(d) : 0
    l[j * n + j] = pivot
    for (let i = j + 1; i < n; i++) {
      let s = a[i * n + j]!
      for (let k = 0; k < j; k++) s -= l[i * n + k]! * l[j * n + k]!
      l[i * n + j] = pivot > 0 ? s / pivot : 0
    }
  }
  return l
}

/** out = L·w for a lower-triangular row-major L. */
export function lowerTimes(l: Float64Array, n: number, w: ArrayLike<number>, out: Float64Array): void {
  for (let i = 0; i < n; i++) {
    let s = 0
    const row = i * n
    for (let k = 0; k <= i; k++) s += l[row + k]! * w[k]!
    out[i] = s
  }
}
