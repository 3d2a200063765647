/**
 * Whether σ'p may be derived from the CPT (σ'p = k·qnet) and the field vane (σ'p = μ·su,FV/0.22) in a
 * stratum. Both correlations are for fine-grained soils (Mayne 1995; Mesri 1975): in fill, sand and gravel
 * they give numbers that mean nothing (a cone in dense fill reads thousands of kPa). The default follows
 * the USCS symbols logged in the stratum; the engineer may switch it per stratum.
 */

import { normaliseUscs, uscsFamily } from './uscs'

/**
 * Fine-grained by ASTM D2487's major division: half or more passing the 75 µm sieve, i.e. the group
 * symbol starts with C, M or O, or is PT (highly organic). A dual symbol belongs to the division of its
 * first half: CL-ML is fine-grained, GC-GM, SC-SM, SP-SM and the like are coarse-grained soils with fines.
 * Unknown symbols are not fine-grained.
 */
export function isFineGrainedUscs(symbol: string): boolean {
  const family = uscsFamily(symbol)
  return family === 'clay' || family === 'silt' || family === 'organic' || family === 'peat'
}

/** One logged interval's symbol and thickness (m) within a stratum. */
export interface LoggedUscs {
  uscs: string | null
  thickness: number
}

export type CptDerivationReason = 'fine-grained' | 'coarse-grained' | 'no-symbols'

export interface CptDerivationDefault {
  /** The default: on for fine-grained strata. */
  on: boolean
  reason: CptDerivationReason
  /** Logged thickness with a valid symbol, m, and the fine-grained part of it. */
  loggedThickness: number
  fineThickness: number
  /** The distinct valid symbols logged, most thickness first. */
  symbols: string[]
}

/**
 * The default for a stratum from its logged intervals: on when fine-grained symbols make up at least
 * half of the thickness logged with a symbol (a clay with thin sand partings stays on; a fill logged as
 * GW over SW is off). With no symbol logged there is nothing to go by, so the derivation stays on and
 * the engineer decides.
 */
export function cptDerivationDefault(intervals: readonly LoggedUscs[]): CptDerivationDefault {
  const bySymbol = new Map<string, number>()
  let logged = 0
  let fine = 0
  for (const iv of intervals) {
    if (iv.uscs === null || !(iv.thickness > 0) || !Number.isFinite(iv.thickness)) continue
    const s = normaliseUscs(iv.uscs)
    if (uscsFamily(s) === null) continue
    bySymbol.set(s, (bySymbol.get(s) ?? 0) + iv.thickness)
    logged += iv.thickness
    if (isFineGrainedUscs(s)) fine += iv.thickness
  }
  const symbols = [...bySymbol.entries()].sort((a, b) => b[1] - a[1] || a[0].localeCompare(b[0])).map(([s]) => s)
  if (logged === 0) return { on: true, reason: 'no-symbols', loggedThickness: 0, fineThickness: 0, symbols }
  const on = fine >= 0.5 * logged
  return { on, reason: on ? 'fine-grained' : 'coarse-grained', loggedThickness: logged, fineThickness: fine, symbols }
}

/** The switch in force: the stored override, or the default when there is none (null). */
export function cptDerivationOn(override: boolean | null, fallback: CptDerivationDefault): boolean {
  return override ?? fallback.on
}
