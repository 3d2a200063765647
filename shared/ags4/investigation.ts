/**
 * Maps AGS4 files to Pastload's investigation model and back.
 *
 * Choices a reader of an exported file should know:
 * - Stratum code ↔ GEOL_GEOL (geology code; ABBR gives the stratum name).
 *   USCS group symbol ↔ GEOL_GEO2 (second geology code; ABBR says it is a
 *   USCS symbol); on import GEOL_GEO2 is taken only when it is a valid USCS
 *   symbol. GEOL_LEG (the AGS legend code) is neither written nor read.
 * - What the standard has no heading for goes into user-defined headings and
 *   one user-defined group, declared in DICT as rule 18 asks: PSTR (strata:
 *   unit weights and display), LOCA_METH and LOCA_LOGB (method, logged by),
 *   GEOL_MOIS and GEOL_CNSY (moisture, consistency).
 * - SPT ↔ ISPT's standard fields: ISPT_SEAT and ISPT_MAIN (blows of the seating and
 *   test drives), ISPT_NPEN (their penetration together), ISPT_NVAL (N, empty when the
 *   test drive stopped short), ISPT_REP (the blows as written), and each increment in
 *   ISPT_INC1–2 / ISPT_PEN1–2 (seating) and ISPT_INC3–6 / ISPT_PEN3–6 (test drive).
 *   Files from older Pastload versions with ISPT_TST1 and ISPT_TST2 (blows of each
 *   150 mm of the test drive) are still read.
 * - Groundwater: strikes ↔ WSTG; standing levels ↔ MOND readings WDEP under a
 *   MONG point of type SWL; piezometer readings ↔ MOND PRES (and WDEP) under a
 *   MONG point of type PIEZ. On import WSTD's later levels become standing levels.
 * - Date-times are written in UTC ('yyyy-mm-ddThh:mm:ssZ', to the second).
 */
import { isUscsGroupSymbol } from '../geotech/plasticity'
import { parseSptBlows, SPT_INCREMENT_MM, SPT_SEATING_MM, SPT_TEST_MM, sptBlowsText, sptFromIncrements, sptFromStored, sptStored, type SptBlows } from '../investigation/spt-blows'
import type {
  CptRecord,
  GroundwaterRecord,
  IndexTestRecord,
  InvestigationRecord,
  LogIntervalRecord,
  OedometerStageRecord,
  OedometerTestRecord,
  PointRecord,
  ProjectRecord,
  SampleRecord,
  SptRecord,
  StratumRecord,
  VaneRecord,
} from '../investigation/types'
import { readTransferSettings } from './check'
import {
  describeType,
  LOCA_TYPES,
  locaTypeFor,
  OTHER_CODES,
  PIEZOMETER_MONG_TYPE,
  PIEZOMETER_MONG_TYPES,
  SAMP_TYPES,
  SAMPLE_TYPE_CODES,
  STANDING_LEVEL_MONG_TYPE,
  UNIT_DESCRIPTIONS,
  USCS_NAMES,
} from './codes'
import { isAgsNumber } from './datatypes'
import { standardDictionary } from './dictionary'
import type { AgsFile, AgsGroup, AgsIssue, AgsRow, AgsValue, AgsWritableGroup } from './types'
import { clean, GRAVITY, INTERNAL_UNITS, unitFactor } from './units'
import type { Quantity } from './units'
import { collectUsedDefinitions, writeAgs } from './write'

interface Column {
  heading: string
  type: string
  unit: string
}

function col(heading: string, type: string, unit = ''): Column {
  return { heading, type, unit }
}

const DATE_TIME_UNIT = 'yyyy-mm-ddThh:mm:ssZ'
const SAMPLE_KEYS = [col('LOCA_ID', 'ID'), col('SAMP_TOP', '2DP', 'm'), col('SAMP_REF', 'X'), col('SAMP_TYPE', 'PA'), col('SAMP_ID', 'ID')]
const SPECIMEN_KEYS = [...SAMPLE_KEYS, col('SPEC_REF', 'X'), col('SPEC_DPTH', '2DP', 'm')]

/** Columns written per group, in dictionary order with user-defined headings last (rules 7 and 9). */
const COLUMNS = {
  PROJ: [col('PROJ_ID', 'ID'), col('PROJ_NAME', 'X'), col('PROJ_CLNT', 'X')],
  TRAN: [col('TRAN_ISNO', 'X'), col('TRAN_DATE', 'DT', 'yyyy-mm-dd'), col('TRAN_PROD', 'X'), col('TRAN_STAT', 'X'), col('TRAN_DESC', 'X'), col('TRAN_AGS', 'X'), col('TRAN_RECV', 'X'), col('TRAN_DLIM', 'X'), col('TRAN_RCON', 'X')],
  UNIT: [col('UNIT_UNIT', 'X'), col('UNIT_DESC', 'X')],
  TYPE: [col('TYPE_TYPE', 'X'), col('TYPE_DESC', 'X')],
  ABBR: [col('ABBR_HDNG', 'X'), col('ABBR_CODE', 'X'), col('ABBR_DESC', 'X'), col('ABBR_LIST', 'X')],
  DICT: [col('DICT_TYPE', 'PA'), col('DICT_GRP', 'X'), col('DICT_HDNG', 'X'), col('DICT_STAT', 'PA'), col('DICT_DTYP', 'PT'), col('DICT_DESC', 'X'), col('DICT_UNIT', 'PU'), col('DICT_PGRP', 'X')],
  PSTR: [col('PSTR_CODE', 'X'), col('PSTR_NAME', 'X'), col('PSTR_DESC', 'X'), col('PSTR_COLR', 'X'), col('PSTR_PATN', 'X'), col('PSTR_UWT', '2DP', 'kN/m3'), col('PSTR_UWTS', '2DP', 'kN/m3'), col('PSTR_ORDR', '0DP')],
  LOCA: [col('LOCA_ID', 'ID'), col('LOCA_TYPE', 'PA'), col('LOCA_NATE', '2DP', 'm'), col('LOCA_NATN', '2DP', 'm'), col('LOCA_GL', '2DP', 'm'), col('LOCA_REM', 'X'), col('LOCA_FDEP', '2DP', 'm'), col('LOCA_STAR', 'DT', 'yyyy-mm-dd'), col('LOCA_ENDD', 'DT', 'yyyy-mm-dd'), col('LOCA_METH', 'X'), col('LOCA_LOGB', 'X')],
  GEOL: [col('LOCA_ID', 'ID'), col('GEOL_TOP', '2DP', 'm'), col('GEOL_BASE', '2DP', 'm'), col('GEOL_DESC', 'X'), col('GEOL_GEOL', 'PA'), col('GEOL_GEO2', 'PA'), col('GEOL_MOIS', 'X'), col('GEOL_CNSY', 'X')],
  SAMP: [...SAMPLE_KEYS, col('SAMP_BASE', '2DP', 'm'), col('SAMP_RECV', '0DP', '%'), col('SAMP_REM', 'X')],
  LNMC: [...SPECIMEN_KEYS, col('LNMC_MC', '1DP', '%')],
  LLPL: [...SPECIMEN_KEYS, col('LLPL_LL', '0DP', '%'), col('LLPL_PL', '0DP', '%')],
  LDEN: [...SPECIMEN_KEYS, col('LDEN_BDEN', '3DP', 'Mg/m3')],
  CONG: [...SPECIMEN_KEYS, col('CONG_TYPE', 'PA'), col('CONG_HIGT', '2DP', 'mm'), col('CONG_MCI', '1DP', '%'), col('CONG_PDEN', '2DP', 'Mg/m3'), col('CONG_IVR', '3DP'), col('CONG_REM', 'X')],
  CONS: [...SPECIMEN_KEYS, col('CONS_INCN', 'X'), col('CONS_IVR', '3DP'), col('CONS_INCF', '1DP', 'kPa'), col('CONS_INCE', '3DP')],
  ISPT: [
    col('LOCA_ID', 'ID'), col('ISPT_TOP', '2DP', 'm'), col('ISPT_SEAT', '0DP'), col('ISPT_MAIN', '0DP'), col('ISPT_NPEN', '0DP', 'mm'), col('ISPT_NVAL', '0DP'), col('ISPT_REP', 'X'),
    ...[1, 2, 3, 4, 5, 6].map(i => col(`ISPT_INC${i}`, '0DP')), ...[1, 2, 3, 4, 5, 6].map(i => col(`ISPT_PEN${i}`, '0DP', 'mm')),
  ],
  WSTG: [col('LOCA_ID', 'ID'), col('WSTG_DPTH', '2DP', 'm'), col('WSTG_DTIM', 'DT', DATE_TIME_UNIT), col('WSTG_REM', 'X')],
  MONG: [col('LOCA_ID', 'ID'), col('MONG_ID', 'X'), col('MONG_DIS', '2DP', 'm'), col('MONG_TYPE', 'PA')],
  MOND: [col('LOCA_ID', 'ID'), col('MONG_ID', 'X'), col('MONG_DIS', '2DP', 'm'), col('MOND_DTIM', 'DT', DATE_TIME_UNIT), col('MOND_TYPE', 'PA'), col('MOND_REF', 'X'), col('MOND_RDNG', 'XN'), col('MOND_UNIT', 'PU'), col('MOND_REM', 'X')],
  SCPG: [col('LOCA_ID', 'ID'), col('SCPG_TESN', 'X'), col('SCPG_CAR', '3DP')],
  SCPT: [col('LOCA_ID', 'ID'), col('SCPG_TESN', 'X'), col('SCPT_DPTH', '2DP', 'm'), col('SCPT_RES', '3DP', 'MPa'), col('SCPT_FRES', '4DP', 'MPa'), col('SCPT_PWP2', '4DP', 'MPa')],
  IVAN: [col('LOCA_ID', 'ID'), col('IVAN_DPTH', '2DP', 'm'), col('IVAN_TESN', 'X'), col('IVAN_IVAN', 'XN', 'kPa'), col('IVAN_IVAR', 'XN', 'kPa')],
} satisfies Record<string, Column[]>

type GroupName = keyof typeof COLUMNS

/** Headings the reader also understands besides the written ones. */
const READ_ALSO: Partial<Record<GroupName, readonly string[]>> = {
  LOCA: ['LOCA_LOCX', 'LOCA_LOCY', 'LOCA_LOCZ'],
  ISPT: ['ISPT_TST1', 'ISPT_TST2'],
  CONG: ['CONG_METH'],
}

/** Groups the importer reads besides COLUMNS: WSTD's later water levels. */
const WSTD_HEADINGS = ['LOCA_ID', 'WSTG_DPTH', 'WSTD_NMIN', 'WSTD_POST', 'WSTD_REM']
const DEFINITION_GROUPS = new Set(['PROJ', 'TRAN', 'UNIT', 'TYPE', 'ABBR', 'DICT'])
const MAPPED_GROUPS = new Set<string>([...Object.keys(COLUMNS), 'WSTD'])

const USER_GROUP = { name: 'PSTR', description: 'Pastload stratum definitions: unit weights and display', parent: '-' }

/** User-defined headings, declared in DICT (rule 18) with these statuses and descriptions. */
const USER_HEADINGS: Readonly<Record<string, { status: string, description: string }>> = {
  'PSTR.PSTR_CODE': { status: 'KEY', description: 'Stratum code, as used in GEOL_GEOL' },
  'PSTR.PSTR_NAME': { status: 'OTHER', description: 'Stratum name' },
  'PSTR.PSTR_DESC': { status: 'OTHER', description: 'Stratum description' },
  'PSTR.PSTR_COLR': { status: 'OTHER', description: 'Display colour key' },
  'PSTR.PSTR_PATN': { status: 'OTHER', description: 'Display pattern key' },
  'PSTR.PSTR_UWT': { status: 'OTHER', description: 'Bulk unit weight above the water table' },
  'PSTR.PSTR_UWTS': { status: 'OTHER', description: 'Saturated unit weight below the water table' },
  'PSTR.PSTR_ORDR': { status: 'OTHER', description: 'Display order' },
  'LOCA.LOCA_METH': { status: 'OTHER', description: 'Drilling or testing method as logged' },
  'LOCA.LOCA_LOGB': { status: 'OTHER', description: 'Logged by' },
  'GEOL.GEOL_MOIS': { status: 'OTHER', description: 'Moisture condition' },
  'GEOL.GEOL_CNSY': { status: 'OTHER', description: 'Consistency or relative density' },
}

// ─── Import ──────────────────────────────────────────────────────────────────

export interface AgsImportOptions {
  /**
   * Offset ('Z', '+01:00' …) given to date-times the file writes without one.
   * Without it such times stay without an offset, and each column says so.
   */
  timeZone?: string
}

export interface AgsImportResult {
  data: InvestigationRecord
  /** What could not be read as it stands, or was read with an assumption; rule 'import'. */
  issues: AgsIssue[]
  /** Groups Pastload does not map, in file order; their rows are in rawGroups, nothing is dropped silently. */
  unknownGroups: string[]
  rawGroups: AgsGroup[]
  /** GEOL_GEOL codes with no PSTR definition: Pastload needs their unit weights before they can be used. */
  undefinedStrata: { code: string, name: string }[]
}

const QUANTITY_NAMES: Readonly<Record<Quantity, string>> = {
  length: 'length',
  stress: 'stress or pressure',
  percent: 'percentage',
  unitWeight: 'unit weight',
  density: 'density',
  ratio: 'dimensionless ratio',
  count: 'count',
  minutes: 'time',
}

let dictionaryUnits: Map<string, string> | null = null

/** The dictionary unit of a heading, assumed when a file leaves the unit blank. */
function dictionaryUnit(group: string, heading: string): string {
  if (!dictionaryUnits) {
    dictionaryUnits = new Map()
    for (const definition of standardDictionary().groups.values()) {
      for (const h of definition.headings.values()) dictionaryUnits.set(`${definition.name}.${h.name}`, h.unit)
    }
    for (const [name, columns] of Object.entries(COLUMNS)) {
      for (const c of columns) if (!dictionaryUnits.has(`${name}.${c.heading}`)) dictionaryUnits.set(`${name}.${c.heading}`, c.unit)
    }
  }
  return dictionaryUnits.get(`${group}.${heading}`) ?? ''
}

/** Collects import findings, merging repeats of one kind into a single finding with a count. */
class Findings {
  private readonly merged = new Map<string, { issue: AgsIssue, count: number }>()

  add(key: string, issue: Omit<AgsIssue, 'rule'>): void {
    const entry = this.merged.get(key)
    if (entry) entry.count++
    else this.merged.set(key, { issue: { rule: 'import', ...issue }, count: 1 })
  }

  list(): AgsIssue[] {
    return [...this.merged.values()].map(({ issue, count }) => (count > 1 ? { ...issue, message: `${issue.message} (${count} rows; the first at line ${issue.line})` } : issue))
  }
}

class Reader {
  readonly findings = new Findings()
  readonly concatenator: string
  private readonly abbreviations = new Map<string, string>()

  constructor(readonly file: AgsFile, readonly options: AgsImportOptions) {
    this.concatenator = readTransferSettings(this.first('TRAN')).concatenator
    for (const { row } of this.rows('ABBR')) this.abbreviations.set(`${row.values.ABBR_HDNG ?? ''}\u0000${row.values.ABBR_CODE ?? ''}`, row.values.ABBR_DESC ?? '')
  }

  first(name: string): AgsGroup | undefined {
    return this.file.groups.find(g => g.name === name)
  }

  rows(name: string): { group: AgsGroup, row: AgsRow }[] {
    return this.file.groups.filter(g => g.name === name).flatMap(group => group.rows.map(row => ({ group, row })))
  }

  abbreviation(heading: string, code: string): string | undefined {
    return this.abbreviations.get(`${heading}\u0000${code}`)
  }

  note(key: string, group: AgsGroup, line: number, severity: 'error' | 'warning', message: string): void {
    this.findings.add(key, { line, group: group.name, severity, message })
  }

  text(row: AgsRow, heading: string): string {
    return row.values[heading] ?? ''
  }

  unitOf(group: AgsGroup, heading: string): string {
    const index = group.headings.indexOf(heading)
    return index < 0 ? '' : group.units[index] ?? ''
  }

  /** Factor from the file's unit to Pastload's; null (and a finding) when the unit is not one Pastload reads for that quantity. */
  factor(group: AgsGroup, line: number, heading: string, quantity: Quantity, stated: string): number | null {
    let unit = stated
    if (stated === '' && INTERNAL_UNITS[quantity] !== '') {
      unit = dictionaryUnit(group.name, heading) || INTERNAL_UNITS[quantity]
      this.note(`no-unit:${group.name}:${heading}`, group, line, 'warning', `${heading} has no unit in the file; it was read in ${unit}, its dictionary unit`)
    }
    const factor = unitFactor(quantity, unit)
    if (factor === null) {
      this.note(`unit:${group.name}:${heading}:${stated}`, group, line, 'error', `${heading} is in ${JSON.stringify(stated)}, which Pastload does not read as a ${QUANTITY_NAMES[quantity]}; those values were not imported`)
    }
    return factor
  }

  /** A number in Pastload's internal unit, or null when empty or unreadable (with a finding). */
  number(group: AgsGroup, row: AgsRow, heading: string, quantity: Quantity, statedUnit?: string): number | null {
    const raw = this.text(row, heading).trim()
    if (raw === '') return null
    if (!isAgsNumber(raw)) {
      this.note(`nan:${group.name}:${heading}`, group, row.line, 'error', `${heading} ${JSON.stringify(raw)} is not a number, so it was not imported`)
      return null
    }
    const factor = this.factor(group, row.line, heading, quantity, statedUnit ?? this.unitOf(group, heading))
    if (factor === null) return null
    return factor === 1 ? Number(raw) : clean(Number(raw) * factor)
  }

  /** A calendar date (YYYY-MM-DD) from an ISO date, an ISO date-time, or a dd/mm/yyyy unit. */
  date(group: AgsGroup, row: AgsRow, heading: string): string | null {
    const raw = this.text(row, heading).trim()
    if (raw === '') return null
    const iso = /^(\d{4}-\d{2}-\d{2})(?:T.*)?$/.exec(raw)
    if (iso?.[1]) return iso[1]
    const british = /^(\d{2})\/(\d{2})\/(\d{4})$/.exec(raw)
    if (british && this.unitOf(group, heading) === 'dd/mm/yyyy') return `${british[3]}-${british[2]}-${british[1]}`
    this.note(`date:${group.name}:${heading}`, group, row.line, 'error', `${heading} ${JSON.stringify(raw)} is not a date Pastload reads; left empty`)
    return null
  }

  /** An ISO 8601 date-time, keeping the file's offset; a missing time or offset is a finding. */
  dateTime(group: AgsGroup, row: AgsRow, heading: string): string | null {
    const raw = this.text(row, heading).trim()
    if (raw === '') return null
    const m = /^(\d{4}-\d{2}-\d{2})(?:T(\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?)?\s*(Z|[+-]\d{2}:?\d{2})?$/.exec(raw)
    if (!m) {
      this.note(`datetime:${group.name}:${heading}`, group, row.line, 'error', `${heading} ${JSON.stringify(raw)} is not an ISO 8601 date-time; not imported`)
      return null
    }
    const [, day, hh, mm, ss, fraction, zone] = m
    if (hh === undefined) this.note(`no-time:${group.name}:${heading}`, group, row.line, 'warning', `${heading} gives a date without a time; 00:00 was used`)
    let offset = zone === undefined ? undefined : zone === 'Z' ? 'Z' : `${zone.slice(0, 3)}:${zone.slice(-2)}`
    if (offset === undefined) {
      offset = this.options.timeZone ?? ''
      this.note(`no-offset:${group.name}:${heading}`, group, row.line, 'warning', this.options.timeZone === undefined
        ? `${heading} gives no time zone; the times were kept without one and need one before they can be saved`
        : `${heading} gives no time zone; ${this.options.timeZone} was used as asked`)
    }
    return `${day}T${hh ?? '00'}:${mm ?? '00'}:${ss ?? '00'}${fraction ?? ''}${offset}`
  }
}

interface SampleEntry {
  sample: SampleRecord
  point: PointRecord
}

/**
 * Reads an AGS4 file into the investigation model. Values are converted from
 * the units the file states (m, mm, MPa, kPa, % …) into Pastload's; a unit it
 * does not know is reported and the value left out, never guessed. Run
 * checkAgs as well for the format's own rules.
 */
export function agsToInvestigation(file: AgsFile, options: AgsImportOptions = {}): AgsImportResult {
  const reader = new Reader(file, options)
  const project = readProject(reader)
  const strata = readStrata(reader)
  const points = readPoints(reader)
  readIntervals(reader, points)
  const samples = readSamples(reader, points)
  readIndexTests(reader, samples)
  readOedometers(reader, samples)
  readSpt(reader, points)
  readGroundwater(reader, points)
  readCpt(reader, points)
  readVanes(reader, points)
  for (const point of points.values()) finishPoint(reader, point)
  reportUnusedHeadings(reader)

  const rawGroups = file.groups.filter(g => !MAPPED_GROUPS.has(g.name) && !DEFINITION_GROUPS.has(g.name))
  const unknownGroups = [...new Set(rawGroups.map(g => g.name))]
  const defined = new Set(strata.map(s => s.code))
  const undefinedStrata: { code: string, name: string }[] = []
  for (const point of points.values()) {
    for (const interval of point.intervals) {
      const code = interval.stratumCode
      if (code === null || defined.has(code)) continue
      defined.add(code)
      undefinedStrata.push({ code, name: reader.abbreviation('GEOL_GEOL', code) ?? code })
    }
  }
  return { data: { project, strata, points: [...points.values()] }, issues: reader.findings.list(), unknownGroups, rawGroups, undefinedStrata }
}

function readProject(reader: Reader): ProjectRecord {
  const entry = reader.rows('PROJ')[0]
  if (!entry) return { jobNumber: '', name: '', client: '' }
  return { jobNumber: reader.text(entry.row, 'PROJ_ID'), name: reader.text(entry.row, 'PROJ_NAME'), client: reader.text(entry.row, 'PROJ_CLNT') }
}

function readStrata(reader: Reader): StratumRecord[] {
  const strata: StratumRecord[] = []
  for (const { group, row } of reader.rows('PSTR')) {
    const code = reader.text(row, 'PSTR_CODE')
    const unitWeight = reader.number(group, row, 'PSTR_UWT', 'unitWeight')
    const unitWeightSaturated = reader.number(group, row, 'PSTR_UWTS', 'unitWeight')
    if (code === '' || unitWeight === null || unitWeightSaturated === null) {
      reader.note('stratum-incomplete', group, row.line, 'error', 'a PSTR row without its code or both unit weights was not imported')
      continue
    }
    strata.push({
      code,
      name: reader.text(row, 'PSTR_NAME'),
      description: reader.text(row, 'PSTR_DESC'),
      colour: reader.text(row, 'PSTR_COLR'),
      pattern: reader.text(row, 'PSTR_PATN'),
      unitWeight,
      unitWeightSaturated,
      displayOrder: reader.number(group, row, 'PSTR_ORDR', 'count') ?? strata.length,
    })
  }
  return strata
}

function readPoints(reader: Reader): Map<string, PointRecord> {
  const points = new Map<string, PointRecord>()
  const coneHoles = new Set(reader.rows('SCPT').map(({ row }) => reader.text(row, 'LOCA_ID')))
  for (const { group, row } of reader.rows('LOCA')) {
    const identifier = reader.text(row, 'LOCA_ID')
    if (identifier === '') {
      reader.note('loca-no-id', group, row.line, 'error', 'a LOCA row without LOCA_ID was not imported')
      continue
    }
    if (points.has(identifier)) {
      reader.note('loca-repeat', group, row.line, 'error', `LOCA_ID ${identifier} appears twice; the later row was not imported`)
      continue
    }
    const code = reader.text(row, 'LOCA_TYPE')
    const parts = code.split(reader.concatenator).filter(part => part !== '')
    const known = parts.map(part => LOCA_TYPES[part]).find(meaning => meaning !== undefined)
    let kind = known?.value ?? 'borehole'
    if (!known) {
      if (coneHoles.has(identifier)) kind = 'cpt'
      const shown = code === '' ? 'no LOCA_TYPE' : `LOCA_TYPE ${JSON.stringify(code)}, which Pastload does not know,`
      reader.note(`loca-type:${code}`, group, row.line, 'warning', `${identifier} has ${shown} so it was read as a ${kind === 'cpt' ? 'CPT (it has SCPT data)' : 'borehole'}`)
    }
    const method = group.headings.includes('LOCA_METH')
      ? reader.text(row, 'LOCA_METH')
      : parts.map(part => reader.abbreviation('LOCA_TYPE', part) ?? LOCA_TYPES[part]?.description ?? part).join(' + ')
    const located = (national: string, local: string, what: string): number => {
      const value = reader.number(group, row, national, 'length')
      if (value !== null) return value
      const fallback = reader.number(group, row, local, 'length')
      if (fallback !== null) {
        reader.note(`local:${national}`, group, row.line, 'warning', `${identifier} has no ${national}; ${local} (local grid) was used for the ${what}`)
        return fallback
      }
      reader.note(`missing:${national}`, group, row.line, 'warning', `${identifier} has no ${national}; the ${what} was set to 0 and must be corrected`)
      return 0
    }
    points.set(identifier, {
      identifier,
      kind,
      easting: located('LOCA_NATE', 'LOCA_LOCX', 'easting'),
      northing: located('LOCA_NATN', 'LOCA_LOCY', 'northing'),
      groundElevation: located('LOCA_GL', 'LOCA_LOCZ', 'ground elevation'),
      finalDepth: reader.number(group, row, 'LOCA_FDEP', 'length') ?? Number.NaN,
      startedOn: reader.date(group, row, 'LOCA_STAR'),
      endedOn: reader.date(group, row, 'LOCA_ENDD'),
      method,
      loggedBy: reader.text(row, 'LOCA_LOGB'),
      remarks: reader.text(row, 'LOCA_REM'),
      intervals: [],
      samples: [],
      spt: [],
      groundwater: [],
      cpt: null,
      vane: [],
    })
  }
  return points
}

/** The point a row belongs to; a row naming a LOCA_ID missing from LOCA is reported, not dropped silently. */
function pointOf(reader: Reader, points: Map<string, PointRecord>, group: AgsGroup, row: AgsRow): PointRecord | null {
  const identifier = reader.text(row, 'LOCA_ID')
  const point = points.get(identifier)
  if (!point) reader.note(`orphan:${group.name}:${identifier}`, group, row.line, 'error', `${group.name} rows name LOCA_ID ${JSON.stringify(identifier)}, which is not in LOCA; they were not imported`)
  return point ?? null
}

function readIntervals(reader: Reader, points: Map<string, PointRecord>): void {
  for (const { group, row } of reader.rows('GEOL')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const top = reader.number(group, row, 'GEOL_TOP', 'length')
    const bottom = reader.number(group, row, 'GEOL_BASE', 'length')
    if (top === null || bottom === null) {
      reader.note('geol-depth', group, row.line, 'error', 'a GEOL row without GEOL_TOP and GEOL_BASE was not imported')
      continue
    }
    const geo2 = reader.text(row, 'GEOL_GEO2')
    const uscs = isUscsGroupSymbol(geo2) ? geo2 : null
    if (geo2 !== '' && uscs === null) {
      reader.note(`geo2:${geo2}`, group, row.line, 'warning', `GEOL_GEO2 ${JSON.stringify(geo2)} is not a USCS group symbol; Pastload reads USCS symbols only from it, so the USCS field was left empty`)
    }
    const interval: LogIntervalRecord = {
      top,
      bottom,
      description: reader.text(row, 'GEOL_DESC'),
      uscs,
      stratumCode: reader.text(row, 'GEOL_GEOL') || null,
      moisture: reader.text(row, 'GEOL_MOIS') || null,
      consistency: reader.text(row, 'GEOL_CNSY') || null,
    }
    point.intervals.push(interval)
  }
}

function sampleKey(locaId: string, top: number | null, ref: string, type: string, id: string): string {
  return [locaId, top === null ? '' : String(top), ref, type, id].join('\u0000')
}

function rowSampleKey(reader: Reader, group: AgsGroup, row: AgsRow): string {
  return sampleKey(reader.text(row, 'LOCA_ID'), reader.number(group, row, 'SAMP_TOP', 'length'), reader.text(row, 'SAMP_REF'), reader.text(row, 'SAMP_TYPE'), reader.text(row, 'SAMP_ID'))
}

interface SampleIndex {
  entries: Map<string, SampleEntry>
  /** Keys of samples read but not kept (a type Pastload has no use for), so their tests are not reported twice. */
  skipped: Set<string>
}

function readSamples(reader: Reader, points: Map<string, PointRecord>): SampleIndex {
  const index: SampleIndex = { entries: new Map(), skipped: new Set() }
  for (const { group, row } of reader.rows('SAMP')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const key = rowSampleKey(reader, group, row)
    const code = reader.text(row, 'SAMP_TYPE')
    const meaning = SAMP_TYPES[code]
    if (!meaning) {
      index.skipped.add(key)
      const described = reader.abbreviation('SAMP_TYPE', code)
      reader.note(`samp-type:${code}`, group, row.line, 'warning', `samples of SAMP_TYPE ${JSON.stringify(code)}${described ? ` (${described})` : ''} are not a soil sample type Pastload keeps; they and their tests were not imported`)
      continue
    }
    if (meaning.note) reader.note(`samp-note:${code}`, group, row.line, 'warning', meaning.note)
    const top = reader.number(group, row, 'SAMP_TOP', 'length')
    if (top === null) {
      index.skipped.add(key)
      reader.note('samp-top', group, row.line, 'error', 'a SAMP row without SAMP_TOP was not imported')
      continue
    }
    let bottom = reader.number(group, row, 'SAMP_BASE', 'length')
    if (bottom === null) {
      reader.note('samp-base', group, row.line, 'warning', 'a sample without SAMP_BASE was given its top depth as its base')
      bottom = top
    }
    let identifier = reader.text(row, 'SAMP_REF') || reader.text(row, 'SAMP_ID')
    if (identifier === '') {
      identifier = `${code} ${top}`
      reader.note('samp-ref', group, row.line, 'warning', 'a sample without SAMP_REF or SAMP_ID was named from its type and depth')
    }
    const sample: SampleRecord = {
      identifier,
      top,
      bottom,
      type: meaning.value,
      recovery: reader.number(group, row, 'SAMP_RECV', 'percent'),
      remarks: reader.text(row, 'SAMP_REM'),
      index: null,
      oedometer: null,
    }
    if (index.entries.has(key)) {
      reader.note('samp-repeat', group, row.line, 'error', 'a SAMP row repeating the key fields of another was not imported')
      continue
    }
    index.entries.set(key, { sample, point })
    point.samples.push(sample)
  }
  return index
}

/** The sample a test row belongs to, by its five sample key fields. */
function sampleOf(reader: Reader, samples: SampleIndex, group: AgsGroup, row: AgsRow): SampleRecord | null {
  const key = rowSampleKey(reader, group, row)
  const entry = samples.entries.get(key)
  if (!entry && !samples.skipped.has(key)) reader.note(`no-sample:${group.name}`, group, row.line, 'error', `${group.name} rows whose sample is not in SAMP were not imported`)
  return entry?.sample ?? null
}

function readIndexTests(reader: Reader, samples: SampleIndex): void {
  const seen = new Set<string>()
  const indexOf = (sample: SampleRecord): IndexTestRecord => {
    sample.index ??= { waterContent: null, liquidLimit: null, plasticLimit: null, bulkUnitWeight: null }
    return sample.index
  }
  const once = (group: AgsGroup, row: AgsRow, sample: SampleRecord): boolean => {
    const key = `${group.name}\u0000${rowSampleKey(reader, group, row)}`
    if (seen.has(key)) {
      reader.note(`specimens:${group.name}`, group, row.line, 'warning', `samples with more than one ${group.name} specimen: only the first was imported (${sample.identifier})`)
      return false
    }
    seen.add(key)
    return true
  }
  for (const { group, row } of reader.rows('LNMC')) {
    const sample = sampleOf(reader, samples, group, row)
    if (!sample || !once(group, row, sample)) continue
    indexOf(sample).waterContent = reader.number(group, row, 'LNMC_MC', 'percent')
  }
  for (const { group, row } of reader.rows('LLPL')) {
    const sample = sampleOf(reader, samples, group, row)
    if (!sample || !once(group, row, sample)) continue
    const index = indexOf(sample)
    index.liquidLimit = limit(reader, group, row, 'LLPL_LL')
    index.plasticLimit = limit(reader, group, row, 'LLPL_PL')
  }
  for (const { group, row } of reader.rows('LDEN')) {
    const sample = sampleOf(reader, samples, group, row)
    if (!sample || !once(group, row, sample)) continue
    const density = reader.number(group, row, 'LDEN_BDEN', 'density')
    // γ = ρ·g: a bulk density in Mg/m³ times 9.81 m/s² is a unit weight in kN/m³.
    indexOf(sample).bulkUnitWeight = density === null ? null : clean(density * GRAVITY)
  }
}

/** LL and PL may be NP (non-plastic), which is no number: it is left empty with a note rather than reported as an error. */
function limit(reader: Reader, group: AgsGroup, row: AgsRow, heading: string): number | null {
  const raw = reader.text(row, heading).trim().toUpperCase()
  if (raw === 'NP') {
    reader.note(`np:${heading}`, group, row.line, 'warning', `${heading} NP (non-plastic) was left empty`)
    return null
  }
  return reader.number(group, row, heading, 'percent')
}

function readOedometers(reader: Reader, samples: SampleIndex): void {
  const tests = new Map<string, OedometerTestRecord>()
  const stageRows = new Map<string, { increment: string, stage: OedometerStageRecord }[]>()
  const specimenKey = (group: AgsGroup, row: AgsRow): string =>
    `${rowSampleKey(reader, group, row)}\u0000${reader.text(row, 'SPEC_REF')}\u0000${reader.number(group, row, 'SPEC_DPTH', 'length') ?? ''}`
  for (const { group, row } of reader.rows('CONG')) {
    const sample = sampleOf(reader, samples, group, row)
    if (!sample) continue
    if (sample.oedometer) {
      reader.note('cong-more', group, row.line, 'warning', `samples with more than one consolidation test: only the first was imported (${sample.identifier})`)
      continue
    }
    // Specimen height in metres, like every length in the model (CONG_HIGT is in mm).
    const height = reader.number(group, row, 'CONG_HIGT', 'length')
    const e0 = reader.number(group, row, 'CONG_IVR', 'ratio')
    if (height === null || e0 === null) {
      reader.note('cong-incomplete', group, row.line, 'error', 'consolidation tests without specimen height (CONG_HIGT) or initial void ratio (CONG_IVR) were not imported')
      continue
    }
    const type = reader.text(row, 'CONG_TYPE').toUpperCase()
    const method = reader.text(row, 'CONG_METH').toUpperCase()
    const crs = type === 'CRS' || /\bCRS\b|CONSTANT RATE OF STRAIN|D4186/.test(method)
    const test: OedometerTestRecord = {
      testType: crs ? 'crs' : 'incremental',
      specimenHeight: height,
      initialWaterContent: reader.number(group, row, 'CONG_MCI', 'percent'),
      specificGravity: particleDensity(reader, group, row),
      e0,
      stages: [],
      remarks: reader.text(row, 'CONG_REM'),
    }
    const key = specimenKey(group, row)
    tests.set(key, test)
    stageRows.set(key, [])
    sample.oedometer = test
  }
  for (const { group, row } of reader.rows('CONS')) {
    const rows = stageRows.get(specimenKey(group, row))
    if (!rows) {
      reader.note('cons-orphan', group, row.line, 'error', 'CONS rows whose test is not in CONG were not imported')
      continue
    }
    const stress = reader.number(group, row, 'CONS_INCF', 'stress')
    const voidRatio = reader.number(group, row, 'CONS_INCE', 'ratio')
    if (stress === null || voidRatio === null) {
      reader.note('cons-incomplete', group, row.line, 'warning', 'CONS stages without end stress (CONS_INCF) or end void ratio (CONS_INCE) were left out')
      continue
    }
    rows.push({ increment: reader.text(row, 'CONS_INCN'), stage: { stress, voidRatio } })
  }
  for (const [key, rows] of stageRows) {
    const test = tests.get(key)
    if (!test) continue
    const numbered = rows.every(r => isAgsNumber(r.increment))
    const ordered = numbered ? [...rows].sort((a, b) => Number(a.increment) - Number(b.increment)) : rows
    test.stages = ordered.map(r => r.stage)
  }
}

/** Specific gravity Gs = ρs / ρw from CONG_PDEN in Mg/m³ (ρw = 1 Mg/m³); a leading # marks an assumed value. */
function particleDensity(reader: Reader, group: AgsGroup, row: AgsRow): number | null {
  const raw = reader.text(row, 'CONG_PDEN').trim()
  if (!raw.startsWith('#')) return reader.number(group, row, 'CONG_PDEN', 'density')
  reader.note('pden-assumed', group, row.line, 'warning', `CONG_PDEN ${raw} is an assumed particle density; it was imported as the specific gravity`)
  const value = raw.slice(1)
  if (!isAgsNumber(value)) return null
  const factor = reader.factor(group, row.line, 'CONG_PDEN', 'density', reader.unitOf(group, 'CONG_PDEN'))
  return factor === null ? null : clean(Number(value) * factor)
}

function readSpt(reader: Reader, points: Map<string, PointRecord>): void {
  for (const { group, row } of reader.rows('ISPT')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const depth = reader.number(group, row, 'ISPT_TOP', 'length')
    const count = (heading: string): number | null => reader.number(group, row, heading, 'count')
    const mm = (heading: string): number | null => {
      const m = reader.number(group, row, heading, 'length', reader.unitOf(group, heading) || 'mm')
      return m === null ? null : Math.round(m * 1000)
    }
    const test = sptOfRow(reader, group, row, count, mm)
    if (depth === null || typeof test === 'string') {
      reader.note('spt-blows', group, row.line, 'warning', typeof test === 'string' ? test : 'SPT rows without a depth were not imported')
      continue
    }
    const nval = count('ISPT_NVAL')
    if (nval !== null && nval !== test.n) {
      reader.note('spt-n', group, row.line, 'warning', test.n === null
        ? `SPT rows with an N value whose test drive stopped short of 300 mm were imported as a refusal without N (N = ${nval} at ${depth} m)`
        : `SPT N values that differ from the sum of the test drive's blows were imported from the blows (N = ${nval} written, ${test.n} counted at ${depth} m)`)
    }
    const record: SptRecord = { depth, ...sptStored(test) }
    point.spt.push(record)
  }
}

/**
 * One ISPT row's test: the increments (ISPT_INC1–6 with ISPT_PEN1–6, 75 mm where a
 * penetration is missing), else the blows as written (ISPT_REP), else an older
 * Pastload file's ISPT_SEAT + ISPT_TST1/2 (per 150 mm), else N alone (ISPT_NVAL, or
 * ISPT_MAIN with ISPT_NPEN for a drive stopped short).
 */
function sptOfRow(reader: Reader, group: AgsGroup, row: AgsRow, count: (h: string) => number | null, mm: (h: string) => number | null): SptBlows | string {
  const unreadable = 'SPT rows without blows Pastload can read (ISPT_INC1–6, ISPT_REP, or ISPT_NVAL) were not imported'
  const slots = [1, 2, 3, 4, 5, 6].map(i => ({ blows: count(`ISPT_INC${i}`), penetration: mm(`ISPT_PEN${i}`) }))
  if (slots.some(s => s.blows !== null)) {
    const take = (list: typeof slots) => list.flatMap(s => (s.blows === null ? [] : [{ blows: s.blows, penetration: s.penetration ?? SPT_INCREMENT_MM }]))
    const test = take(slots.slice(2))
    if (!test.length) return unreadable
    return sptFromIncrements(take(slots.slice(0, 2)), test)
  }
  const written = reader.text(row, 'ISPT_REP').trim()
  if (written) {
    const read = parseSptBlows(written)
    if (read.ok) return read.value
  }
  const seat = count('ISPT_SEAT')
  const first = count('ISPT_TST1')
  const second = count('ISPT_TST2')
  if (seat !== null && first !== null && second !== null) return sptFromStored({ blows: [seat, first, second], n: first + second, penetration: null })
  const nval = count('ISPT_NVAL')
  const main = count('ISPT_MAIN')
  const total = mm('ISPT_NPEN')
  const seating = seat === null ? [] : [{ blows: seat, penetration: SPT_SEATING_MM }]
  if (nval !== null) return sptFromIncrements(seating, [{ blows: nval, penetration: SPT_TEST_MM }])
  if (main !== null && total !== null) {
    const testPenetration = total - (seat === null ? 0 : SPT_SEATING_MM)
    if (testPenetration > 0 && testPenetration <= SPT_TEST_MM) return sptFromIncrements(seating, [{ blows: main, penetration: testPenetration }])
  }
  return unreadable
}

function readGroundwater(reader: Reader, points: Map<string, PointRecord>): void {
  const strikes = new Map<string, { record: GroundwaterRecord }>()
  for (const { group, row } of reader.rows('WSTG')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const observedAt = reader.dateTime(group, row, 'WSTG_DTIM')
    const depth = reader.number(group, row, 'WSTG_DPTH', 'length')
    if (observedAt === null) {
      reader.note('wstg-time', group, row.line, 'warning', 'water strikes without a date and time (WSTG_DTIM) were not imported: Pastload records each with its time')
      continue
    }
    const record: GroundwaterRecord = { kind: 'strike', observedAt, depth, pressure: null, remarks: reader.text(row, 'WSTG_REM') }
    point.groundwater.push(record)
    strikes.set(`${point.identifier}\u0000${depth ?? ''}`, { record })
  }
  for (const { group, row } of reader.rows('WSTD')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const strikeDepth = reader.number(group, row, 'WSTG_DPTH', 'length')
    const strike = strikes.get(`${point.identifier}\u0000${strikeDepth ?? ''}`)
    const minutes = reader.number(group, row, 'WSTD_NMIN', 'minutes')
    const depth = reader.number(group, row, 'WSTD_POST', 'length')
    if (!strike || minutes === null || depth === null) {
      reader.note('wstd-incomplete', group, row.line, 'warning', 'WSTD levels without their strike, minutes (WSTD_NMIN) or depth (WSTD_POST) were not imported')
      continue
    }
    const note = reader.text(row, 'WSTD_REM')
    point.groundwater.push({
      kind: 'standing',
      observedAt: addMinutes(strike.record.observedAt, minutes),
      depth,
      pressure: null,
      remarks: `${minutes} min after the water strike at ${strikeDepth ?? '?'} m${note ? `; ${note}` : ''}`,
    })
  }

  const mongTypes = new Map<string, string>()
  for (const { row } of reader.rows('MONG')) {
    mongTypes.set(`${reader.text(row, 'LOCA_ID')}\u0000${reader.text(row, 'MONG_ID')}`, reader.text(row, 'MONG_TYPE').toUpperCase())
  }
  const readings = new Map<string, { point: PointRecord, mongType: string, record: GroundwaterRecord }>()
  for (const { group, row } of reader.rows('MOND')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const type = reader.text(row, 'MOND_TYPE').toUpperCase()
    if (type !== 'PRES' && type !== 'WHD' && type !== 'WDEP') {
      reader.note(`mond-type:${type}`, group, row.line, 'warning', `MOND readings of type ${JSON.stringify(type)} are not groundwater levels or pressures; they were not imported`)
      continue
    }
    const observedAt = reader.dateTime(group, row, 'MOND_DTIM')
    if (observedAt === null) continue
    const unit = reader.text(row, 'MOND_UNIT')
    const mongId = reader.text(row, 'MONG_ID')
    const key = [point.identifier, mongId, reader.text(row, 'MONG_DIS'), observedAt, reader.text(row, 'MOND_REF')].join('\u0000')
    let entry = readings.get(key)
    if (!entry) {
      const mongType = mongTypes.get(`${point.identifier}\u0000${mongId}`) ?? ''
      entry = { point, mongType, record: { kind: 'standing', observedAt, depth: null, pressure: null, remarks: '' } }
      readings.set(key, entry)
    }
    if (entry.record.remarks === '') entry.record.remarks = reader.text(row, 'MOND_REM')
    if (type === 'WDEP') {
      entry.record.depth = reader.number(group, row, 'MOND_RDNG', 'length', unit)
    }
    else if (type === 'PRES') {
      entry.record.pressure = reader.number(group, row, 'MOND_RDNG', 'stress', unit)
    }
    else {
      const head = reader.number(group, row, 'MOND_RDNG', 'length', unit)
      // Head of water above the tip h gives the pore pressure there: u = γw·h with γw = 9.81 kN/m³.
      if (head !== null) {
        entry.record.pressure = clean(head * GRAVITY)
        reader.note('whd', group, row.line, 'warning', 'MOND WHD readings (head above the tip) were converted to pore pressure with γw = 9.81 kN/m³')
      }
    }
  }
  for (const { point, mongType, record } of readings.values()) {
    if (record.depth === null && record.pressure === null) continue
    const piezometer = PIEZOMETER_MONG_TYPES.has(mongType) || (mongType !== STANDING_LEVEL_MONG_TYPE && record.pressure !== null)
    point.groundwater.push({ ...record, kind: piezometer ? 'piezometer' : 'standing' })
  }
}

/** Adds minutes to an ISO date-time, keeping its offset text (or its absence) as it was. */
function addMinutes(iso: string, minutes: number): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(?:\.\d+)?(.*)$/.exec(iso)
  if (!m) return iso
  const [, y, mo, d, h, mi, s, zone] = m
  const time = new Date(Date.UTC(Number(y), Number(mo) - 1, Number(d), Number(h), Number(mi), Number(s)) + Math.round(minutes * 60_000))
  return `${time.toISOString().slice(0, 19)}${zone ?? ''}`
}

function readCpt(reader: Reader, points: Map<string, PointRecord>): void {
  const ratios = new Map<string, number | null>()
  const firstTest = new Map<string, string>()
  for (const { group, row } of reader.rows('SCPG')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const test = reader.text(row, 'SCPG_TESN')
    ratios.set(`${point.identifier}\u0000${test}`, reader.number(group, row, 'SCPG_CAR', 'ratio'))
    if (!firstTest.has(point.identifier)) firstTest.set(point.identifier, test)
  }
  const soundings = new Map<string, { point: PointRecord, test: string, rows: { depth: number, qc: number, fs: number, u2: number }[] }>()
  for (const { group, row } of reader.rows('SCPT')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const test = reader.text(row, 'SCPG_TESN')
    const chosen = firstTest.get(point.identifier) ?? test
    if (!firstTest.has(point.identifier)) firstTest.set(point.identifier, test)
    if (test !== chosen) {
      reader.note(`cpt-more:${point.identifier}`, group, row.line, 'warning', `${point.identifier} has more than one cone test; only test ${JSON.stringify(chosen)} was imported`)
      continue
    }
    const depth = reader.number(group, row, 'SCPT_DPTH', 'length')
    const qc = reader.number(group, row, 'SCPT_RES', 'stress')
    const fs = reader.number(group, row, 'SCPT_FRES', 'stress')
    if (depth === null || qc === null || fs === null) {
      reader.note('cpt-row', group, row.line, 'warning', 'SCPT rows without depth, cone resistance or sleeve friction were left out')
      continue
    }
    let u2 = reader.number(group, row, 'SCPT_PWP2', 'stress')
    if (u2 === null) {
      reader.note(`cpt-u2:${point.identifier}`, group, row.line, 'warning', `${point.identifier}: SCPT rows without u2 (SCPT_PWP2) were read with u2 = 0, so qt = qc there`)
      u2 = 0
    }
    const key = `${point.identifier}\u0000${test}`
    const sounding = soundings.get(key) ?? { point, test, rows: [] }
    sounding.rows.push({ depth, qc, fs, u2 })
    soundings.set(key, sounding)
  }
  for (const [key, { point, rows }] of soundings) {
    let areaRatio = ratios.get(key) ?? null
    if (areaRatio === null) {
      reader.note(`cpt-ratio:${point.identifier}`, reader.first('SCPT') ?? emptyGroup('SCPT'), 0, 'warning', `${point.identifier} gives no cone area ratio (SCPG_CAR); 1 was used, so qt = qc`)
      areaRatio = 1
    }
    rows.sort((a, b) => a.depth - b.depth)
    const cpt: CptRecord = { areaRatio, depth: rows.map(r => r.depth), qc: rows.map(r => r.qc), fs: rows.map(r => r.fs), u2: rows.map(r => r.u2) }
    point.cpt = cpt
  }
}

function readVanes(reader: Reader, points: Map<string, PointRecord>): void {
  for (const { group, row } of reader.rows('IVAN')) {
    const point = pointOf(reader, points, group, row)
    if (!point) continue
    const depth = reader.number(group, row, 'IVAN_DPTH', 'length')
    const peak = reader.number(group, row, 'IVAN_IVAN', 'stress')
    if (depth === null || peak === null) {
      reader.note('ivan', group, row.line, 'warning', 'vane tests without depth or peak strength (IVAN_IVAN) were not imported')
      continue
    }
    const record: VaneRecord = { depth, peak, remoulded: reader.number(group, row, 'IVAN_IVAR', 'stress') }
    point.vane.push(record)
  }
}

/** Orders each list by depth (groundwater by time) and fills a missing final depth from the deepest record. */
function finishPoint(reader: Reader, point: PointRecord): void {
  point.intervals.sort((a, b) => a.top - b.top)
  point.samples.sort((a, b) => a.top - b.top)
  point.spt.sort((a, b) => a.depth - b.depth)
  point.vane.sort((a, b) => a.depth - b.depth)
  point.groundwater.sort((a, b) => (a.observedAt < b.observedAt ? -1 : a.observedAt > b.observedAt ? 1 : 0))
  if (!Number.isNaN(point.finalDepth)) return
  const depths = [
    ...point.intervals.map(i => i.bottom),
    ...point.samples.map(s => s.bottom),
    ...point.spt.map(s => s.depth),
    ...point.vane.map(v => v.depth),
    ...(point.cpt?.depth ?? []),
  ]
  const deepest = depths.length > 0 ? Math.max(...depths) : 0
  const loca = reader.first('LOCA') ?? emptyGroup('LOCA')
  reader.note(`fdep:${point.identifier}`, loca, 0, 'warning', `${point.identifier} has no final depth (LOCA_FDEP); ${deepest === 0 ? '0 m was set and must be corrected' : `the deepest record, ${deepest} m, was used`}`)
  point.finalDepth = deepest
}

/** One finding per mapped group naming the headings that hold data Pastload does not keep. */
function reportUnusedHeadings(reader: Reader): void {
  for (const group of reader.file.groups) {
    const name = group.name
    if (DEFINITION_GROUPS.has(name) || !MAPPED_GROUPS.has(name)) continue
    const used = new Set<string>(name === 'WSTD' ? WSTD_HEADINGS : [...(COLUMNS[name as GroupName] ?? []).map(c => c.heading), ...(READ_ALSO[name as GroupName] ?? [])])
    const unused = group.headings.filter(h => !used.has(h) && group.rows.some(r => (r.values[h] ?? '') !== ''))
    if (unused.length > 0) reader.note(`unused:${name}`, group, group.headingLine || group.line, 'warning', `${name}: ${unused.join(', ')} hold data Pastload does not keep`)
  }
}

function emptyGroup(name: string): AgsGroup {
  return { name, headings: [], units: [], types: [], rows: [], line: 0, headingLine: 0, unitLine: 0, typeLine: 0 }
}

// ─── Export ──────────────────────────────────────────────────────────────────

export interface AgsExportOptions {
  /** TRAN_DATE, YYYY-MM-DD; today (UTC) when not given. */
  producedOn?: string
  /** TRAN_PROD, the producer of the file. */
  producer?: string
  /** TRAN_RECV, who the file is for (required by the standard, so 'Not stated' when unknown). */
  recipient?: string
  /** TRAN_STAT, status of the data. */
  status?: string
  /** TRAN_ISNO, issue sequence reference. */
  issue?: string
  /** TRAN_DESC. */
  description?: string
  /** The project's units: a US project's file states ft, psf or tsf and pcf in its UNIT row and values to match (SI by default). */
  units?: { system: 'SI' | 'US', usStress?: 'psf' | 'tsf' }
}

type Row = Record<string, AgsValue>

function group(name: GroupName, rows: Row[]): AgsWritableGroup {
  const columns = COLUMNS[name]
  return { name, headings: columns.map(c => c.heading), units: columns.map(c => c.unit), types: columns.map(c => c.type), rows }
}

/** A date-time in UTC to the second ('2024-03-05T09:30:00Z'); a value without an offset is written unchanged. */
function utc(iso: string): string {
  if (!/(?:Z|[+-]\d{2}:?\d{2})$/.test(iso)) return iso
  const time = new Date(iso)
  return Number.isNaN(time.getTime()) ? iso : `${time.toISOString().slice(0, 19)}Z`
}

/** The groups of a complete file for the record, definitions (UNIT, TYPE, ABBR, DICT) included. */
export function investigationToAgsGroups(data: InvestigationRecord, options: AgsExportOptions = {}): AgsWritableGroup[] {
  const rows: Record<GroupName, Row[]> = {
    PROJ: [], TRAN: [], UNIT: [], TYPE: [], ABBR: [], DICT: [], PSTR: [], LOCA: [], GEOL: [], SAMP: [], LNMC: [], LLPL: [], LDEN: [],
    CONG: [], CONS: [], ISPT: [], WSTG: [], MONG: [], MOND: [], SCPG: [], SCPT: [], IVAN: [],
  }
  rows.PROJ.push({ PROJ_ID: data.project.jobNumber, PROJ_NAME: data.project.name, PROJ_CLNT: data.project.client })
  rows.TRAN.push({
    TRAN_ISNO: options.issue ?? '1',
    TRAN_DATE: options.producedOn ?? new Date().toISOString().slice(0, 10),
    TRAN_PROD: options.producer ?? 'Pastload',
    TRAN_STAT: options.status ?? 'Draft',
    TRAN_DESC: options.description ?? 'Investigation data exported from Pastload',
    TRAN_AGS: '4.1',
    TRAN_RECV: options.recipient ?? 'Not stated',
    TRAN_DLIM: '|',
    TRAN_RCON: '+',
  })
  for (const s of data.strata) {
    rows.PSTR.push({ PSTR_CODE: s.code, PSTR_NAME: s.name, PSTR_DESC: s.description, PSTR_COLR: s.colour, PSTR_PATN: s.pattern, PSTR_UWT: s.unitWeight, PSTR_UWTS: s.unitWeightSaturated, PSTR_ORDR: s.displayOrder })
  }
  for (const p of data.points) writePoint(p, rows)

  const order: GroupName[] = ['PROJ', 'TRAN', 'PSTR', 'LOCA', 'GEOL', 'SAMP', 'LNMC', 'LLPL', 'LDEN', 'CONG', 'CONS', 'ISPT', 'WSTG', 'MONG', 'MOND', 'SCPG', 'SCPT', 'IVAN']
  const dataGroups = order.filter(name => rows[name].length > 0).map(name => inUnits(group(name, rows[name]), options.units))
  const dict = dictGroup(dataGroups)
  const withDict = dict ? [...dataGroups, dict] : dataGroups
  const abbr = abbrGroup(withDict, data)
  const used = collectUsedDefinitions(abbr ? [...withDict, abbr] : withDict)
  used.types.add('X') // the TYPE and UNIT groups themselves are text columns
  const unit = group('UNIT', [...used.units].map(u => ({ UNIT_UNIT: u, UNIT_DESC: UNIT_DESCRIPTIONS[u] ?? u })))
  const type = group('TYPE', [...used.types].map(t => ({ TYPE_TYPE: t, TYPE_DESC: describeType(t) })))
  const [proj, tran, ...rest] = dataGroups
  const definitions = [unit, type, ...(abbr ? [abbr] : []), ...(dict ? [dict] : [])]
  return [...(proj ? [proj] : []), ...(tran ? [tran] : []), ...definitions, ...rest]
}

/** SI units Pastload writes and the US unit a US project's file states instead, with the factor SI → US (exact definitions, see units.ts). */
function usUnitFor(unit: string, usStress: 'psf' | 'tsf'): { unit: string, factor: number } | null {
  if (unit === 'm') return { unit: 'ft', factor: 1 / (unitFactor('length', 'ft') ?? 1) }
  if (unit === 'kPa') return { unit: usStress, factor: 1 / (unitFactor('stress', usStress) ?? 1) }
  if (unit === 'kN/m3') return { unit: 'pcf', factor: 1 / (unitFactor('unitWeight', 'pcf') ?? 1) }
  return null
}

/** One more decimal place for a value written in tsf (a tsf is 2000 psf), so a stress keeps its precision. */
function finerType(type: string, unit: string): string {
  const dp = /^(\d+)DP$/.exec(type)
  return dp && unit === 'tsf' ? `${Number(dp[1]) + 2}DP` : type
}

/**
 * A group written in a US project's units: its m, kPa and kN/m³ headings become ft, psf or tsf and pcf in the UNIT row
 * with their values converted; a monitoring reading (MOND) converts with its own MOND_UNIT.
 */
function inUnits(g: AgsWritableGroup, units: AgsExportOptions['units']): AgsWritableGroup {
  if (!units || units.system !== 'US') return g
  const usStress = units.usStress ?? 'psf'
  const change = g.units.map(u => usUnitFor(u, usStress))
  const convert = (v: AgsValue, f: number) => (typeof v === 'number' ? Number((v * f).toPrecision(10)) : v)
  const rows = g.rows.map((r) => {
    const out: Row = { ...r }
    g.headings.forEach((h, i) => {
      const c = change[i]
      if (c && h in out) out[h] = convert(out[h] ?? null, c.factor)
    })
    const rowUnit = typeof out.MOND_UNIT === 'string' ? usUnitFor(out.MOND_UNIT, usStress) : null
    if (rowUnit) Object.assign(out, { MOND_RDNG: convert(out.MOND_RDNG ?? null, rowUnit.factor), MOND_UNIT: rowUnit.unit })
    return out
  })
  return {
    ...g,
    units: g.units.map((u, i) => change[i]?.unit ?? u),
    types: g.types.map((t, i) => finerType(t, change[i]?.unit ?? '')),
    rows,
  }
}

/** Writes the record as an AGS4 file that passes checkAgs without errors. */
export function investigationToAgs(data: InvestigationRecord, options: AgsExportOptions = {}): string {
  return writeAgs(investigationToAgsGroups(data, options))
}

function writePoint(p: PointRecord, rows: Record<GroupName, Row[]>): void {
  const id = p.identifier
  rows.LOCA.push({
    LOCA_ID: id,
    LOCA_TYPE: locaTypeFor(p.kind, p.method),
    LOCA_NATE: p.easting,
    LOCA_NATN: p.northing,
    LOCA_GL: p.groundElevation,
    LOCA_REM: p.remarks,
    LOCA_FDEP: p.finalDepth,
    LOCA_STAR: p.startedOn,
    LOCA_ENDD: p.endedOn,
    LOCA_METH: p.method,
    LOCA_LOGB: p.loggedBy,
  })
  for (const i of p.intervals) {
    rows.GEOL.push({ LOCA_ID: id, GEOL_TOP: i.top, GEOL_BASE: i.bottom, GEOL_DESC: i.description, GEOL_GEOL: i.stratumCode, GEOL_GEO2: i.uscs, GEOL_MOIS: i.moisture, GEOL_CNSY: i.consistency })
  }
  for (const s of p.samples) {
    const keys: Row = { LOCA_ID: id, SAMP_TOP: s.top, SAMP_REF: s.identifier, SAMP_TYPE: SAMPLE_TYPE_CODES[s.type], SAMP_ID: '' }
    const specimen: Row = { ...keys, SPEC_REF: '', SPEC_DPTH: null }
    rows.SAMP.push({ ...keys, SAMP_BASE: s.bottom, SAMP_RECV: s.recovery, SAMP_REM: s.remarks })
    if (s.index?.waterContent != null) rows.LNMC.push({ ...specimen, LNMC_MC: s.index.waterContent })
    if (s.index && (s.index.liquidLimit !== null || s.index.plasticLimit !== null)) rows.LLPL.push({ ...specimen, LLPL_LL: s.index.liquidLimit, LLPL_PL: s.index.plasticLimit })
    // ρ = γ / g with g = 9.81 m/s²: a unit weight in kN/m³ over g is a bulk density in Mg/m³.
    if (s.index?.bulkUnitWeight != null) rows.LDEN.push({ ...specimen, LDEN_BDEN: s.index.bulkUnitWeight / GRAVITY })
    const o = s.oedometer
    if (o) {
      rows.CONG.push({
        ...specimen,
        CONG_TYPE: o.testType === 'crs' ? 'CRS' : 'OEDOMETER',
        CONG_HIGT: o.specimenHeight * 1000,
        CONG_MCI: o.initialWaterContent,
        CONG_PDEN: o.specificGravity,
        CONG_IVR: o.e0,
        CONG_REM: o.remarks,
      })
      o.stages.forEach((stage, index) => {
        const start = index === 0 ? o.e0 : o.stages[index - 1]?.voidRatio ?? null
        rows.CONS.push({ ...specimen, CONS_INCN: String(index + 1), CONS_IVR: start, CONS_INCF: stage.stress, CONS_INCE: stage.voidRatio })
      })
    }
  }
  for (const s of p.spt) {
    const test = sptFromStored(s)
    const row: Row = {
      LOCA_ID: id,
      ISPT_TOP: s.depth,
      ISPT_SEAT: test.seating.length ? test.seatingBlows : null,
      ISPT_MAIN: test.testBlows,
      ISPT_NPEN: test.totalPenetration,
      ISPT_NVAL: test.n,
      ISPT_REP: `${sptBlowsText(test)}${test.n === null ? '' : ` N=${test.n}`}`,
    }
    // Slots 1–2 hold the seating drive's increments, 3–6 the test drive's, each with its penetration.
    test.seating.forEach((inc, i) => Object.assign(row, { [`ISPT_INC${i + 1}`]: inc.blows, [`ISPT_PEN${i + 1}`]: inc.penetration }))
    test.test.forEach((inc, i) => Object.assign(row, { [`ISPT_INC${i + 3}`]: inc.blows, [`ISPT_PEN${i + 3}`]: inc.penetration }))
    rows.ISPT.push(row)
  }
  let reference = 0
  const monitoring = new Set<string>()
  for (const g of p.groundwater) {
    if (g.kind === 'strike') {
      rows.WSTG.push({ LOCA_ID: id, WSTG_DPTH: g.depth, WSTG_DTIM: utc(g.observedAt), WSTG_REM: g.remarks })
      continue
    }
    reference++
    const mongId = g.kind === 'piezometer' ? 'PZ' : 'WL'
    if (!monitoring.has(mongId)) {
      monitoring.add(mongId)
      rows.MONG.push({ LOCA_ID: id, MONG_ID: mongId, MONG_DIS: null, MONG_TYPE: g.kind === 'piezometer' ? PIEZOMETER_MONG_TYPE : STANDING_LEVEL_MONG_TYPE })
    }
    const base: Row = { LOCA_ID: id, MONG_ID: mongId, MONG_DIS: null, MOND_DTIM: utc(g.observedAt), MOND_REF: String(reference), MOND_REM: g.remarks }
    if (g.pressure !== null) rows.MOND.push({ ...base, MOND_TYPE: 'PRES', MOND_RDNG: g.pressure, MOND_UNIT: 'kPa' })
    if (g.depth !== null) rows.MOND.push({ ...base, MOND_TYPE: 'WDEP', MOND_RDNG: g.depth, MOND_UNIT: 'm' })
  }
  if (p.cpt) {
    rows.SCPG.push({ LOCA_ID: id, SCPG_TESN: '1', SCPG_CAR: p.cpt.areaRatio })
    const { depth, qc, fs, u2 } = p.cpt
    depth.forEach((z, i) => {
      // Pastload keeps kPa; SCPT's dictionary unit is MPa.
      rows.SCPT.push({ LOCA_ID: id, SCPG_TESN: '1', SCPT_DPTH: z, SCPT_RES: at(qc, i) / 1000, SCPT_FRES: at(fs, i) / 1000, SCPT_PWP2: at(u2, i) / 1000 })
    })
  }
  p.vane.forEach((v, i) => {
    rows.IVAN.push({ LOCA_ID: id, IVAN_DPTH: v.depth, IVAN_TESN: String(i + 1), IVAN_IVAN: v.peak, IVAN_IVAR: v.remoulded })
  })
}

function at(values: readonly number[], index: number): number {
  return values[index] ?? Number.NaN
}

/** DICT rows for the user-defined group and headings among the written groups (rule 18), in column order (rule 18a). */
function dictGroup(groups: readonly AgsWritableGroup[]): AgsWritableGroup | null {
  const rows: Row[] = []
  for (const g of groups) {
    if (g.name === USER_GROUP.name) {
      rows.push({ DICT_TYPE: 'GROUP', DICT_GRP: g.name, DICT_HDNG: '', DICT_STAT: '', DICT_DTYP: '', DICT_DESC: USER_GROUP.description, DICT_UNIT: '', DICT_PGRP: USER_GROUP.parent })
    }
    g.headings.forEach((heading, i) => {
      const user = USER_HEADINGS[`${g.name}.${heading}`]
      if (!user) return
      rows.push({ DICT_TYPE: 'HEADING', DICT_GRP: g.name, DICT_HDNG: heading, DICT_STAT: user.status, DICT_DTYP: g.types[i] ?? '', DICT_DESC: user.description, DICT_UNIT: g.units[i] ?? '', DICT_PGRP: '' })
    })
  }
  return rows.length > 0 ? group('DICT', rows) : null
}

/** ABBR rows for every code written in a PA field (rule 16), each part of a combination separately (rule 16a). */
function abbrGroup(groups: readonly AgsWritableGroup[], data: InvestigationRecord): AgsWritableGroup | null {
  const used = collectUsedDefinitions(groups)
  const strata = new Map(data.strata.map(s => [s.code, s.name]))
  const rows: Row[] = []
  for (const [heading, codes] of used.abbreviations) {
    for (const code of codes) {
      const { description, list } = describeCode(heading, code, strata)
      rows.push({ ABBR_HDNG: heading, ABBR_CODE: code, ABBR_DESC: description, ABBR_LIST: list })
    }
  }
  return rows.length > 0 ? group('ABBR', rows) : null
}

function describeCode(heading: string, code: string, strata: Map<string, string>): { description: string, list: string } {
  if (heading === 'LOCA_TYPE') {
    const meaning = LOCA_TYPES[code]
    if (meaning) return meaning
  }
  if (heading === 'SAMP_TYPE') {
    const meaning = SAMP_TYPES[code]
    if (meaning) return meaning
  }
  if (heading === 'GEOL_GEOL') return { description: strata.get(code) || `Stratum ${code}`, list: 'Pastload' }
  if (heading === 'GEOL_GEO2') return { description: `${USCS_NAMES[code] ?? code} (USCS group symbol)`, list: 'ASTM D2487' }
  return OTHER_CODES[heading]?.[code] ?? { description: code, list: 'Pastload' }
}
