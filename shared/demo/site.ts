/**
 * Ground "truth" of the invented demo site, Saltmarsh Lane Freight Terminal (TRN-0417): strata, groundwater,
 * site plan, spatial variation and the true stress history. The demo generator samples every record from this
 * model, and the tests fit it back, so the whole chain from raw data to σ'p trends is checked end to end.
 * Depth z is positive down from the local ground surface (m); stresses in kPa; unit weights in kN/m³.
 */
import seedrandom from 'seedrandom'
import { createStressEvaluator, type Groundwater, type StressAtDepth, type StressLayer } from '../geotech/stress'
import type { StratumColourKey, StratumPatternKey } from '../strata/appearance'

/** Root seed of every random draw in the demo, so the data are identical on every machine. */
export const DEMO_SEED = 'pastload-demo/TRN-0417/saltmarsh-lane'

/** Unit weight of water, kN/m³ (the engine's default). */
export const GAMMA_W = 9.81

export const DEMO_STRATUM_CODES = ['MG', 'CRUST', 'EST', 'GLAC', 'SAND'] as const
export type DemoStratumCode = (typeof DEMO_STRATUM_CODES)[number]

/** Compressibility of a clay stratum (the settlement parameters of the ground model). */
export interface Compressibility {
  cc: number
  cr: number
  e0: number
  /** Coefficient of consolidation, m²/year. */
  cv: number
}

/** Index properties the generated tests scatter about: LL chosen so that 0.009(LL − 10) ≈ Cc. */
export interface IndexTruth {
  /** Liquid limit, %. */
  liquidLimit: number
  /** Plastic limit, %. */
  plasticLimit: number
  /** Natural water content, %. */
  waterContent: number
  specificGravity: number
}

export interface StratumTruth {
  code: DemoStratumCode
  name: string
  /** One-line description for the stratum table. */
  description: string
  /** Nominal depth range at the nominal ground level, m. */
  nominalTop: number
  nominalBottom: number
  /** Half-range of the smooth variation of this stratum's base across the site, m. */
  baseVariation: number
  unitWeight: number
  unitWeightSaturated: number
  /** Null for strata taken as incompressible (fill, sand). */
  compressibility: Compressibility | null
  index: IndexTruth | null
  /** Group symbols the logs use for this stratum. */
  uscs: readonly string[]
  stressHistory: string
  colour: StratumColourKey
  pattern: StratumPatternKey
}

/** σ'p in the crust falls linearly from this value at its top … */
export const CRUST_PRECONSOLIDATION_TOP = 210
/** … to this value at its base, kPa. */
export const CRUST_PRECONSOLIDATION_BASE = 95
/** Constant pre-overburden pressure of the estuarine clay, kPa. */
export const ESTUARINE_POP = 25
/** Constant over-consolidation ratio of the glacial clay. */
export const GLACIAL_OCR = 2.4
/** Sensitivity range of the estuarine clay (peak over remoulded vane strength). */
export const ESTUARINE_SENSITIVITY = [3, 6] as const

export const DEMO_STRATA: readonly StratumTruth[] = [
  {
    code: 'MG',
    name: 'Made ground',
    description: 'Sandy gravel fill with brick and concrete fragments, placed during reclamation.',
    nominalTop: 0,
    nominalBottom: 1.2,
    baseVariation: 0.3,
    unitWeight: 19,
    unitWeightSaturated: 20,
    compressibility: null,
    index: null,
    uscs: ['GW', 'SW'],
    stressHistory: 'Not compressible.',
    colour: 'fill-ochre',
    pattern: 'made-ground',
  },
  {
    code: 'CRUST',
    name: 'Desiccated crust',
    description: 'Stiff brown mottled silty clay, desiccated and fissured, with rootlets.',
    nominalTop: 1.2,
    nominalBottom: 3.4,
    baseVariation: 0.5,
    unitWeight: 18,
    unitWeightSaturated: 18.5,
    compressibility: { cc: 0.35, cr: 0.04, e0: 1.10, cv: 3 },
    index: { liquidLimit: 49, plasticLimit: 23, waterContent: 38, specificGravity: 2.70 },
    uscs: ['CL', 'CH'],
    stressHistory: `σ'p falls linearly from ${CRUST_PRECONSOLIDATION_TOP} kPa at the top to ${CRUST_PRECONSOLIDATION_BASE} kPa at the base.`,
    colour: 'crust-tan',
    pattern: 'clay',
  },
  {
    code: 'EST',
    name: 'Estuarine clay',
    description: 'Soft grey high-plasticity clay with shell fragments and organic bands.',
    nominalTop: 3.4,
    nominalBottom: 15.0,
    baseVariation: 0.5,
    unitWeight: 16,
    unitWeightSaturated: 16,
    compressibility: { cc: 0.85, cr: 0.09, e0: 2.10, cv: 1.2 },
    index: { liquidLimit: 104, plasticLimit: 39, waterContent: 79, specificGravity: 2.66 },
    uscs: ['CH', 'OH'],
    stressHistory: `Constant POP ≈ ${ESTUARINE_POP} kPa.`,
    colour: 'estuary-slate',
    pattern: 'clay',
  },
  {
    code: 'GLAC',
    name: 'Glacial clay',
    description: 'Firm to stiff grey-brown sandy gravelly clay (older glacial deposit).',
    nominalTop: 15.0,
    nominalBottom: 21.5,
    baseVariation: 0.5,
    unitWeight: 20.5,
    unitWeightSaturated: 20.5,
    compressibility: { cc: 0.22, cr: 0.03, e0: 0.65, cv: 6 },
    index: { liquidLimit: 34, plasticLimit: 18, waterContent: 24, specificGravity: 2.70 },
    uscs: ['CL'],
    stressHistory: `Constant OCR ≈ ${GLACIAL_OCR}, an abrupt jump at the top.`,
    colour: 'glacial-umber',
    pattern: 'gravelly-clay',
  },
  {
    code: 'SAND',
    name: 'Dense sand',
    description: 'Dense to very dense grey fine to medium sand: the pumped aquifer.',
    nominalTop: 21.5,
    nominalBottom: 30,
    baseVariation: 0,
    unitWeight: 20,
    unitWeightSaturated: 20,
    compressibility: null,
    index: null,
    uscs: ['SP', 'SM'],
    stressHistory: 'Not compressible.',
    colour: 'sand-straw',
    pattern: 'sand',
  },
]

/** The stratum with this code (throws for a code not in the ground model, a programming error). */
export function demoStratum(code: DemoStratumCode): StratumTruth {
  const found = DEMO_STRATA.find(s => s.code === code)
  if (!found) throw new Error(`Unknown demo stratum ${code}`)
  return found
}

/** Base of the ground model, m: the deepest borehole ends here. */
export const MODEL_BASE = 30

// ---------------------------------------------------------------------------
// Groundwater
// ---------------------------------------------------------------------------

export const GROUNDWATER_TRUTH = {
  /** Standing water level, m below ground. */
  standingLevel: 1.6,
  /** Pore pressure is hydrostatic from the standing level down to this depth, m. */
  hydrostaticTo: 12,
  /** Piezometric level of the pumped sand aquifer, m below ground. */
  aquiferPiezometricDepth: 4.5,
} as const

/**
 * The under-drained profile as the engine's piezometric input: hydrostatic to 12 m, linear to
 * u = γw·(z − 4.5) at the sand top, hydrostatic gradient below (the engine's rule past the last control point).
 */
export function groundwaterFor(sandTop: number): Groundwater {
  const g = GROUNDWATER_TRUTH
  return {
    waterTableDepth: g.standingLevel,
    piezometers: [
      { depth: g.hydrostaticTo, porePressure: GAMMA_W * (g.hydrostaticTo - g.standingLevel) },
      { depth: sandTop, porePressure: GAMMA_W * (sandTop - g.aquiferPiezometricDepth) },
    ],
  }
}

// ---------------------------------------------------------------------------
// Site plan and spatial variation
// ---------------------------------------------------------------------------

/** Local site grid in metres from the site origin; no real coordinates. */
export const SITE_PLAN = {
  grid: 'Local site grid (m), easting and northing from the site origin at the south-west gate',
  datum: 'Local site datum (m)',
  /** The 120 m × 80 m container yard. */
  yard: { minEasting: 50, maxEasting: 170, minNorthing: 40, maxNorthing: 120 },
  nominalGroundElevation: 2.5,
  /** Half-range of the smooth variation of ground level, m. */
  groundVariation: 0.4,
} as const

/** The design load: a granular embankment over the whole yard. */
export const DEMO_EMBANKMENT = {
  height: 6.0,
  unitWeight: 20,
  /** Surface pressure, kPa (height × unit weight). */
  pressure: 120,
} as const

/** Uniform deviate in [lo, hi). */
function uniform(rng: () => number, lo: number, hi: number): number {
  return lo + (hi - lo) * rng()
}

/** Plan extent over which the spatial fields are centred and scaled: the yard and 25 m around it. */
const FIELD_MARGIN = 25

/**
 * A smooth field over the plan, centred on zero and scaled to ±amplitude over the yard and its margin
 * (clamped beyond): a few long-wavelength plane waves with seeded directions, phases and weights, so
 * neighbouring holes differ by decimetres, not metres, and the site spans the whole range.
 */
function smoothField(label: string, amplitude: number): (easting: number, northing: number) => number {
  if (amplitude === 0) return () => 0
  const rng = seedrandom(`${DEMO_SEED}:field:${label}`)
  const waves = [0, 1, 2, 3].map(() => {
    const wavelength = uniform(rng, 60, 160)
    const angle = uniform(rng, 0, Math.PI)
    return { kx: (2 * Math.PI * Math.cos(angle)) / wavelength, ky: (2 * Math.PI * Math.sin(angle)) / wavelength, phase: uniform(rng, 0, 2 * Math.PI), weight: uniform(rng, 0.3, 1) }
  })
  const raw = (easting: number, northing: number): number => {
    let value = 0
    for (const w of waves) value += w.weight * Math.sin(w.kx * easting + w.ky * northing + w.phase)
    return value
  }
  const { minEasting, maxEasting, minNorthing, maxNorthing } = SITE_PLAN.yard
  const samples: number[] = []
  for (let e = minEasting - FIELD_MARGIN; e <= maxEasting + FIELD_MARGIN; e += 5) {
    for (let n = minNorthing - FIELD_MARGIN; n <= maxNorthing + FIELD_MARGIN; n += 5) samples.push(raw(e, n))
  }
  const lo = Math.min(...samples)
  const hi = Math.max(...samples)
  const mid = 0.5 * (lo + hi)
  const half = 0.5 * (hi - lo)
  return (easting, northing) => amplitude * Math.max(-1, Math.min(1, (raw(easting, northing) - mid) / half))
}

const groundField = smoothField('ground-level', SITE_PLAN.groundVariation)
const baseFields = DEMO_STRATA.map(s => smoothField(`base:${s.code}`, s.baseVariation))

/** Logged depths are to the nearest 0.05 m; truth uses the same grid so logs and truth agree exactly. */
function toLogStep(depth: number): number {
  return Math.round(depth * 20) / 20
}

/** Depth of each stratum's base at the nominal ground (DEMO_STRATA order; the last is the model base). */
export const NOMINAL_BASES: readonly number[] = DEMO_STRATA.map(s => s.nominalBottom)

/** Index into DEMO_STRATA of the stratum holding a depth; a depth on a boundary belongs to the stratum below (the engine's rule). */
export function stratumIndexAt(depth: number, bases: readonly number[]): number {
  for (let i = 0; i < bases.length - 1; i++) {
    if (depth < bases[i]!) return i
  }
  return bases.length - 1
}

/**
 * True σ'p at a depth from the σ'v0 there (kPa), per stratum: crust linear from 210 to 95 kPa top to base,
 * estuarine σ'v0 + 25, glacial 2.4·σ'v0; null in the incompressible fill and sand.
 * `bases` are the local stratum bases (defaults to the nominal profile).
 */
export function truePreconsolidation(depth: number, stressAtDepth: StressAtDepth, bases: readonly number[] = NOMINAL_BASES): number | null {
  const i = stratumIndexAt(depth, bases)
  switch (DEMO_STRATA[i]!.code) {
    case 'CRUST': {
      const top = bases[i - 1]!
      const bottom = bases[i]!
      const t = (depth - top) / (bottom - top)
      return CRUST_PRECONSOLIDATION_TOP + t * (CRUST_PRECONSOLIDATION_BASE - CRUST_PRECONSOLIDATION_TOP)
    }
    case 'EST': return stressAtDepth.effectiveStress + ESTUARINE_POP
    case 'GLAC': return GLACIAL_OCR * stressAtDepth.effectiveStress
    default: return null
  }
}

/** The ground model at one plan position. */
export interface GroundAt {
  easting: number
  northing: number
  /** Ground elevation on the local datum, m. */
  groundElevation: number
  /** Depth of each stratum's top, DEMO_STRATA order, m. */
  tops: readonly number[]
  /** Depth of each stratum's base, DEMO_STRATA order; the last is the model base, m. */
  bases: readonly number[]
  /** The engine's layers, one per stratum in DEMO_STRATA order. */
  layers: StressLayer[]
  groundwater: Groundwater
  /** σv, u and σ'v0 at a depth (the engine's evaluator). */
  stressAt: (depth: number) => StressAtDepth
  stratumAt: (depth: number) => StratumTruth
  /** True σ'p at a depth; null in the fill and sand. */
  preconsolidationAt: (depth: number) => number | null
}

/** Builds the local ground model from stratum bases (m below ground) and a ground elevation. */
export function groundFromBases(easting: number, northing: number, groundElevation: number, bases: readonly number[]): GroundAt {
  const tops = bases.map((_, i) => (i === 0 ? 0 : bases[i - 1]!))
  const layers: StressLayer[] = DEMO_STRATA.map((s, i) => ({
    name: s.code,
    thickness: bases[i]! - tops[i]!,
    unitWeight: s.unitWeight,
    unitWeightSaturated: s.unitWeightSaturated,
  }))
  const sandTop = tops[DEMO_STRATA.length - 1]!
  const groundwater = groundwaterFor(sandTop)
  const stressAt = createStressEvaluator({ layers, groundwater, gammaW: GAMMA_W })
  return {
    easting,
    northing,
    groundElevation,
    tops,
    bases,
    layers,
    groundwater,
    stressAt,
    stratumAt: depth => DEMO_STRATA[stratumIndexAt(depth, bases)]!,
    preconsolidationAt: depth => truePreconsolidation(depth, stressAt(depth), bases),
  }
}

/** The ground model at a plan position: ground level ±0.4 m and stratum bases ±0.5 m, smooth over the site. */
export function groundAt(easting: number, northing: number): GroundAt {
  const groundElevation = Math.round((SITE_PLAN.nominalGroundElevation + groundField(easting, northing)) * 100) / 100
  const bases = DEMO_STRATA.map((s, i) => (i === DEMO_STRATA.length - 1 ? MODEL_BASE : toLogStep(s.nominalBottom + baseFields[i]!(easting, northing))))
  return groundFromBases(easting, northing, groundElevation, bases)
}

/** The nominal profile of the scenario table (no spatial variation). */
export function nominalGround(): GroundAt {
  return groundFromBases(0, 0, SITE_PLAN.nominalGroundElevation, NOMINAL_BASES)
}

// ---------------------------------------------------------------------------
// Investigation layout
// ---------------------------------------------------------------------------

export interface PlannedPoint {
  identifier: string
  easting: number
  northing: number
}

/** Boreholes and their final depths (m): spread over the yard, one just outside its east edge. */
export const DEMO_BOREHOLES: readonly (PlannedPoint & { finalDepth: number })[] = [
  { identifier: 'BH-01', easting: 61.4, northing: 51.8, finalDepth: 30.0 },
  { identifier: 'BH-02', easting: 108.2, northing: 47.5, finalDepth: 25.5 },
  { identifier: 'BH-03', easting: 157.6, northing: 56.3, finalDepth: 28.0 },
  { identifier: 'BH-04', easting: 69.9, northing: 107.4, finalDepth: 24.5 },
  { identifier: 'BH-05', easting: 116.3, northing: 96.1, finalDepth: 26.5 },
  { identifier: 'BH-06', easting: 176.8, northing: 118.2, finalDepth: 30.0 },
]

/** Piezocone soundings, to 22 m; one just outside the yard's west edge. */
export const DEMO_CPTS: readonly PlannedPoint[] = [
  { identifier: 'CPT-01', easting: 84.7, northing: 70.2 },
  { identifier: 'CPT-02', easting: 134.9, northing: 72.6 },
  { identifier: 'CPT-03', easting: 95.3, northing: 114.8 },
  { identifier: 'CPT-04', easting: 44.1, northing: 84.5 },
]

/** Field vane profiles: holes of their own (kind 'borehole') on a loose grid over the yard. */
export const DEMO_VANES: readonly PlannedPoint[] = [
  { identifier: 'VT-01', easting: 58.2, northing: 63.0 },
  { identifier: 'VT-02', easting: 83.6, northing: 48.9 },
  { identifier: 'VT-03', easting: 105.8, northing: 62.4 },
  { identifier: 'VT-04', easting: 131.1, northing: 50.7 },
  { identifier: 'VT-05', easting: 160.4, northing: 69.8 },
  { identifier: 'VT-06', easting: 56.7, northing: 93.5 },
  { identifier: 'VT-07', easting: 82.0, northing: 99.1 },
  { identifier: 'VT-08', easting: 108.9, northing: 110.6 },
  { identifier: 'VT-09', easting: 137.5, northing: 101.2 },
  { identifier: 'VT-10', easting: 162.3, northing: 96.4 },
]

/** Vibrating-wire piezometers, a nest near the middle of the yard, with their tip depths (m). */
export const DEMO_PIEZOMETERS: readonly (PlannedPoint & { tipDepth: number })[] = [
  { identifier: 'P-1', easting: 111.0, northing: 79.0, tipDepth: 6 },
  { identifier: 'P-2', easting: 113.0, northing: 79.0, tipDepth: 12 },
  { identifier: 'P-3', easting: 115.0, northing: 79.0, tipDepth: 18 },
]
