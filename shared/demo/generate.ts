/**
 * The demo investigation of Saltmarsh Lane Freight Terminal, sampled from the ground truth of ./site with
 * seeded randomness: boreholes with logs, samples, index tests, SPT and groundwater; oedometer curves;
 * piezocone soundings; field vane profiles; piezometer records. Every call returns the same record, so the
 * seeded demo database and the end-to-end tests agree on every machine.
 */
import seedrandom from 'seedrandom'
import { DEFAULT_CONE_FACTOR, MESRI_STRENGTH_RATIO, vaneCorrectionFactor } from '../geotech/insitu'
import type { SampleQualityClass } from '../geotech/oedometer'
import type {
  CptRecord,
  GroundwaterRecord,
  IndexTestRecord,
  InvestigationRecord,
  LogIntervalRecord,
  OedometerStageRecord,
  OedometerTestRecord,
  PointRecord,
  SampleRecord,
  SptRecord,
  StratumRecord,
} from '../investigation/types'
import { DEMO_PEOPLE, DEMO_PROJECT } from './scenario'
import {
  DEMO_BOREHOLES,
  DEMO_CPTS,
  DEMO_PIEZOMETERS,
  DEMO_SEED,
  DEMO_STRATA,
  DEMO_VANES,
  ESTUARINE_SENSITIVITY,
  GAMMA_W,
  GROUNDWATER_TRUTH,
  demoStratum,
  groundAt,
  stratumIndexAt,
  type DemoStratumCode,
  type GroundAt,
  type PlannedPoint,
  type StratumTruth,
} from './site'

// ---------------------------------------------------------------------------
// Randomness and rounding
// ---------------------------------------------------------------------------

type Rng = () => number

/** One seeded stream per part of the data, so changing one part never reshuffles the others. */
function stream(label: string): Rng {
  return seedrandom(`${DEMO_SEED}:${label}`)
}

function uniform(rng: Rng, lo: number, hi: number): number {
  return lo + (hi - lo) * rng()
}

/** Standard normal deviate (Box–Muller); 1 − u keeps the logarithm finite. */
function normal(rng: Rng): number {
  const u = 1 - rng()
  const v = rng()
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v)
}

function pick<T>(rng: Rng, items: readonly T[]): T {
  return items[Math.min(items.length - 1, Math.floor(rng() * items.length))]!
}

/** Rounds to a number of decimals: stored values carry the precision of the instrument, not of the generator. */
function round(value: number, decimals: number): number {
  const f = 10 ** decimals
  return Math.round(value * f) / f
}

/** Logged depths are to the nearest 0.05 m. */
function toLogStep(depth: number): number {
  return Math.round(depth * 20) / 20
}

const GEOLOGIST = personName('geologist')
const ENGINEER = personName('engineer')

function personName(role: string): string {
  const person = DEMO_PEOPLE.find(p => p.role === role)
  if (!person) throw new Error(`The demo scenario has no ${role}`)
  return person.displayName
}

/** Calendar arithmetic in UTC so the dates do not depend on the machine's time zone. */
function addDays(isoDate: string, days: number): string {
  const d = new Date(`${isoDate}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

function addMonths(isoDate: string, months: number): string {
  const d = new Date(`${isoDate}T00:00:00Z`)
  d.setUTCMonth(d.getUTCMonth() + months)
  return d.toISOString().slice(0, 10)
}

function at(isoDate: string, time: string): string {
  return `${isoDate}T${time}:00Z`
}

// ---------------------------------------------------------------------------
// Strata
// ---------------------------------------------------------------------------

function strataRecords(): StratumRecord[] {
  return DEMO_STRATA.map((s, i) => ({
    code: s.code,
    name: s.name,
    description: s.description,
    colour: s.colour,
    pattern: s.pattern,
    unitWeight: s.unitWeight,
    unitWeightSaturated: s.unitWeightSaturated,
    displayOrder: i + 1,
  }))
}

// ---------------------------------------------------------------------------
// Logs
// ---------------------------------------------------------------------------

/** A logged description template: the parts in the usual field order, and the group symbol. */
interface Facies {
  consistency: string
  colour: string
  soil: string
  moisture: string
  structure: string | null
  uscs: string
}

const UNIT_LABEL: Record<DemoStratumCode, string> = {
  MG: 'MADE GROUND',
  CRUST: 'CRUST',
  EST: 'ESTUARINE CLAY',
  GLAC: 'GLACIAL CLAY',
  SAND: 'SAND',
}

/** Field description in the usual order: consistency/density, colour, constituents, moisture, structure, unit. */
function describeInterval(f: Facies, code: DemoStratumCode): string {
  const parts = [`${f.consistency} ${f.colour} ${f.soil}`, f.moisture]
  if (f.structure) parts.push(f.structure)
  return `${parts.join(', ')} (${UNIT_LABEL[code]})`
}

/**
 * The facies of each stratum from the top down, with the fraction of the stratum each occupies
 * (the last takes the rest). Alternatives in wording vary between holes as loggers' wording does.
 */
function faciesFor(code: DemoStratumCode, rng: Rng): Array<{ fraction: number, facies: Facies }> {
  switch (code) {
    case 'MG': return [
      { fraction: uniform(rng, 0.3, 0.45), facies: { consistency: 'Dense', colour: 'grey', soil: 'angular sandy GRAVEL of crushed concrete and brick', moisture: 'dry', structure: 'compacted hardstanding', uscs: 'GW' } },
      { fraction: 1, facies: { consistency: pick(rng, ['Medium dense', 'Loose to medium dense']), colour: 'brown', soil: 'gravelly SAND with brick fragments and ash', moisture: 'moist', structure: null, uscs: 'SW' } },
    ]
    case 'CRUST': return [
      { fraction: uniform(rng, 0.45, 0.65), facies: { consistency: pick(rng, ['Stiff', 'Firm to stiff']), colour: 'brown mottled grey', soil: 'silty CLAY with rootlets', moisture: 'moist', structure: 'fissured, desiccated', uscs: pick(rng, ['CL', 'CH']) } },
      { fraction: 1, facies: { consistency: 'Firm to stiff', colour: 'grey-brown mottled', soil: 'silty CLAY with occasional rootlets', moisture: 'moist', structure: 'closely fissured', uscs: 'CL' } },
    ]
    case 'EST': return [
      { fraction: uniform(rng, 0.3, 0.4), facies: { consistency: pick(rng, ['Very soft to soft', 'Soft']), colour: 'grey', soil: 'CLAY with occasional shell fragments', moisture: 'wet', structure: null, uscs: 'CH' } },
      { fraction: uniform(rng, 0.2, 0.3), facies: { consistency: 'Soft', colour: 'dark grey', soil: 'organic CLAY with plant remains and shells', moisture: 'wet', structure: 'thinly laminated, slight organic odour', uscs: 'OH' } },
      { fraction: 1, facies: { consistency: pick(rng, ['Soft', 'Soft to firm']), colour: 'grey', soil: 'CLAY with shell fragments and thin silt partings', moisture: 'wet', structure: null, uscs: 'CH' } },
    ]
    case 'GLAC': return [
      { fraction: uniform(rng, 0.4, 0.6), facies: { consistency: 'Firm to stiff', colour: 'brown-grey', soil: 'slightly sandy gravelly CLAY, gravel fine to medium subrounded', moisture: 'moist', structure: null, uscs: 'CL' } },
      { fraction: 1, facies: { consistency: 'Stiff', colour: 'grey', soil: 'sandy gravelly CLAY with occasional cobbles', moisture: 'moist', structure: null, uscs: 'CL' } },
    ]
    case 'SAND': return [
      { fraction: uniform(rng, 0.35, 0.5), facies: { consistency: 'Dense', colour: 'grey', soil: 'fine to medium SAND', moisture: 'wet', structure: null, uscs: 'SP' } },
      { fraction: 1, facies: { consistency: 'Very dense', colour: 'grey', soil: 'silty fine SAND', moisture: 'wet', structure: 'with thin shell bands', uscs: 'SM' } },
    ]
  }
}

/** Shortest logged interval, m: thinner facies are merged into the one above. */
const MIN_INTERVAL = 0.3

/** Intervals from the surface to the final depth, split into facies, never overlapping, never past the hole. */
function logIntervals(ground: GroundAt, finalDepth: number, rng: Rng): LogIntervalRecord[] {
  const intervals: LogIntervalRecord[] = []
  for (let i = 0; i < DEMO_STRATA.length; i++) {
    const stratum = DEMO_STRATA[i]!
    const top = ground.tops[i]!
    const bottom = Math.min(ground.bases[i]!, finalDepth)
    if (top >= finalDepth) break
    const parts = faciesFor(stratum.code, rng)
    let from = top
    parts.forEach((part, k) => {
      const last = k === parts.length - 1
      let to = last ? bottom : toLogStep(from + part.fraction * (bottom - top))
      if (!last && (to - from < MIN_INTERVAL || bottom - to < MIN_INTERVAL)) return
      to = Math.min(to, bottom)
      if (to <= from) return
      intervals.push({
        top: round(from, 2),
        bottom: round(to, 2),
        description: describeInterval(part.facies, stratum.code),
        uscs: part.facies.uscs,
        stratumCode: stratum.code,
        moisture: part.facies.moisture,
        consistency: part.facies.consistency,
      })
      from = to
    })
  }
  return intervals
}

// ---------------------------------------------------------------------------
// Samples and index tests
// ---------------------------------------------------------------------------

/** Length of a thin-walled tube push, m. */
const TUBE_LENGTH = 0.5

/** Tube top depths in one clay stratum: every 1.5 m (1.0 m in the thin crust), each tube wholly inside the stratum. */
function tubeDepths(code: DemoStratumCode, top: number, base: number): number[] {
  const start = top + (code === 'CRUST' ? 0.2 : 0.3)
  const step = code === 'CRUST' ? 1.0 : 1.5
  const depths: number[] = []
  for (let z = start; z + TUBE_LENGTH <= base - 0.05 + 1e-9; z += step) depths.push(toLogStep(z))
  return depths
}

function isOrganic(intervals: readonly LogIntervalRecord[], depth: number): boolean {
  return intervals.some(iv => iv.uscs === 'OH' && depth >= iv.top && depth < iv.bottom)
}

/**
 * Index tests about the stratum's truth: water content and limits scattered a few per cent, bulk unit weight
 * about the stratum's (moist above the water table, saturated below). Organic bands run wetter and plot below the A-line.
 */
function indexTest(stratum: StratumTruth, depth: number, organic: boolean, withLimits: boolean, rng: Rng): IndexTestRecord {
  const truth = stratum.index!
  const ll = truth.liquidLimit + (organic ? 8 : 0) + 0.06 * truth.liquidLimit * normal(rng)
  const pl = truth.plasticLimit + (organic ? 14 : 0) + 0.06 * truth.plasticLimit * normal(rng)
  const w = truth.waterContent + (organic ? 7 : 0) + 0.05 * truth.waterContent * normal(rng)
  const gamma = (depth < GROUNDWATER_TRUTH.standingLevel ? stratum.unitWeight : stratum.unitWeightSaturated) + 0.2 * normal(rng)
  return {
    waterContent: round(w, 1),
    liquidLimit: withLimits ? Math.round(ll) : null,
    plasticLimit: withLimits ? Math.round(pl) : null,
    bulkUnitWeight: round(gamma, 1),
  }
}

// ---------------------------------------------------------------------------
// Oedometer tests
// ---------------------------------------------------------------------------

/** One planned test: which tube (by order within its stratum in that hole) and how well it survived sampling. */
export interface DemoOedometerPlan {
  point: string
  stratum: 'CRUST' | 'EST' | 'GLAC'
  /** 0-based order of the tube among that hole's tubes in the stratum, from the top. */
  ordinal: number
  /** Intended sample-quality class (Lunne et al. 1997); 'very-poor' marks the two clearly disturbed specimens. */
  quality: SampleQualityClass
}

/** 14 tests over the three clay strata; the two very-poor ones are the disturbed specimens a reviewer should flag. */
export const DEMO_OEDOMETER_PLAN: readonly DemoOedometerPlan[] = [
  { point: 'BH-01', stratum: 'CRUST', ordinal: 0, quality: 'very-good-to-excellent' },
  { point: 'BH-05', stratum: 'CRUST', ordinal: 1, quality: 'good-to-fair' },
  { point: 'BH-01', stratum: 'EST', ordinal: 0, quality: 'very-good-to-excellent' },
  { point: 'BH-02', stratum: 'EST', ordinal: 1, quality: 'good-to-fair' },
  { point: 'BH-03', stratum: 'EST', ordinal: 2, quality: 'poor' },
  { point: 'BH-02', stratum: 'EST', ordinal: 3, quality: 'very-good-to-excellent' },
  { point: 'BH-04', stratum: 'EST', ordinal: 1, quality: 'very-poor' },
  { point: 'BH-05', stratum: 'EST', ordinal: 4, quality: 'poor' },
  { point: 'BH-06', stratum: 'EST', ordinal: 5, quality: 'good-to-fair' },
  { point: 'BH-01', stratum: 'EST', ordinal: 6, quality: 'very-poor' },
  { point: 'BH-02', stratum: 'GLAC', ordinal: 0, quality: 'very-good-to-excellent' },
  { point: 'BH-03', stratum: 'GLAC', ordinal: 1, quality: 'good-to-fair' },
  { point: 'BH-05', stratum: 'GLAC', ordinal: 2, quality: 'good-to-fair' },
  { point: 'BH-06', stratum: 'GLAC', ordinal: 3, quality: 'poor' },
]

/** The tube a plan entry refers to, found from the record alone (tubes of the point whose mid-depth lies in the stratum). */
export function plannedOedometerSample(record: InvestigationRecord, plan: DemoOedometerPlan): SampleRecord | undefined {
  const point = record.points.find(p => p.identifier === plan.point)
  return point ? tubeInStratum(point, plan) : undefined
}

function tubeInStratum(point: PointRecord, plan: DemoOedometerPlan): SampleRecord | undefined {
  const inStratum = point.samples
    .filter(s => s.type === 'thin-walled-tube')
    .filter((s) => {
      const mid = 0.5 * (s.top + s.bottom)
      return point.intervals.some(iv => iv.stratumCode === plan.stratum && mid >= iv.top && mid < iv.bottom)
    })
    .sort((a, b) => a.top - b.top)
  return inStratum[plan.ordinal]
}

/** Load schedules (kPa), load-increment ratio 1, starting below σ'v0 and reaching well past σ'p; the loop starts at LOOP_AT. */
const LOAD_SCHEDULE: Record<DemoOedometerPlan['stratum'], number[]> = {
  CRUST: [10, 20, 40, 80, 160, 320, 640, 1280, 2560],
  EST: [5, 10, 20, 40, 80, 160, 320, 640, 1280],
  GLAC: [12.5, 25, 50, 100, 200, 400, 800, 1600, 3200],
}
/** Index in the schedule of the stage after which the specimen is unloaded to a quarter of it and reloaded. */
const LOOP_AT = 6

/** Upper limits of the first three Lunne classes per OCR band, as the engine applies them. */
const QUALITY_LIMITS: Record<'1-2' | '2-4', readonly [number, number, number]> = {
  '1-2': [0.04, 0.07, 0.14],
  '2-4': [0.03, 0.05, 0.10],
}

/**
 * How sampling damage shows on the curve: Δe/e0 at σ'v0 aimed at the middle of the class, rounding width
 * of the yield (decades of σ'), and the apparent σ'p as a fraction of the true one.
 */
function disturbance(quality: SampleQualityClass, ocr: number, rng: Rng): { deltaEOverE0: number, width: number, apparent: number } {
  const [l1, l2, l3] = QUALITY_LIMITS[ocr < 2 ? '1-2' : '2-4']
  switch (quality) {
    case 'very-good-to-excellent': return { deltaEOverE0: l1 * uniform(rng, 0.5, 0.7), width: uniform(rng, 0.04, 0.06), apparent: 1 }
    case 'good-to-fair': return { deltaEOverE0: uniform(rng, 0.4, 0.6) * (l2 - l1) + l1, width: uniform(rng, 0.06, 0.08), apparent: uniform(rng, 0.97, 1) }
    case 'poor': return { deltaEOverE0: uniform(rng, 0.4, 0.6) * (l3 - l2) + l2, width: uniform(rng, 0.09, 0.11), apparent: uniform(rng, 0.92, 0.96) }
    case 'very-poor': return { deltaEOverE0: l3 * uniform(rng, 1.2, 1.35), width: uniform(rng, 0.17, 0.19), apparent: uniform(rng, 0.55, 0.58) }
  }
}

/** w·ln(1 + e^(u/w)): the smooth blend of the recompression and virgin lines, exact asymptotes either side. */
function softplus(u: number, width: number): number {
  return width * Math.log1p(Math.exp(u / width))
}

/**
 * Stages of an incremental test from the true Cc, Cr, e0 and σ'p at the sample depth. Loading follows
 * e(x) = e1 − Crl·(x − x1) − (Cc − Crl)·[s(x − xp) − s(x1 − xp)] in x = log10 σ', where the loading
 * recompression slope Crl is solved so that Δe/e0 at σ'v0 hits the planned quality; the unload–reload
 * loop uses the true Cr (unloading a little flatter, reloading a little steeper, averaging Cr).
 */
function oedometerTest(
  plan: DemoOedometerPlan,
  stratum: StratumTruth,
  insituStress: number,
  preconsolidation: number,
  organic: boolean,
  rng: Rng,
): OedometerTestRecord {
  const truth = stratum.compressibility!
  const gs = round(stratum.index!.specificGravity - (organic ? 0.06 : 0) + 0.01 * normal(rng), 2)
  const e0 = round(truth.e0 * (1 + 0.015 * normal(rng)), 3)
  const cc = truth.cc * (1 + 0.03 * normal(rng))
  const cr = truth.cr * (1 + 0.05 * normal(rng))
  const { deltaEOverE0, width, apparent } = disturbance(plan.quality, preconsolidation / insituStress, rng)
  const loads = LOAD_SCHEDULE[plan.stratum]
  const x1 = Math.log10(loads[0]!)
  const xv = Math.log10(insituStress)
  const xp = Math.log10(preconsolidation * apparent)
  // Part of Δe at σ'v0 happens on seating and the first stage (swelling recovered); the rest on the way to σ'v0.
  const target = deltaEOverE0 * e0
  const seating = target * (plan.quality === 'very-poor' ? 0.2 : 0.15)
  const a = xv - x1
  const b = softplus(xv - xp, width) - softplus(x1 - xp, width)
  const crLoading = Math.min(Math.max((target - seating - cc * b) / (a - b), 0.2 * cr), 0.4 * cc)
  const e1 = e0 - seating
  const curve = (x: number): number => e1 - crLoading * (x - x1) - (cc - crLoading) * (softplus(x - xp, width) - softplus(x1 - xp, width))
  // Dial-gauge resolution of about 0.01 mm on a 20 mm specimen, as void ratio.
  const noise = (): number => 0.0006 * (1 + e0) * normal(rng)

  const stages: OedometerStageRecord[] = []
  let lastLoadingE = e0
  const load = (stress: number): void => {
    const e = Math.min(curve(Math.log10(stress)) + noise(), lastLoadingE - 0.0005)
    lastLoadingE = e
    stages.push({ stress, voidRatio: round(e, 4) })
  }
  for (let i = 0; i <= LOOP_AT; i++) load(loads[i]!)
  // Unload–reload loop: σu → σu/2 → σu/4 → σu/2 → σu.
  const top = loads[LOOP_AT]!
  const eTop = lastLoadingE
  const hysteresis = 0.15
  const unloadSlope = cr * (1 - hysteresis)
  const reloadSlope = cr * (1 + hysteresis)
  const half = top / 2
  const quarter = top / 4
  const eQuarter = eTop + unloadSlope * Math.log10(top / quarter)
  stages.push({ stress: half, voidRatio: round(eTop + unloadSlope * Math.log10(top / half) + noise() * 0.5, 4) })
  stages.push({ stress: quarter, voidRatio: round(eQuarter + noise() * 0.5, 4) })
  stages.push({ stress: half, voidRatio: round(eQuarter - reloadSlope * Math.log10(half / quarter) + noise() * 0.5, 4) })
  const eBack = eQuarter - reloadSlope * Math.log10(top / quarter)
  stages.push({ stress: top, voidRatio: round(eBack, 4) })
  lastLoadingE = Math.min(lastLoadingE, eBack)
  for (let i = LOOP_AT + 1; i < loads.length; i++) load(loads[i]!)

  const remarks = [
    `Incremental loading, load-increment ratio 1, 24 h stages; unload–reload loop ${top} → ${quarter} → ${top} kPa.`,
    plan.quality === 'very-poor'
      ? 'Specimen trimmed with difficulty: softened rim and smeared shell fragments near the tube wall.'
      : plan.quality === 'poor' ? 'Slight softening at the tube wall noted on trimming.' : 'Specimen trimmed from the centre of the tube.',
  ].join(' ')
  return {
    testType: 'incremental',
    specimenHeight: 0.02,
    initialWaterContent: round((100 * e0) / gs, 1),
    specificGravity: gs,
    e0,
    stages,
    remarks,
  }
}

// ---------------------------------------------------------------------------
// Boreholes
// ---------------------------------------------------------------------------

/** Drilling days: two to three days a hole through March 2025. */
const BOREHOLE_DATES: Record<string, [string, string]> = {
  'BH-01': ['2025-03-10', '2025-03-12'],
  'BH-02': ['2025-03-13', '2025-03-14'],
  'BH-03': ['2025-03-17', '2025-03-19'],
  'BH-04': ['2025-03-20', '2025-03-21'],
  'BH-05': ['2025-03-24', '2025-03-26'],
  'BH-06': ['2025-03-27', '2025-03-31'],
}

/** SPT N in the dense sand: rising with depth below the sand top (dense near the top, very dense below). */
function sptTests(ground: GroundAt, finalDepth: number, rng: Rng): SptRecord[] {
  const sandTop = ground.tops[DEMO_STRATA.length - 1]!
  const tests: SptRecord[] = []
  for (let z = toLogStep(sandTop + 0.5); z + 0.45 <= finalDepth + 1e-9; z = round(z + 1.5, 2)) {
    const n = Math.max(22, Math.round(31 + 2.2 * (z - sandTop) + 3 * normal(rng)))
    const first = Math.round(n * uniform(rng, 0.44, 0.5))
    const seating = Math.max(4, Math.round(n * uniform(rng, 0.3, 0.42)))
    tests.push({ depth: round(z, 2), blows: [seating, first, n - first], n })
  }
  return tests
}

interface BoreholeBuild {
  point: PointRecord
  ground: GroundAt
}

/** Where a planned point stands: its identifier and kind, its plan position and the ground level there. */
function placed(plan: PlannedPoint, kind: PointRecord['kind'], ground: GroundAt): Pick<PointRecord, 'identifier' | 'kind' | 'easting' | 'northing' | 'groundElevation'> {
  return { identifier: plan.identifier, kind, easting: plan.easting, northing: plan.northing, groundElevation: ground.groundElevation }
}

function borehole(plan: PlannedPoint & { finalDepth: number }): BoreholeBuild {
  const rng = stream(`borehole:${plan.identifier}`)
  const ground = groundAt(plan.easting, plan.northing)
  const finalDepth = plan.finalDepth
  const intervals = logIntervals(ground, finalDepth, rng)
  const samples: SampleRecord[] = []
  samples.push({
    identifier: 'B1',
    top: 0.3,
    bottom: 0.8,
    type: 'bulk',
    recovery: null,
    remarks: 'Bag sample of the fill for grading.',
    index: null,
    oedometer: null,
  })
  let tube = 0
  for (const code of ['CRUST', 'EST', 'GLAC'] as const) {
    const i = DEMO_STRATA.findIndex(s => s.code === code)
    const stratum = DEMO_STRATA[i]!
    for (const top of tubeDepths(code, ground.tops[i]!, ground.bases[i]!)) {
      tube++
      const mid = top + TUBE_LENGTH / 2
      const organic = isOrganic(intervals, mid)
      samples.push({
        identifier: `T${tube}`,
        top,
        bottom: round(top + TUBE_LENGTH, 2),
        type: 'thin-walled-tube',
        recovery: Math.round(uniform(rng, code === 'GLAC' ? 80 : 88, 100)),
        remarks: code === 'GLAC' ? 'Tube pushed hydraulically; gravel at the cutting edge.' : 'Tube pushed hydraulically and sealed with wax.',
        index: indexTest(stratum, mid, organic, rng() < 0.8, rng),
        oedometer: null,
      })
    }
  }
  const spt = sptTests(ground, finalDepth, rng)
  spt.forEach((test, k) => {
    samples.push({
      identifier: `S${k + 1}`,
      top: test.depth,
      bottom: round(test.depth + 0.45, 2),
      type: 'spt-split-spoon',
      recovery: Math.round(uniform(rng, 60, 90)),
      remarks: 'Disturbed sample from the split spoon.',
      index: null,
      oedometer: null,
    })
  })
  samples.sort((a, b) => a.top - b.top)

  const [startedOn, endedOn] = BOREHOLE_DATES[plan.identifier] ?? ['2025-03-10', '2025-03-10']
  const sandTop = ground.tops[DEMO_STRATA.length - 1]!
  const seepage = round(GROUNDWATER_TRUTH.standingLevel + uniform(rng, 0.15, 0.45), 2)
  const groundwater: GroundwaterRecord[] = [
    {
      kind: 'strike',
      observedAt: at(startedOn, '10:40'),
      depth: seepage,
      pressure: null,
      remarks: `Slow seepage into the crust; rose to ${round(GROUNDWATER_TRUTH.standingLevel + uniform(rng, 0, 0.08), 2)} m after 20 min.`,
    },
    {
      kind: 'standing',
      observedAt: at(addDays(startedOn, 1), '07:30'),
      depth: round(GROUNDWATER_TRUTH.standingLevel + 0.04 * normal(rng), 2),
      pressure: null,
      remarks: 'Standing level before work resumed; casing sealed into the estuarine clay.',
    },
    {
      kind: 'strike',
      observedAt: at(endedOn, '11:15'),
      depth: round(sandTop + 0.1, 2),
      pressure: null,
      remarks: `Strike on entering the sand aquifer; rose to ${round(GROUNDWATER_TRUTH.aquiferPiezometricDepth + 0.08 * normal(rng), 2)} m after 20 min.`,
    },
  ]
  return {
    ground,
    point: {
      ...placed(plan, 'borehole', ground),
      finalDepth,
      startedOn,
      endedOn,
      method: 'Rotary drilling with casing; thin-walled tubes pushed in the clays, SPT in the sand',
      loggedBy: GEOLOGIST,
      remarks: 'Backfilled with cement–bentonite grout.',
      intervals,
      samples,
      spt,
      groundwater,
      cpt: null,
      vane: [],
    },
  }
}

/** Runs each planned oedometer test on its tube, from the truth at the tube's depth in that hole. */
function addOedometerTests(holes: readonly BoreholeBuild[]): void {
  for (const plan of DEMO_OEDOMETER_PLAN) {
    const hole = holes.find(h => h.point.identifier === plan.point)
    if (!hole) throw new Error(`Planned oedometer test on unknown point ${plan.point}`)
    const sample = tubeInStratum(hole.point, plan)
    if (!sample) throw new Error(`No tube ${plan.ordinal} in ${plan.stratum} at ${plan.point}`)
    const depth = sample.top + TUBE_LENGTH / 2
    const stratum = demoStratum(plan.stratum)
    const sigmaV0 = hole.ground.stressAt(depth).effectiveStress
    const sigmaP = hole.ground.preconsolidationAt(depth)!
    const rng = stream(`oedometer:${plan.point}:${sample.identifier}`)
    sample.oedometer = oedometerTest(plan, stratum, sigmaV0, sigmaP, isOrganic(hole.point.intervals, depth), rng)
    sample.remarks = `${sample.remarks} Oedometer specimen from ${round(depth - 0.01, 2)}–${round(depth + 0.01, 2)} m.`
  }
}

// ---------------------------------------------------------------------------
// Piezocone soundings
// ---------------------------------------------------------------------------

export const CPT_AREA_RATIO = 0.8
/** Reading interval and final depth of the soundings, m. */
export const CPT_SPACING = 0.02
export const CPT_FINAL_DEPTH = 22

/** Cone behaviour per stratum: friction ratio Rf (%), pore pressure ratio Bq and the scatter of ln qt. */
const CONE: Record<DemoStratumCode, { rf: number, bq: number, scatter: number }> = {
  MG: { rf: 0.8, bq: 0, scatter: 0.25 },
  CRUST: { rf: 4.2, bq: 0.12, scatter: 0.07 },
  EST: { rf: 1.8, bq: 0.62, scatter: 0.045 },
  GLAC: { rf: 3.6, bq: 0.28, scatter: 0.07 },
  SAND: { rf: 0.5, bq: 0, scatter: 0.1 },
}

/** Relative scatter of Bq along a sounding: thin silt partings and shell bands let some excess pressure drain. */
const BQ_SCATTER = 0.1

/** Correlated unit noise: a first-order autoregressive series with correlation length `length` (m). */
function autocorrelated(rng: Rng, n: number, length: number): Float64Array {
  const phi = Math.exp(-CPT_SPACING / length)
  const innovation = Math.sqrt(1 - phi * phi)
  const out = new Float64Array(n)
  let value = normal(rng)
  for (let i = 0; i < n; i++) {
    value = phi * value + innovation * normal(rng)
    out[i] = value
  }
  return out
}

/** Gaussian smoothing over a few readings: the cone senses a boundary before and after it reaches it. */
function smooth(values: Float64Array, sigmaReadings: number): Float64Array {
  const half = Math.ceil(3 * sigmaReadings)
  const weights: number[] = []
  for (let k = -half; k <= half; k++) weights.push(Math.exp(-0.5 * (k / sigmaReadings) ** 2))
  const n = values.length
  const out = new Float64Array(n)
  for (let i = 0; i < n; i++) {
    let sum = 0
    let wsum = 0
    for (let k = -half; k <= half; k++) {
      const j = i + k
      if (j < 0 || j >= n) continue
      const w = weights[k + half]!
      sum += w * values[j]!
      wsum += w
    }
    out[i] = sum / wsum
  }
  return out
}

/**
 * One sounding: in the clays qt = σv0 + σ'p/0.33 from the true σ'p; high qc in the fill and sand;
 * u2 = u0 + Bq·qnet; fs = Rf·qt. Log-normal autocorrelated scatter, boundaries blurred over a few
 * centimetres, and a few spikes from shells (estuarine clay), gravel (glacial clay) and rubble (fill).
 */
function cptSounding(ground: GroundAt, rng: Rng): CptRecord {
  const n = Math.round(CPT_FINAL_DEPTH / CPT_SPACING)
  const depth: number[] = []
  const lnQt = new Float64Array(n)
  const rf = new Float64Array(n)
  const bq = new Float64Array(n)
  const scatter = new Float64Array(n)
  const codes: DemoStratumCode[] = []
  const sandTop = ground.tops[DEMO_STRATA.length - 1]!
  const fillDensity = uniform(rng, 0.8, 1.2)
  for (let i = 0; i < n; i++) {
    const z = round((i + 1) * CPT_SPACING, 2)
    depth.push(z)
    const stratum = DEMO_STRATA[stratumIndexAt(z, ground.bases)]!
    codes.push(stratum.code)
    const stress = ground.stressAt(z)
    let qt: number
    switch (stratum.code) {
      case 'MG': qt = fillDensity * (6000 + 5000 * Math.min(1, z / 0.8)); break
      case 'SAND': qt = 17000 + 4500 * (z - sandTop); break
      default: qt = stress.totalStress + ground.preconsolidationAt(z)! / DEFAULT_CONE_FACTOR
    }
    lnQt[i] = Math.log(qt)
    rf[i] = CONE[stratum.code].rf
    bq[i] = CONE[stratum.code].bq
    scatter[i] = CONE[stratum.code].scatter
  }
  const lnQtSmooth = smooth(lnQt, 2)
  const rfSmooth = smooth(rf, 3)
  const bqSmooth = smooth(bq, 3)
  const qtNoise = autocorrelated(rng, n, 0.12)
  const fsNoise = autocorrelated(rng, n, 0.08)
  const uNoise = autocorrelated(rng, n, 0.1)
  const bqNoise = autocorrelated(rng, n, 0.3)

  // Spikes: factor on qt and share of the excess pore pressure kept (coarse particles drain).
  const spikeFactor = new Float64Array(n).fill(1)
  const spikeDrain = new Float64Array(n).fill(1)
  const addSpikes = (code: DemoStratumCode, count: number, lo: number, hi: number): void => {
    const rows = codes.map((c, i) => (c === code ? i : -1)).filter(i => i >= 0)
    if (rows.length < 40) return
    for (let s = 0; s < count; s++) {
      const start = rows[Math.floor(uniform(rng, 15, rows.length - 20))]!
      const length = 2 + Math.floor(rng() * 3)
      const factor = uniform(rng, lo, hi)
      for (let k = 0; k < length && start + k < n; k++) {
        spikeFactor[start + k] = factor * (k === 0 || k === length - 1 ? 0.7 : 1)
        spikeDrain[start + k] = 0.3
      }
    }
  }
  addSpikes('MG', 1 + Math.floor(rng() * 2), 1.8, 2.6)
  addSpikes('EST', 3 + Math.floor(rng() * 2), 1.8, 3.0)
  addSpikes('GLAC', 2 + Math.floor(rng() * 2), 1.5, 2.4)

  const qc: number[] = []
  const fs: number[] = []
  const u2: number[] = []
  for (let i = 0; i < n; i++) {
    const z = depth[i]!
    const stress = ground.stressAt(z)
    const qt = Math.exp(lnQtSmooth[i]! + scatter[i]! * qtNoise[i]!) * spikeFactor[i]!
    const qnet = qt - stress.totalStress
    const excess = Math.max(0, bqSmooth[i]! * (1 + BQ_SCATTER * bqNoise[i]!) * qnet) * spikeDrain[i]!
    const u = Math.max(0, stress.porePressure + excess + 2.5 * uNoise[i]!)
    const f = (rfSmooth[i]! / 100) * qt * Math.exp(0.12 * fsNoise[i]!)
    qc.push(Math.round(Math.max(qt - u * (1 - CPT_AREA_RATIO), 1)))
    fs.push(round(Math.max(f, 0.1), 1))
    u2.push(round(u, 1))
  }
  return { areaRatio: CPT_AREA_RATIO, depth, qc, fs, u2 }
}

const CPT_DATES = ['2025-04-07', '2025-04-07', '2025-04-08', '2025-04-08']

function cptPoint(plan: PlannedPoint, index: number): PointRecord {
  const ground = groundAt(plan.easting, plan.northing)
  const date = CPT_DATES[index] ?? '2025-04-08'
  return {
    ...placed(plan, 'cpt', ground),
    finalDepth: CPT_FINAL_DEPTH,
    startedOn: date,
    endedOn: date,
    method: 'Piezocone, 10 cm² cone, pore pressure behind the cone (u2), push rate 20 mm/s',
    loggedBy: GEOLOGIST,
    remarks: `Net area ratio ${CPT_AREA_RATIO}; filter saturated with silicone oil. Sounding stopped at the planned depth.`,
    intervals: [],
    samples: [],
    spt: [],
    groundwater: [],
    cpt: cptSounding(ground, stream(`cpt:${plan.identifier}`)),
    vane: [],
  }
}

// ---------------------------------------------------------------------------
// Field vane profiles
// ---------------------------------------------------------------------------

/**
 * PI used to generate the vane strengths, from the estuarine clay's truth; the same PI read from the index
 * tests gives back σ'p through Bjerrum's μ and Mesri's ratio.
 */
export const ESTUARINE_PLASTICITY_INDEX = demoStratum('EST').index!.liquidLimit - demoStratum('EST').index!.plasticLimit

/** Vane profiles: two holes a day in the second week of April 2025. */
function vaneDate(index: number): string {
  return addDays('2025-04-09', Math.floor(index / 2) + (index >= 6 ? 2 : 0))
}

/**
 * A vane hole: a short log from the push and the arisings, and peak strengths every metre in the estuarine
 * clay, su,FV = 0.22·σ'p/μ(PI) with a few per cent scatter; remoulded strength from a sensitivity of 3–6.
 */
function vanePoint(plan: PlannedPoint, index: number): PointRecord {
  const rng = stream(`vane:${plan.identifier}`)
  const ground = groundAt(plan.easting, plan.northing)
  const estIndex = DEMO_STRATA.findIndex(s => s.code === 'EST')
  const estTop = ground.tops[estIndex]!
  const estBase = ground.bases[estIndex]!
  const finalDepth = round(estBase + 0.2, 2)
  const mu = vaneCorrectionFactor(ESTUARINE_PLASTICITY_INDEX)
  const vane = []
  for (let z = Math.ceil(estTop + 0.6); z <= estBase - 0.5; z += 1) {
    const sigmaP = ground.preconsolidationAt(z)!
    const peak = (MESRI_STRENGTH_RATIO * sigmaP / mu) * Math.exp(0.06 * normal(rng))
    const sensitivity = uniform(rng, ESTUARINE_SENSITIVITY[0], ESTUARINE_SENSITIVITY[1])
    vane.push({ depth: z, peak: round(peak, 1), remoulded: round(peak / sensitivity, 1) })
  }
  const shortLog: Record<'MG' | 'CRUST' | 'EST' | 'GLAC', Facies> = {
    MG: { consistency: 'Dense', colour: 'grey-brown', soil: 'sandy GRAVEL fill', moisture: 'dry to moist', structure: null, uscs: 'GW' },
    CRUST: { consistency: 'Stiff', colour: 'brown mottled grey', soil: 'silty CLAY', moisture: 'moist', structure: null, uscs: 'CL' },
    EST: { consistency: 'Soft', colour: 'grey', soil: 'CLAY with shell fragments', moisture: 'wet', structure: null, uscs: 'CH' },
    GLAC: { consistency: 'Firm to stiff', colour: 'brown-grey', soil: 'gravelly CLAY', moisture: 'moist', structure: null, uscs: 'CL' },
  }
  const intervals: LogIntervalRecord[] = (['MG', 'CRUST', 'EST', 'GLAC'] as const).map((code, i) => ({
    top: ground.tops[i]!,
    bottom: Math.min(ground.bases[i]!, finalDepth),
    description: describeInterval(shortLog[code], code),
    uscs: shortLog[code].uscs,
    stratumCode: code,
    moisture: shortLog[code].moisture,
    consistency: shortLog[code].consistency,
  }))
  const date = vaneDate(index)
  return {
    ...placed(plan, 'borehole', ground),
    finalDepth,
    startedOn: date,
    endedOn: date,
    method: 'Field vane, 65 mm × 130 mm blade, pushed from the base of a pre-bored hole; rotation 6°/min',
    loggedBy: GEOLOGIST,
    remarks: 'Strata from the push resistance and the arisings; pushed to refusal on the glacial clay. Remoulded strength after ten turns.',
    intervals,
    samples: [],
    spt: [],
    groundwater: [],
    cpt: null,
    vane,
  }
}

// ---------------------------------------------------------------------------
// Piezometers
// ---------------------------------------------------------------------------

/** First monthly reading, two weeks after the nest was grouted in. */
const PIEZOMETER_FIRST_READING = '2025-05-06'
/** Monthly readings over 18 months: the first and eighteen more. */
export const PIEZOMETER_READINGS = 19

/**
 * Pore pressure at the tip from the groundwater truth plus the seasons: the water table a little higher in
 * winter (±0.2 m) and the aquifer head lower in late summer when pumping peaks (±0.35 m); linear in between.
 */
function piezometerPoint(plan: PlannedPoint & { tipDepth: number }): PointRecord {
  const rng = stream(`piezometer:${plan.identifier}`)
  const ground = groundAt(plan.easting, plan.northing)
  const sandTop = ground.tops[DEMO_STRATA.length - 1]!
  const baseline = ground.stressAt(plan.tipDepth).porePressure
  const g = GROUNDWATER_TRUTH
  const groundwater: GroundwaterRecord[] = []
  for (let m = 0; m < PIEZOMETER_READINGS; m++) {
    const date = addMonths(PIEZOMETER_FIRST_READING, m)
    const month = Number(date.slice(5, 7))
    const tableRise = 0.2 * Math.cos((2 * Math.PI * (month - 1.5)) / 12)
    const aquiferRise = -0.35 * Math.cos((2 * Math.PI * (month - 8.5)) / 12)
    // Share of the aquifer's head change felt at the tip: none in the hydrostatic zone, all at the sand top.
    const t = Math.min(1, Math.max(0, (plan.tipDepth - g.hydrostaticTo) / (sandTop - g.hydrostaticTo)))
    const seasonal = GAMMA_W * ((1 - t) * tableRise + t * aquiferRise)
    groundwater.push({
      kind: 'piezometer',
      observedAt: at(date, '09:00'),
      depth: null,
      pressure: round(baseline + seasonal + 0.3 * normal(rng), 1),
      remarks: m === 0 ? 'Baseline reading after grouting; logger zeroed at the surface before installation.' : '',
    })
  }
  return {
    ...placed(plan, 'piezometer', ground),
    finalDepth: plan.tipDepth,
    startedOn: '2025-04-22',
    endedOn: '2025-04-22',
    method: 'Vibrating-wire piezometer, fully grouted in a dedicated hole',
    loggedBy: ENGINEER,
    remarks: `Tip at ${plan.tipDepth.toFixed(1)} m; pressure read monthly in kPa.`,
    intervals: [],
    samples: [],
    spt: [],
    groundwater,
    cpt: null,
    vane: [],
  }
}

// ---------------------------------------------------------------------------
// The whole investigation
// ---------------------------------------------------------------------------

/** The demo investigation, identical on every call and every machine (all randomness from seeded streams). */
export function generateDemoInvestigation(): InvestigationRecord {
  const holes = DEMO_BOREHOLES.map(borehole)
  addOedometerTests(holes)
  const points: PointRecord[] = [
    ...holes.map(h => h.point),
    ...DEMO_CPTS.map(cptPoint),
    ...DEMO_VANES.map(vanePoint),
    ...DEMO_PIEZOMETERS.map(piezometerPoint),
  ]
  return {
    project: { jobNumber: DEMO_PROJECT.jobNumber, name: DEMO_PROJECT.name, client: DEMO_PROJECT.client },
    strata: strataRecords(),
    points,
  }
}
