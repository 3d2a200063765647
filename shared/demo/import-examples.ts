/**
 * A log-interval CSV from the demo boreholes with four deliberate logging errors, for showing (and testing)
 * the importer's row-level error report. The rows are the demo's own intervals, so everything else in the
 * file is valid against the demo project's points and final depths.
 */
import { investigationToAgs } from '../ags4/investigation'
import type { InvestigationRecord, LogIntervalRecord, PointRecord } from '../investigation/types'
import { strainPercent } from '../lab/stages'
import { isUscsGroupSymbol } from '../strata/uscs'
import { DEMO_OEDOMETER_PLAN, generateDemoInvestigation, plannedOedometerSample } from './generate'
import { demoStratum } from './site'

export const DEMO_IMPORT_COLUMNS = ['point', 'top', 'bottom', 'description', 'uscs', 'stratum'] as const

export const DEMO_IMPORT_ERROR_KINDS = ['overlapping-interval', 'beyond-final-depth', 'invalid-uscs', 'non-numeric-depth'] as const
export type DemoImportErrorKind = (typeof DEMO_IMPORT_ERROR_KINDS)[number]

export interface DemoImportError {
  /** 1-based row of the file, the header being row 1. */
  row: number
  point: string
  column: 'top' | 'bottom' | 'uscs'
  kind: DemoImportErrorKind
  /** The cell as written in the file. */
  value: string
  description: string
}

export interface DemoImportExample {
  csv: string
  errors: DemoImportError[]
}

/** Boreholes whose logs make up the file. */
const HOLES = ['BH-01', 'BH-02', 'BH-03'] as const

/** CH with its letters swapped, an easy slip when typing logs. */
const INVALID_USCS = 'HC'
/** What a logger leaves in a cell still waiting for the driller's sheet. */
const NON_NUMERIC_DEPTH = 'TBC'
/** How far the faulty interval reaches above the bottom of the one before it, m. */
const OVERLAP = 0.3
/** How far the faulty last interval runs past the hole's final depth, m. */
const OVERRUN = 1.5

/** RFC 4180 quoting: only cells with a comma, quote or line break are quoted, quotes doubled. */
function csvCell(value: string): string {
  return /[",\r\n]/.test(value) ? `"${value.replaceAll('"', '""')}"` : value
}

function depth(value: number): string {
  return value.toFixed(2)
}

interface Row {
  point: string
  top: string
  bottom: string
  description: string
  uscs: string
  stratum: string
}

function rowFrom(point: string, interval: LogIntervalRecord): Row {
  return {
    point,
    top: depth(interval.top),
    bottom: depth(interval.bottom),
    description: interval.description,
    uscs: interval.uscs ?? '',
    stratum: interval.stratumCode ?? '',
  }
}

/** The file and its deliberate errors, built together so the row numbers always match the file. */
export function demoImportExample(record: InvestigationRecord = generateDemoInvestigation()): DemoImportExample {
  const rows: Row[] = []
  const errors: DemoImportError[] = []
  /** File row of the next data row: the header is row 1. */
  const fileRow = (): number => rows.length + 2

  for (const id of HOLES) {
    const point = record.points.find(p => p.identifier === id)
    if (!point) throw new Error(`The demo investigation has no ${id}`)
    const intervals = point.intervals
    intervals.forEach((interval, k) => {
      const row = rowFrom(id, interval)
      const last = k === intervals.length - 1
      if (id === 'BH-01' && interval.stratumCode === 'EST' && intervals[k - 1]?.stratumCode === 'EST' && !errors.some(e => e.kind === 'overlapping-interval')) {
        const previous = intervals[k - 1]!
        row.top = depth(previous.bottom - OVERLAP)
        errors.push({
          row: fileRow(),
          point: id,
          column: 'top',
          kind: 'overlapping-interval',
          value: row.top,
          description: `Top ${row.top} m lies above the bottom of the interval before it (${depth(previous.bottom)} m): the two overlap by ${OVERLAP.toFixed(2)} m.`,
        })
      }
      if (id === 'BH-02' && last) {
        row.bottom = depth(point.finalDepth + OVERRUN)
        errors.push({
          row: fileRow(),
          point: id,
          column: 'bottom',
          kind: 'beyond-final-depth',
          value: row.bottom,
          description: `Bottom ${row.bottom} m is below the final depth of ${id} (${depth(point.finalDepth)} m).`,
        })
      }
      if (id === 'BH-03' && interval.uscs === 'CH' && !errors.some(e => e.kind === 'invalid-uscs')) {
        row.uscs = INVALID_USCS
        errors.push({
          row: fileRow(),
          point: id,
          column: 'uscs',
          kind: 'invalid-uscs',
          value: INVALID_USCS,
          description: `"${INVALID_USCS}" is not a USCS group symbol (CH with its letters swapped).`,
        })
      }
      if (id === 'BH-03' && interval.stratumCode === 'GLAC' && intervals[k - 1]?.stratumCode === 'GLAC' && !errors.some(e => e.kind === 'non-numeric-depth')) {
        row.top = NON_NUMERIC_DEPTH
        errors.push({
          row: fileRow(),
          point: id,
          column: 'top',
          kind: 'non-numeric-depth',
          value: NON_NUMERIC_DEPTH,
          description: `Top "${NON_NUMERIC_DEPTH}" is not a depth in metres.`,
        })
      }
      rows.push(row)
    })
  }
  if (errors.length !== DEMO_IMPORT_ERROR_KINDS.length || isUscsGroupSymbol(INVALID_USCS)) {
    throw new Error('The demo import example lost one of its deliberate errors.')
  }
  const lines = [DEMO_IMPORT_COLUMNS.join(',')]
  for (const r of rows) lines.push([r.point, r.top, r.bottom, r.description, r.uscs, r.stratum].map(csvCell).join(','))
  return { csv: `${lines.join('\n')}\n`, errors }
}

/** The CSV text: a header row and the demo boreholes' intervals, with the four errors of `demoImportErrors`. */
export function demoImportCsv(): string {
  return demoImportExample().csv
}

/** Each deliberate error of `demoImportCsv` with its 1-based file row (header = row 1). */
export function demoImportErrors(): DemoImportError[] {
  return demoImportExample().errors
}

/**
 * The AGS4 example for the import page: BH-01 and BH-02 of the demo site with
 * two deliberate logging errors — an interval of BH-01 starting 0.30 m inside
 * the one above it, and BH-02's last interval ending 1.5 m below the hole.
 * docs/examples/saltmarsh-lane-with-errors.ags is this text.
 */
export function demoImportAgs(): string {
  const d = generateDemoInvestigation()
  const pick = d.points
    .filter(p => p.identifier === 'BH-01' || p.identifier === 'BH-02')
    .map(p => ({ ...p, samples: p.samples.map(s => ({ ...s, oedometer: null })), cpt: null, intervals: [...p.intervals] }))
  const [bh1, bh2] = pick as [PointRecord, PointRecord]
  bh1.intervals[3] = { ...bh1.intervals[3]!, top: Math.round((bh1.intervals[3]!.top - 0.3) * 100) / 100 }
  const last = bh2.intervals.length - 1
  bh2.intervals[last] = { ...bh2.intervals[last]!, bottom: bh2.finalDepth + 1.5 }
  return investigationToAgs({ ...d, points: pick }, {
    producedOn: '2025-06-02',
    producer: 'Pastload demo',
    recipient: 'Saltmarsh Lane project team',
    description: 'BH-01 and BH-02 with two deliberate logging errors',
  })
}

/** The demo test the stages example belongs to: the crust tube of BH-05. */
export const DEMO_STAGES_TEST = { point: 'BH-05', stratum: 'CRUST' } as const
export const DEMO_STAGES_COLUMNS = ['stage', 'effective stress (kPa)', 'strain (%)'] as const

/**
 * The laboratory's reissued stage sheet for the BH-05 crust test: the demo curve as vertical strain in %
 * of the initial height (ε = 100·(e0 − e)/(1 + e0)), with one final unloading stage to a quarter of the
 * last load that the first issue left out, swelling along the crust's Cr of the demo ground model.
 * docs/examples/saltmarsh-lane-oedometer-stages.csv is this text.
 */
export function demoStagesExample(record: InvestigationRecord = generateDemoInvestigation()): { csv: string, sample: string, e0: number, stages: { stress: number, strain: number }[] } {
  const plan = DEMO_OEDOMETER_PLAN.find(p => p.point === DEMO_STAGES_TEST.point && p.stratum === DEMO_STAGES_TEST.stratum)!
  const sample = plannedOedometerSample(record, plan)
  const test = sample?.oedometer
  if (!sample || !test) throw new Error('The demo investigation has no oedometer test on the BH-05 crust tube.')
  const e0 = test.e0
  const last = test.stages[test.stages.length - 1]!
  const unload = { stress: last.stress / 4, voidRatio: last.voidRatio + demoStratum('CRUST').compressibility!.cr * Math.log10(4) }
  const stages = [...test.stages, unload].map(s => ({ stress: s.stress, strain: Math.round(strainPercent(s.voidRatio, e0) * 1000) / 1000 }))
  const lines = [DEMO_STAGES_COLUMNS.join(','), ...stages.map((s, i) => `${i + 1},${s.stress},${s.strain.toFixed(3)}`)]
  return { csv: `${lines.join('\n')}\n`, sample: sample.identifier, e0, stages }
}
