import seedrandom from 'seedrandom'
import { GeotechError } from '../geotech/errors'

/**
 * Seeded random numbers for the Monte Carlo engine. Every stream is its own Alea generator
 * (Baagøe 2010, as `seedrandom` implements it) seeded by the run's seed and the stream's name,
 * so a variable's draws do not change when another variable is made random or left fixed.
 */

/** Uniform numbers in [0, 1) from the named stream of `seed`. */
export function uniformStream(seed: number | string, stream: string): () => number {
  return seedrandom.alea(`${seed}\u0000${stream}`)
}

/**
 * Standard normal numbers by the Box–Muller transform (Box & Muller 1958): two uniforms give two
 * independent normals, √(−2 ln u₁)·cos 2πu₂ and √(−2 ln u₁)·sin 2πu₂; the second is kept for the
 * next call. u₁ is taken as 1 − u so that it lies in (0, 1].
 */
export function normalStream(seed: number | string, stream: string): () => number {
  const uniform = uniformStream(seed, stream)
  let spare = Number.NaN
  return () => {
    if (spare === spare) {
      const z = spare
      spare = Number.NaN
      return z
    }
    const r = Math.sqrt(-2 * Math.log(1 - uniform()))
    const angle = 2 * Math.PI * uniform()
    spare = r * Math.sin(angle)
    return r * Math.cos(angle)
  }
}

/**
 * σ of ln X for a lognormal X with coefficient of variation V: σ² = ln(1 + V²)
 * (Aitchison & Brown 1957; any probability text). The mean is kept: X = m·exp(σ·z − σ²/2).
 */
export function lognormalSigma(cov: number): number {
  if (!(cov >= 0) || !Number.isFinite(cov)) {
    throw new GeotechError('cov-invalid', `A coefficient of variation must be a finite number ≥ 0 (got ${String(cov)}).`)
  }
  return Math.sqrt(Math.log1p(cov * cov))
}

/**
 * Correlation of the underlying normals that gives two lognormal variables (COVs V₁, V₂) the
 * product-moment correlation ρ: ρ' = ln(1 + ρ·V₁·V₂)/(σ₁·σ₂), exact for lognormal marginals
 * (Der Kiureghian & Liu 1986, Table 4). `clamped` when no normal correlation can give ρ.
 */
export function normalCorrelationForLognormals(rho: number, cov1: number, cov2: number): { rho: number, clamped: boolean } {
  const s1 = lognormalSigma(cov1)
  const s2 = lognormalSigma(cov2)
  if (s1 === 0 || s2 === 0) return { rho: 0, clamped: false }
  const inner = 1 + rho * cov1 * cov2
  const r = inner > 0 ? Math.log(inner) / (s1 * s2) : -Infinity
  if (r > 1) return { rho: 1, clamped: true }
  if (r < -1) return { rho: -1, clamped: true }
  return { rho: r, clamped: false }
}
