/**
 * Oedometer stages as a laboratory reports them, converted to the void ratio the
 * engine works in. Three conventions:
 *
 * - `void-ratio`: e at the end of the stage, as entered;
 * - `strain`: vertical strain ε in % of the initial height, e = e0 − (1 + e0)·ε/100;
 * - `dial`: cumulative compression Δh in mm since the start of the test (the gauge reading
 *   minus its zero reading), e = e0 − (1 + e0)·Δh/H0.
 *
 * Both follow from 1-D compression of a specimen whose solids height Hs = H0/(1 + e0) is
 * constant: H = Hs·(1 + e), so ΔH/H0 = Δe/(1 + e0) (common practice; any soil-mechanics text).
 * Pure TypeScript, SI apart from the laboratory units named on each value.
 */
import { GeotechError } from '../geotech/errors'

export const STAGE_CONVENTIONS = ['void-ratio', 'strain', 'dial'] as const
export type StageConvention = (typeof STAGE_CONVENTIONS)[number]

export const STAGE_CONVENTION_LABELS: Record<StageConvention, string> = {
  'void-ratio': 'Void ratio e',
  'strain': 'Strain ε (%)',
  'dial': 'Compression Δh (mm)',
}

/** What the conversion needs from the specimen. */
export interface SpecimenBasis {
  /** Initial void ratio. */
  e0: number
  /** Initial specimen height H0, mm. */
  specimenHeight: number
}

/** One time reading within a stage: minutes since the load was applied, gauge reading in mm (rising as the specimen compresses). */
export interface TimeReading {
  minutes: number
  dial: number
}

export interface StageEntry {
  /** Vertical effective stress at the end of the stage, kPa. */
  stress: number
  /** The value in the test's convention. */
  value: number
  readings?: TimeReading[]
}

export interface ConvertedStage {
  stress: number
  entered: number
  voidRatio: number
  readings?: TimeReading[]
}

function checkBasis(basis: SpecimenBasis): void {
  if (!Number.isFinite(basis.e0) || basis.e0 <= 0) {
    throw new GeotechError('void-ratio-not-positive', `The initial void ratio e0 must be a positive number (got ${basis.e0}).`)
  }
  if (!Number.isFinite(basis.specimenHeight) || basis.specimenHeight <= 0) {
    throw new GeotechError('specimen-height-not-positive', `The specimen height must be a positive number of millimetres (got ${basis.specimenHeight}).`)
  }
}

/**
 * e0 of a saturated specimen from the phase relation S·e = w·Gs with S = 1:
 * e0 = Gs·w/100, w in % (common practice; any soil-mechanics text).
 */
export function e0FromWaterContent(specificGravity: number, waterContent: number): number {
  if (!Number.isFinite(specificGravity) || specificGravity <= 0) {
    throw new GeotechError('specific-gravity-not-positive', `The specific gravity Gs must be a positive number (got ${specificGravity}).`)
  }
  if (!Number.isFinite(waterContent) || waterContent <= 0) {
    throw new GeotechError('water-content-not-positive', `e0 from Gs·w needs a positive water content (got ${waterContent} %).`)
  }
  return (specificGravity * waterContent) / 100
}

/** Degree of saturation S = w·Gs/(100·e0) (phase relation; common practice), as a fraction. */
export function degreeOfSaturation(specificGravity: number, waterContent: number, e0: number): number {
  return (specificGravity * waterContent) / (100 * e0)
}

/** Void ratio from a value in the given convention. */
export function toVoidRatio(convention: StageConvention, value: number, basis: SpecimenBasis): number {
  if (!Number.isFinite(value)) throw new GeotechError('value-not-finite', `The stage value must be a finite number (got ${value}).`)
  switch (convention) {
    case 'void-ratio':
      return value
    case 'strain':
      checkBasis(basis)
      return basis.e0 - ((1 + basis.e0) * value) / 100
    case 'dial':
      checkBasis(basis)
      return basis.e0 - ((1 + basis.e0) * value) / basis.specimenHeight
    default: {
      const unknown: never = convention
      throw new GeotechError('unknown-convention', `Unknown stage convention "${String(unknown)}".`)
    }
  }
}

/** The value in the given convention that corresponds to a void ratio (the inverse of `toVoidRatio`). */
export function fromVoidRatio(convention: StageConvention, voidRatio: number, basis: SpecimenBasis): number {
  switch (convention) {
    case 'void-ratio':
      return voidRatio
    case 'strain':
      checkBasis(basis)
      return (100 * (basis.e0 - voidRatio)) / (1 + basis.e0)
    case 'dial':
      checkBasis(basis)
      return (basis.specimenHeight * (basis.e0 - voidRatio)) / (1 + basis.e0)
    default: {
      const unknown: never = convention
      throw new GeotechError('unknown-convention', `Unknown stage convention "${String(unknown)}".`)
    }
  }
}

/** Vertical strain in % of the initial height at a void ratio: ε = 100·(e0 − e)/(1 + e0). */
export function strainPercent(voidRatio: number, e0: number): number {
  return (100 * (e0 - voidRatio)) / (1 + e0)
}

/**
 * Specimen height (mm) at a void ratio, H = H0·(1 + e)/(1 + e0): the solids height does not change.
 */
export function specimenHeightAt(voidRatio: number, basis: SpecimenBasis): number {
  checkBasis(basis)
  return (basis.specimenHeight * (1 + voidRatio)) / (1 + basis.e0)
}

/**
 * Converts every stage, in test order, to its void ratio. A stage whose void ratio comes out at
 * zero or below is physically impossible (a strain or compression beyond what the pores allow) and
 * throws with its stage number. Time readings must be at increasing times from 0 minutes on.
 */
export function convertStages(convention: StageConvention, stages: readonly StageEntry[], basis: SpecimenBasis): ConvertedStage[] {
  if (convention !== 'void-ratio') checkBasis(basis)
  return stages.map((stage, i) => {
    const n = i + 1
    if (!Number.isFinite(stage.stress) || stage.stress <= 0) {
      throw new GeotechError('stress-not-positive', `Stage ${n}: the effective stress must be a positive number (got ${stage.stress} kPa).`, { detail: { index: i } })
    }
    const voidRatio = toVoidRatio(convention, stage.value, basis)
    if (!(voidRatio > 0)) {
      const what = convention === 'strain'
        ? `a strain of ${stage.value} % leaves a void ratio of ${round(voidRatio)}`
        : convention === 'dial'
          ? `a compression of ${stage.value} mm of a ${basis.specimenHeight} mm specimen leaves a void ratio of ${round(voidRatio)}`
          : `the void ratio ${stage.value} is not positive`
      throw new GeotechError('void-ratio-not-positive', `Stage ${n}: ${what}; the void ratio must stay above 0.`, { detail: { index: i } })
    }
    const out: ConvertedStage = { stress: stage.stress, entered: stage.value, voidRatio }
    if (stage.readings && stage.readings.length) {
      const readings = [...stage.readings]
      readings.forEach((r, j) => {
        if (!Number.isFinite(r.minutes) || r.minutes < 0 || !Number.isFinite(r.dial)) {
          throw new GeotechError('time-reading-invalid', `Stage ${n}, reading ${j + 1}: time and gauge reading must be numbers, the time 0 min or later.`, { detail: { index: i, reading: j } })
        }
        const before = readings[j - 1]
        if (before && !(r.minutes > before.minutes)) {
          throw new GeotechError('time-not-increasing', `Stage ${n}, reading ${j + 1}: the time ${r.minutes} min does not increase on the reading before it (${before.minutes} min).`, { detail: { index: i, reading: j } })
        }
      })
      out.readings = readings
    }
    return out
  })
}

function round(v: number): string {
  return Number.isFinite(v) ? Number(v.toPrecision(4)).toString() : String(v)
}
