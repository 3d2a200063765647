/**
 * Atterberg limits and the plasticity chart for fine-grained soils (ASTM D2487, after Casagrande 1948).
 * Limits are water contents in percent.
 */
import { GeotechError } from './errors'

/** Group symbols of the Unified Soil Classification System (ASTM D2487), including the dual symbols it allows. */
export const USCS_GROUP_SYMBOLS = [
  'GW', 'GP', 'GM', 'GC', 'GW-GM', 'GW-GC', 'GP-GM', 'GP-GC',
  'SW', 'SP', 'SM', 'SC', 'SW-SM', 'SW-SC', 'SP-SM', 'SP-SC',
  'CL', 'ML', 'OL', 'CH', 'MH', 'OH', 'PT',
  'CL-ML', 'GC-GM', 'SC-SM',
] as const
export type UscsGroupSymbol = (typeof USCS_GROUP_SYMBOLS)[number]

/** Narrows a logged string to a valid group symbol (for imports and forms). */
export function isUscsGroupSymbol(value: string): value is UscsGroupSymbol {
  return (USCS_GROUP_SYMBOLS as readonly string[]).includes(value)
}

/** Groups that the plasticity chart alone can assign to a fine-grained soil. */
export type FineGrainedGroup = 'CL' | 'ML' | 'CL-ML' | 'CH' | 'MH' | 'OL' | 'OH'

/** Plasticity index PI = LL − PL (ASTM D4318). */
export function plasticityIndex(liquidLimit: number, plasticLimit: number): number {
  checkLimit(liquidLimit, 'liquid limit')
  checkLimit(plasticLimit, 'plastic limit')
  if (plasticLimit > liquidLimit) {
    throw new GeotechError(
      'plastic-limit-above-liquid-limit',
      `The plastic limit (${plasticLimit} %) is above the liquid limit (${liquidLimit} %); a soil cannot be plastic over a negative range. Check the test.`,
    )
  }
  return liquidLimit - plasticLimit
}

/** PI on the A-line, 0.73·(LL − 20) (ASTM D2487 plasticity chart): clays plot above it, silts below. */
export function aLine(liquidLimit: number): number {
  return 0.73 * (liquidLimit - 20)
}

/** PI on the U-line, 0.9·(LL − 8) (ASTM D2487 plasticity chart): the upper bound observed for natural soils. */
export function uLine(liquidLimit: number): number {
  return 0.9 * (liquidLimit - 8)
}

/** Ratio of oven-dried to undried liquid limit below which a fine-grained soil is organic (ASTM D2487). */
export const ORGANIC_LIQUID_LIMIT_RATIO = 0.75

export interface FineGrainedInput {
  liquidLimit: number
  /** Give either the plastic limit or the plasticity index. */
  plasticLimit?: number
  plasticityIndex?: number
  /** Liquid limit after oven drying; with the undried LL it decides whether the soil is organic. */
  ovenDriedLiquidLimit?: number
  /** Organic as judged by the logger (colour, odour) when no oven-dried LL was measured. */
  organic?: boolean
}

export interface FineGrainedClassification {
  group: FineGrainedGroup
  liquidLimit: number
  plasticityIndex: number
  /** PI of the A-line at this LL. */
  aLine: number
  /** PI of the U-line at this LL. */
  uLine: number
  /** On or above the A-line. */
  aboveALine: boolean
  /** LL of 50 or more (H), else L. */
  highPlasticity: boolean
  organic: boolean
  warnings: string[]
}

/**
 * Fine-grained group from the plasticity chart (ASTM D2487, Fig. 4 and the fine-grained criteria):
 * LL < 50: CL if PI > 7 and on or above the A-line, CL-ML if 4 ≤ PI ≤ 7 and on or above it, else ML;
 * LL ≥ 50: CH on or above the A-line, MH below; OL/OH instead when organic. The chart draws the A-line
 * horizontal at PI = 4 up to LL = 25.5 (memory); that segment changes nothing here because PI < 4 is ML anyway.
 * Grading (at least half passing the No. 200 sieve) is the caller's to establish.
 */
export function classifyFineGrained(input: FineGrainedInput): FineGrainedClassification {
  const ll = input.liquidLimit
  checkLimit(ll, 'liquid limit')
  let pi: number
  if (input.plasticityIndex !== undefined) {
    pi = input.plasticityIndex
    checkLimit(pi, 'plasticity index')
    if (pi > ll) {
      throw new GeotechError('plasticity-index-above-liquid-limit', `A plasticity index of ${pi} above the liquid limit of ${ll} % would need a negative plastic limit.`)
    }
    if (input.plasticLimit !== undefined && Math.abs(ll - input.plasticLimit - pi) > 1e-9) {
      throw new GeotechError('plasticity-index-inconsistent', `PI = ${pi} does not equal LL − PL = ${ll - input.plasticLimit}.`)
    }
  }
  else if (input.plasticLimit !== undefined) {
    pi = plasticityIndex(ll, input.plasticLimit)
  }
  else {
    throw new GeotechError('plasticity-index-missing', 'Classification needs the plastic limit or the plasticity index.')
  }

  const warnings: string[] = []
  let organic = input.organic ?? false
  if (input.ovenDriedLiquidLimit !== undefined) {
    checkLimit(input.ovenDriedLiquidLimit, 'oven-dried liquid limit')
    if (ll <= 0) throw new GeotechError('liquid-limit-out-of-range', 'The organic test needs a positive liquid limit.')
    const ratio = input.ovenDriedLiquidLimit / ll
    const byRatio = ratio < ORGANIC_LIQUID_LIMIT_RATIO
    if (input.organic !== undefined && input.organic !== byRatio) {
      warnings.push(`The oven-dried LL ratio ${ratio.toFixed(2)} says ${byRatio ? 'organic' : 'inorganic'}, against the logged description; the ratio decides.`)
    }
    organic = byRatio
  }
  else if (organic) {
    warnings.push('Organic from the description only; ASTM D2487 asks for the oven-dried liquid limit (ratio below 0.75) to confirm OL/OH.')
  }

  const a = aLine(ll)
  const u = uLine(ll)
  const aboveALine = pi >= a
  const highPlasticity = ll >= 50
  let group: FineGrainedGroup
  if (organic) group = highPlasticity ? 'OH' : 'OL'
  else if (highPlasticity) group = aboveALine ? 'CH' : 'MH'
  else if (aboveALine && pi > 7) group = 'CL'
  else if (aboveALine && pi >= 4) group = 'CL-ML'
  else group = 'ML'

  if (pi > u) {
    warnings.push(`PI = ${pi} plots above the U-line (PI = ${u.toFixed(1)} at LL = ${ll}), beyond the range of natural soils; check the limits.`)
  }
  return { group, liquidLimit: ll, plasticityIndex: pi, aLine: a, uLine: u, aboveALine, highPlasticity, organic, warnings }
}

function checkLimit(value: number, what: string): void {
  if (!Number.isFinite(value) || value < 0) {
    throw new GeotechError('atterberg-limit-not-valid', `The ${what} must be a number of 0 % or more (got ${value}).`)
  }
}
