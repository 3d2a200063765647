import { isUscsGroupSymbol } from '../geotech/plasticity'
import { checkIntervals } from '../investigation/intervals'
import { GROUNDWATER_KINDS, POINT_KINDS, SAMPLE_TYPES } from '../investigation/types'
import { isGeotechError } from '../geotech/errors'
import { convertStages, STAGE_CONVENTION_LABELS, type SpecimenBasis, type StageConvention } from '../lab/stages'
import { EARLIEST_DATE, isPlainText, LATEST_DATE, PLAIN_TEXT_MESSAGE } from '../schemas/common'
import { VaneInputSchema } from '../schemas/investigation'
import { StageInputSchema } from '../schemas/lab'
import { US_TO_SI, type UnitSystem, type UsStressUnit } from '../units'

/**
 * Tabular imports (CSV, XLSX): what each target table needs, how file columns
 * map onto its fields, and a row-by-row check that reports every problem with
 * the file's own row number before anything is written. Pure: the server runs
 * it on the whole file; the browser may run it for the preview.
 */

export const IMPORT_TARGETS = ['points', 'intervals', 'samples', 'index-tests', 'groundwater', 'cpt', 'oedometer-stages', 'vane'] as const
export type ImportTarget = (typeof IMPORT_TARGETS)[number]

type FieldType = 'number' | 'text' | 'date' | 'datetime' | { enum: readonly string[] } | 'uscs'

export interface ImportField {
  key: string
  label: string
  type: FieldType
  required: boolean
  /** Header spellings recognised when suggesting a mapping (compared case- and punctuation-insensitively). */
  aliases: string[]
}

const f = (key: string, label: string, type: FieldType, required: boolean, aliases: string[] = []): ImportField => ({ key, label, type, required, aliases: [key, label, ...aliases] })

export const TARGET_FIELDS: Record<ImportTarget, ImportField[]> = {
  'points': [
    f('identifier', 'Point', 'text', true, ['point', 'id', 'hole', 'location', 'loca_id', 'borehole']),
    f('kind', 'Kind', { enum: POINT_KINDS }, true, ['type']),
    f('easting', 'Easting (m)', 'number', true, ['x', 'e']),
    f('northing', 'Northing (m)', 'number', true, ['y', 'n']),
    f('groundElevation', 'Ground elevation (m)', 'number', true, ['ground level', 'gl', 'elevation', 'level']),
    f('finalDepth', 'Final depth (m)', 'number', true, ['depth', 'final depth', 'fdep']),
    f('startedOn', 'Started', 'date', false, ['start', 'start date']),
    f('endedOn', 'Ended', 'date', false, ['end', 'end date']),
    f('method', 'Method', 'text', false),
    f('loggedBy', 'Logged by', 'text', false, ['logger']),
    f('remarks', 'Remarks', 'text', false, ['notes', 'comments']),
  ],
  'intervals': [
    f('point', 'Point', 'text', true, ['identifier', 'hole', 'borehole', 'loca_id']),
    f('top', 'Top (m)', 'number', true, ['from', 'depth top']),
    f('bottom', 'Bottom (m)', 'number', true, ['to', 'base', 'depth base']),
    f('description', 'Description', 'text', false, ['field description', 'desc']),
    f('uscs', 'USCS', 'uscs', false, ['group symbol', 'symbol']),
    f('stratum', 'Stratum code', 'text', false, ['stratum', 'unit', 'geology']),
    f('moisture', 'Moisture', 'text', false),
    f('consistency', 'Consistency / density', 'text', false, ['consistency', 'density']),
  ],
  'samples': [
    f('point', 'Point', 'text', true, ['identifier', 'hole', 'borehole']),
    f('identifier', 'Sample', 'text', true, ['sample', 'sample id', 'ref']),
    f('top', 'Top (m)', 'number', true, ['from']),
    f('bottom', 'Bottom (m)', 'number', true, ['to', 'base']),
    f('type', 'Type', { enum: SAMPLE_TYPES }, true, ['sample type']),
    f('recovery', 'Recovery (%)', 'number', false),
    f('remarks', 'Remarks', 'text', false),
  ],
  'index-tests': [
    f('point', 'Point', 'text', true, ['identifier', 'hole', 'borehole']),
    f('sample', 'Sample', 'text', true, ['sample id', 'ref']),
    f('waterContent', 'Water content (%)', 'number', false, ['w', 'moisture content', 'mc']),
    f('liquidLimit', 'Liquid limit (%)', 'number', false, ['ll', 'wl']),
    f('plasticLimit', 'Plastic limit (%)', 'number', false, ['pl', 'wp']),
    f('bulkUnitWeight', 'Bulk unit weight (kN/m³)', 'number', false, ['gamma', 'unit weight']),
  ],
  'groundwater': [
    f('point', 'Point', 'text', true, ['identifier', 'hole', 'borehole']),
    f('kind', 'Kind', { enum: GROUNDWATER_KINDS }, true, ['type']),
    f('observedAt', 'Observed at', 'datetime', true, ['date', 'time', 'datetime']),
    f('depth', 'Depth (m)', 'number', false, ['level depth']),
    f('pressure', 'Pressure (kPa)', 'number', false, ['pore pressure', 'u']),
    f('remarks', 'Remarks', 'text', false),
  ],
  'cpt': [
    f('depth', 'Depth (m)', 'number', true, ['z', 'penetration']),
    f('qc', 'qc (kPa)', 'number', true, ['cone resistance', 'qc (kpa)']),
    f('fs', 'fs (kPa)', 'number', true, ['sleeve friction', 'fs (kpa)']),
    f('u2', 'u2 (kPa)', 'number', true, ['pore pressure', 'u2 (kpa)']),
  ],
  // One test's loading stages: σ' and exactly one of e / ε / Δh (the mapped one sets the convention).
  'oedometer-stages': [
    f('stage', 'Stage', 'number', false, ['stage no', 'stage number', 'increment', 'step', 'no']),
    f('stress', 'Effective stress σ\' (kPa)', 'number', true, ['effective stress', 'sigma', 'stress', 'stress (kpa)', 'pressure', 'load', 'sigma v']),
    f('voidRatio', STAGE_CONVENTION_LABELS['void-ratio'], 'number', false, ['e', 'void ratio']),
    f('strain', STAGE_CONVENTION_LABELS.strain, 'number', false, ['strain', 'strain %', 'axial strain', 'vertical strain']),
    f('dial', STAGE_CONVENTION_LABELS.dial, 'number', false, ['compression', 'dial', 'dial reading', 'final dial', 'settlement', 'dh', 'compression (mm)']),
  ],
  'vane': [
    f('point', 'Point', 'text', true, ['identifier', 'hole', 'borehole', 'loca_id']),
    f('depth', 'Depth (m)', 'number', true, ['z', 'test depth']),
    f('peak', 'Peak su (kPa)', 'number', true, ['peak', 'su', 'su peak', 'peak strength', 'cu', 'su,fv', 'peak su']),
    f('remoulded', 'Remoulded su (kPa)', 'number', false, ['remoulded', 'remolded', 'su remoulded', 'residual', 'remoulded strength', 'remolded su']),
  ],
}

export const TARGET_LABELS: Record<ImportTarget, string> = {
  'points': 'Investigation points',
  'intervals': 'Log intervals',
  'samples': 'Samples',
  'index-tests': 'Index tests',
  'groundwater': 'Groundwater observations',
  'cpt': 'CPT sounding (one point)',
  'oedometer-stages': 'Oedometer stages (one test)',
  'vane': 'Field vane readings',
}

/** The stage fields of an oedometer-stages file and the convention each one means. */
export const STAGE_VALUE_FIELDS: Record<StageConvention, 'voidRatio' | 'strain' | 'dial'> = { 'void-ratio': 'voidRatio', 'strain': 'strain', 'dial': 'dial' }

/** The stage convention of an oedometer-stages mapping: the one value column that is mapped (null when none or several are). */
export function stageConventionOf(mapping: ImportMapping): StageConvention | null {
  const mapped = (Object.keys(STAGE_VALUE_FIELDS) as StageConvention[]).filter(c => mapping[STAGE_VALUE_FIELDS[c]])
  return mapped.length === 1 ? mapped[0]! : null
}

/** Most stages a test holds (the same bound as the test form). */
export const MAX_STAGES = 300

export type ImportMapping = Record<string, string>

export interface RowError {
  /** 1-based row of the file as a spreadsheet shows it (the header is row 1). */
  row: number
  column: string
  message: string
}

const norm = (s: string) => s.toLowerCase().replace(/[^a-z0-9%³]+/g, '')
/** A header without a unit in brackets at its end: "Final depth (ft)" → "Final depth". */
const bare = (s: string) => s.replace(/\s*\([^()]*\)\s*$/, '')

// ─── Units of the numeric columns ────────────────────────────────────────────

/** What a numeric import field measures; fields without one (%, counts, ratios) are read as they are. */
export type ImportQuantity = 'length' | 'stress' | 'unitWeight'

/** The units a file's column may be in, per quantity (SI first). */
export const IMPORT_UNITS: Record<ImportQuantity, readonly string[]> = {
  length: ['m', 'ft'],
  stress: ['kPa', 'MPa', 'psf', 'tsf', 'psi'],
  unitWeight: ['kN/m³', 'pcf'],
}

/** SI units (m, kPa, kN/m³) per unit of the file (exact definitions, shared/units). */
// 1 psi = 144 psf (1 lbf/in², 144 in² to the ft²).
const TO_SI: Record<string, number> = { 'm': 1, 'ft': US_TO_SI.length, 'kPa': 1, 'MPa': 1000, 'psf': US_TO_SI.stress, 'tsf': US_TO_SI.stressTsf, 'psi': 144 * US_TO_SI.stress, 'kN/m³': 1, 'pcf': US_TO_SI.unitWeight }
/** Spellings of a unit in a header's brackets. */
const UNIT_SPELLINGS: Record<string, string> = { 'm': 'm', 'ft': 'ft', 'feet': 'ft', 'kpa': 'kPa', 'mpa': 'MPa', 'psf': 'psf', 'tsf': 'tsf', 'psi': 'psi', 'kn/m3': 'kN/m³', 'kn/m³': 'kN/m³', 'pcf': 'pcf' }

const QUANTITY_OF: Partial<Record<ImportTarget, Record<string, ImportQuantity>>> = {
  'points': { easting: 'length', northing: 'length', groundElevation: 'length', finalDepth: 'length' },
  'intervals': { top: 'length', bottom: 'length' },
  'samples': { top: 'length', bottom: 'length' },
  'index-tests': { bulkUnitWeight: 'unitWeight' },
  'groundwater': { depth: 'length', pressure: 'stress' },
  'cpt': { depth: 'length', qc: 'stress', fs: 'stress', u2: 'stress' },
  'oedometer-stages': { stress: 'stress' },
  'vane': { depth: 'length', peak: 'stress', remoulded: 'stress' },
}

/** The unit each numeric column of an import is in, by field key (`{ finalDepth: 'ft' }`); a field not named is in SI. */
export type ImportUnits = Record<string, string>

/** The quantity a field of the target measures, or null. */
export function importFieldQuantity(target: ImportTarget, key: string): ImportQuantity | null {
  return QUANTITY_OF[target]?.[key] ?? null
}

/** A field's label without the SI unit it names ("Final depth (m)" → "Final depth"), for a form that asks for the unit beside it. */
export function fieldName(field: Pick<ImportField, 'label'>): string {
  return field.label.replace(/\s*\((m|kPa|kN\/m³)\)$/, '')
}

/**
 * A US cone's readings as US sounding logs usually give them (common practice): cone resistance and sleeve
 * friction in tsf, pore pressure in psi. An SI file's readings are kPa (or MPa, named in the heading).
 */
export const US_CONE_UNITS: Readonly<Record<string, string>> = { qc: 'tsf', fs: 'tsf', u2: 'psi' }

/** The unit a column heading names in brackets at its end ("qc (MPa)" → "MPa"), if Pastload reads it. */
export function headerUnit(header: string | undefined): string | null {
  const said = /\(([^()]*)\)\s*$/.exec(header ?? '')?.[1]?.trim().toLowerCase()
  return (said && UNIT_SPELLINGS[said]) || null
}

/**
 * The unit a numeric field is read in when its heading names none: the project's (ft, psf or tsf, pcf on a US
 * project; m, kPa, kN/m³ on an SI one), except a US CPT's cone readings (`US_CONE_UNITS`).
 */
export function defaultUnit(target: ImportTarget, key: string, system: UnitSystem, usStress: UsStressUnit = 'psf'): string | null {
  const q = importFieldQuantity(target, key)
  if (!q) return null
  if (system !== 'US') return { length: 'm', stress: 'kPa', unitWeight: 'kN/m³' }[q]
  if (target === 'cpt' && US_CONE_UNITS[key]) return US_CONE_UNITS[key]
  return { length: 'ft', stress: usStress, unitWeight: 'pcf' }[q]
}

/** The units to offer for each numeric field: the unit a mapped header names in brackets ("Depth (ft)"), else `defaultUnit`. */
export function suggestUnits(target: ImportTarget, mapping: ImportMapping, system: UnitSystem, usStress: UsStressUnit = 'psf'): ImportUnits {
  const out: ImportUnits = {}
  for (const [key, q] of Object.entries(QUANTITY_OF[target] ?? {})) {
    const named = headerUnit(mapping[key])
    out[key] = named && IMPORT_UNITS[q].includes(named) ? named : defaultUnit(target, key, system, usStress)!
  }
  return out
}

/** Where a column's unit came from, for the preview to say so: its heading, the saved mapping, or the default (`defaultUnit`). */
export type UnitSource = 'heading' | 'saved' | 'default' | 'chosen'

/**
 * Each numeric field's unit source as the preview shows it beside the choice: "heading" when the mapped heading
 * names the unit chosen, "saved" when it is the unit saved with the mapping, "default" when it is the default
 * for a heading that names none, else "chosen" (the user changed it).
 */
export function unitSources(target: ImportTarget, mapping: ImportMapping, units: ImportUnits, system: UnitSystem, usStress: UsStressUnit = 'psf', saved?: ImportUnits | null): Record<string, UnitSource> {
  const out: Record<string, UnitSource> = {}
  for (const key of Object.keys(QUANTITY_OF[target] ?? {})) {
    const unit = units[key]
    out[key] = headerUnit(mapping[key]) === unit ? 'heading' : saved?.[key] === unit ? 'saved' : defaultUnit(target, key, system, usStress) === unit ? 'default' : 'chosen'
  }
  return out
}

/** Problems with the units given, naming the file's column: a unit Pastload does not read for the field's quantity. */
export function checkUnits(target: ImportTarget, units: ImportUnits | undefined, mapping: ImportMapping = {}): string[] {
  const problems: string[] = []
  for (const [key, unit] of Object.entries(units ?? {})) {
    const field = TARGET_FIELDS[target].find(f => f.key === key)
    const q = importFieldQuantity(target, key)
    const name = field ? `${fieldName(field)}${mapping[key] ? ` (column “${mapping[key]}”)` : ''}` : key
    if (!field) problems.push(`${key} is not a column of ${TARGET_LABELS[target].toLowerCase()}.`)
    else if (!q) problems.push(`${name} has no unit to choose.`)
    else if (!IMPORT_UNITS[q].includes(unit)) problems.push(`${name} cannot be in ${JSON.stringify(unit)}: choose one of ${IMPORT_UNITS[q].join(', ')}.`)
  }
  return problems
}

/** The factor from the file's unit of a field to SI (1 when not given). */
export function unitFactorOf(target: ImportTarget, units: ImportUnits | undefined, key: string): number {
  const unit = units?.[key]
  return unit && importFieldQuantity(target, key) ? TO_SI[unit] ?? 1 : 1
}

/** Suggests a mapping field → header from the headers' spelling (a unit in brackets at the end aside). */
export function suggestMapping(target: ImportTarget, headers: readonly string[]): ImportMapping {
  const mapping: ImportMapping = {}
  const used = new Set<string>()
  for (const field of TARGET_FIELDS[target]) {
    const wanted = new Set(field.aliases.map(norm))
    const hit = headers.find(h => !used.has(h) && wanted.has(norm(h))) ?? headers.find(h => !used.has(h) && wanted.has(norm(bare(h))))
    if (hit) {
      mapping[field.key] = hit
      used.add(hit)
    }
  }
  return mapping
}

/** Problems with the mapping itself: a required field unmapped, a header that is not in the file. */
export function checkMapping(target: ImportTarget, headers: readonly string[], mapping: ImportMapping): string[] {
  const problems: string[] = []
  for (const field of TARGET_FIELDS[target]) {
    const header = mapping[field.key]
    if (!header) {
      if (field.required) problems.push(`${field.label} is required: choose the column that holds it.`)
    }
    else if (!headers.includes(header)) problems.push(`Column "${header}" (for ${field.label}) is not in the file.`)
  }
  if (target === 'oedometer-stages') {
    const mapped = Object.values(STAGE_VALUE_FIELDS).filter(k => mapping[k])
    const labels = Object.values(STAGE_VALUE_FIELDS).map(k => TARGET_FIELDS[target].find(x => x.key === k)!.label)
    if (mapped.length === 0) problems.push(`Choose the column of the stage values: one of ${labels.join(', ')}.`)
    if (mapped.length > 1) problems.push(`Map only one of ${labels.join(', ')}: it sets how the stages are read.`)
  }
  return problems
}

type Cell = string | number | boolean | Date | null | undefined
export type ParsedValue = string | number | null

/** One cell as a field of `type`: its value, or why it is not one (an empty cell is null). */
export function parseCell(raw: Cell, type: FieldType): { value: ParsedValue, error?: string } {
  if (raw === null || raw === undefined || (typeof raw === 'string' && raw.trim() === '')) return { value: null }
  if (type === 'number') {
    if (typeof raw === 'number') return Number.isFinite(raw) ? { value: raw } : { value: null, error: 'is not a finite number' }
    // Fast path for the usual plain decimal (a CPT file is hundreds of thousands of these).
    const direct = Number(raw)
    if (Number.isFinite(direct) && typeof raw === 'string') return { value: direct }
    const text = String(raw).trim().replace(/\s/g, '')
    // A decimal comma is accepted only when there is no other separator (e.g. "1,25").
    const n = Number(/^-?\d+,\d+$/.test(text) ? text.replace(',', '.') : text)
    return Number.isFinite(n) ? { value: n } : { value: null, error: `"${String(raw)}" is not a number` }
  }
  if (type === 'date' || type === 'datetime') {
    const d = raw instanceof Date ? raw : new Date(String(raw).trim())
    if (Number.isNaN(d.getTime())) return { value: null, error: `"${String(raw)}" is not a date (use YYYY-MM-DD${type === 'datetime' ? ' hh:mm' : ''})` }
    const iso = d.toISOString()
    // The same calendar range as every date the API takes (shared/schemas/common.ts).
    if (iso.slice(0, 10) < EARLIEST_DATE || iso.slice(0, 10) > LATEST_DATE) return { value: null, error: `"${String(raw)}" is not between ${EARLIEST_DATE} and ${LATEST_DATE}` }
    return { value: type === 'date' ? iso.slice(0, 10) : iso }
  }
  const text = String(raw).trim()
  if (!isPlainText(text)) return { value: null, error: PLAIN_TEXT_MESSAGE }
  if (type === 'uscs') {
    const sym = text.toUpperCase()
    return isUscsGroupSymbol(sym) ? { value: sym } : { value: null, error: `"${text}" is not an ASTM D2487 group symbol` }
  }
  if (typeof type === 'object') {
    const v = text.toLowerCase().replace(/[\s_]+/g, '-')
    return type.enum.includes(v) ? { value: v } : { value: null, error: `"${text}" is not one of ${type.enum.join(', ')}` }
  }
  return { value: text }
}

export interface ImportContext {
  /** Points already in the project, by identifier. */
  points: Map<string, { finalDepth: number }>
  /** Samples already in the project, as `point/sample`. */
  samples: Set<string>
  /** Stratum codes of the project. */
  strata: Set<string>
  /** For a CPT import: the sounding's point final depth. */
  cptFinalDepth?: number
  /** For an oedometer-stages import: e0 and the specimen height of the test the stages belong to. */
  oedometerBasis?: SpecimenBasis
  /** For a vane import: readings already in the project, as `point@depth` (depth in mm, rounded). */
  vaneDepths?: Set<string>
  /** A depth (m) as the row checks' messages write it, in the project's units; "12 m" when left out. */
  depthWords?: (metres: number) => string
}

/** The messages' depth words: the context's, else metres as stored. */
function depthWordsOf(ctx: Pick<ImportContext, 'depthWords'>): (metres: number) => string {
  return ctx.depthWords ?? (m => `${m} m`)
}

export interface ValidatedImport {
  records: Record<string, ParsedValue>[]
  /** File row number of each record, for messages after validation. */
  rowNumbers: number[]
  errors: RowError[]
}

/**
 * Checks every data row against the target: types, required fields, references
 * to points/samples/strata, and the target's own rules (interval overlaps and
 * depths beyond the hole, increasing CPT depth). `rows` are the data rows after
 * the header; `fileRows` their 1-based rows in the file (default: header on row 1, no blank lines).
 */
export function validateRows(target: ImportTarget, headers: readonly string[], rows: readonly Cell[][], mapping: ImportMapping, ctx: ImportContext, fileRows?: readonly number[], units?: ImportUnits): ValidatedImport {
  const fields = TARGET_FIELDS[target]
  // Numbers in the file's units become SI as they are read, before any check compares them.
  const factors = new Map(fields.map(field => [field.key, unitFactorOf(target, units, field.key)]))
  const index = new Map(headers.map((h, i) => [h, i]))
  const records: Record<string, ParsedValue>[] = []
  const rowNumbers: number[] = []
  const errors: RowError[] = []
  rows.forEach((cells, i) => {
    const row = fileRows?.[i] ?? i + 2
    const rec: Record<string, ParsedValue> = {}
    for (const field of fields) {
      const header = mapping[field.key]
      const col = header === undefined ? undefined : index.get(header)
      const { value, error } = col === undefined ? { value: null } : parseCell(cells[col], field.type)
      if (error) errors.push({ row, column: header!, message: `${field.label} ${error}.` })
      else if (value === null && field.required) errors.push({ row, column: header ?? field.label, message: `${field.label} is empty.` })
      const factor = factors.get(field.key) ?? 1
      rec[field.key] = typeof value === 'number' && factor !== 1 ? Number((value * factor).toPrecision(12)) : value
    }
    records.push(rec)
    rowNumbers.push(row)
  })
  checkReferences(target, records, rowNumbers, mapping, ctx, errors)
  errors.sort((a, b) => a.row - b.row)
  return { records, rowNumbers, errors }
}

function checkReferences(target: ImportTarget, records: Record<string, ParsedValue>[], rowNumbers: number[], mapping: ImportMapping, ctx: ImportContext, errors: RowError[]) {
  const col = (key: string) => mapping[key] ?? key
  const dw = depthWordsOf(ctx)
  const pointOf = (rec: Record<string, ParsedValue>, i: number) => {
    const id = rec.point
    if (typeof id !== 'string') return null
    const p = ctx.points.get(id)
    if (!p) errors.push({ row: rowNumbers[i]!, column: col('point'), message: `Point ${id} is not in this project.` })
    return p ?? null
  }
  if (target === 'points') {
    const seen = new Map<string, number>()
    records.forEach((rec, i) => {
      const id = rec.identifier
      if (typeof id !== 'string') return
      const first = seen.get(id)
      if (first !== undefined) errors.push({ row: rowNumbers[i]!, column: col('identifier'), message: `Point ${id} appears twice in the file (first on row ${first}).` })
      else seen.set(id, rowNumbers[i]!)
      if (ctx.points.has(id)) errors.push({ row: rowNumbers[i]!, column: col('identifier'), message: `Point ${id} already exists in this project.` })
      if (typeof rec.finalDepth === 'number' && rec.finalDepth <= 0) errors.push({ row: rowNumbers[i]!, column: col('finalDepth'), message: 'Final depth must be deeper than 0 m.' })
    })
  }
  if (target === 'intervals') {
    const byPoint = new Map<string, { top: number, bottom: number, i: number }[]>()
    records.forEach((rec, i) => {
      const p = pointOf(rec, i)
      if (typeof rec.stratum === 'string' && !ctx.strata.has(rec.stratum)) errors.push({ row: rowNumbers[i]!, column: col('stratum'), message: `Stratum ${rec.stratum} is not defined in this project.` })
      if (!p || typeof rec.top !== 'number' || typeof rec.bottom !== 'number') return
      const list = byPoint.get(rec.point as string) ?? []
      list.push({ top: rec.top, bottom: rec.bottom, i })
      byPoint.set(rec.point as string, list)
    })
    for (const [id, list] of byPoint) {
      const { issues } = checkIntervals(list, ctx.points.get(id)!.finalDepth)
      for (const issue of issues) {
        const i = list[issue.index]!.i
        errors.push({ row: rowNumbers[i]!, column: col(issue.field), message: `${id}: ${issue.message.replace(/\(row (\d+)\)/, (_m, n: string) => `(file row ${rowNumbers[list[Number(n) - 1]!.i]})`)}` })
      }
    }
  }
  if (target === 'samples') {
    const seen = new Set<string>()
    records.forEach((rec, i) => {
      const p = pointOf(rec, i)
      const key = `${String(rec.point)}/${String(rec.identifier)}`
      if (seen.has(key) || ctx.samples.has(key)) errors.push({ row: rowNumbers[i]!, column: col('identifier'), message: `Sample ${String(rec.identifier)} already exists at ${String(rec.point)}.` })
      seen.add(key)
      if (typeof rec.top === 'number' && typeof rec.bottom === 'number' && rec.bottom < rec.top) errors.push({ row: rowNumbers[i]!, column: col('bottom'), message: 'Bottom must not be above the top.' })
      if (p && typeof rec.bottom === 'number' && rec.bottom > p.finalDepth) errors.push({ row: rowNumbers[i]!, column: col('bottom'), message: `Bottom (${dw(rec.bottom)}) is below the hole's final depth (${dw(p.finalDepth)}).` })
    })
  }
  if (target === 'index-tests') {
    records.forEach((rec, i) => {
      if (!pointOf(rec, i)) return
      if (!ctx.samples.has(`${String(rec.point)}/${String(rec.sample)}`)) errors.push({ row: rowNumbers[i]!, column: col('sample'), message: `Sample ${String(rec.sample)} is not logged at ${String(rec.point)}.` })
      if (typeof rec.liquidLimit === 'number' && typeof rec.plasticLimit === 'number' && rec.plasticLimit > rec.liquidLimit) errors.push({ row: rowNumbers[i]!, column: col('plasticLimit'), message: 'The plastic limit exceeds the liquid limit.' })
    })
  }
  if (target === 'groundwater') {
    records.forEach((rec, i) => {
      const p = pointOf(rec, i)
      if (rec.depth === null && rec.pressure === null) errors.push({ row: rowNumbers[i]!, column: col('depth'), message: 'Give a depth or a pressure.' })
      if (p && typeof rec.depth === 'number' && rec.depth > p.finalDepth) errors.push({ row: rowNumbers[i]!, column: col('depth'), message: `Depth (${dw(rec.depth)}) is below the hole's final depth (${dw(p.finalDepth)}).` })
    })
  }
  if (target === 'cpt') {
    let prev = -Infinity
    records.forEach((rec, i) => {
      if (typeof rec.depth !== 'number') return
      if (rec.depth <= prev) errors.push({ row: rowNumbers[i]!, column: col('depth'), message: `Depth ${dw(rec.depth)} does not increase from the row above (${dw(prev)}).` })
      if (ctx.cptFinalDepth !== undefined && rec.depth > ctx.cptFinalDepth) errors.push({ row: rowNumbers[i]!, column: col('depth'), message: `Depth ${dw(rec.depth)} is below the point's final depth (${dw(ctx.cptFinalDepth)}).` })
      prev = rec.depth
    })
  }
  if (target === 'oedometer-stages') checkStages(records, rowNumbers, mapping, ctx, errors)
  if (target === 'vane') checkVane(records, rowNumbers, mapping, ctx, errors, pointOf)
}

/** Key of a vane reading: the point and the depth to the millimetre. */
export const vaneKey = (point: string, depth: number) => `${point}@${Math.round(depth * 1000)}`

/**
 * An oedometer-stages file, row by row, with the same rules as the test form: each stage goes
 * through `convertStages` (σ' > 0, void ratio above 0 after conversion) and `StageInputSchema`
 * (the bounds of the form); the stage numbers, when given, run in test order.
 */
function checkStages(records: Record<string, ParsedValue>[], rowNumbers: number[], mapping: ImportMapping, ctx: ImportContext, errors: RowError[]) {
  const convention = stageConventionOf(mapping)
  if (!convention) return
  if (convention !== 'void-ratio' && !ctx.oedometerBasis) throw new Error('An oedometer-stages check needs the test\'s e0 and specimen height.')
  const basis = ctx.oedometerBasis ?? { e0: 1, specimenHeight: 1 }
  const key = STAGE_VALUE_FIELDS[convention]
  const fields = TARGET_FIELDS['oedometer-stages']
  const label = (k: string) => fields.find(x => x.key === k)!.label
  const col = (k: string) => mapping[k] ?? label(k)
  const hasError = (row: number, column: string) => errors.some(e => e.row === row && e.column === column)
  let prevStage: { n: number, row: number } | null = null
  records.forEach((rec, i) => {
    const row = rowNumbers[i]!
    if (i === MAX_STAGES) errors.push({ row, column: col('stress'), message: `A test holds at most ${MAX_STAGES} stages; this file has ${records.length}.` })
    if (typeof rec.stage === 'number') {
      if (!Number.isInteger(rec.stage) || rec.stage < 1) errors.push({ row, column: col('stage'), message: `Stage ${rec.stage} is not a whole number from 1 up.` })
      else {
        if (prevStage && rec.stage <= prevStage.n) errors.push({ row, column: col('stage'), message: `Stage ${rec.stage} does not follow stage ${prevStage.n} (file row ${prevStage.row}): list the stages in test order.` })
        prevStage = { n: rec.stage, row }
      }
    }
    const value = rec[key]
    if (value === null && !hasError(row, col(key))) errors.push({ row, column: col(key), message: `${label(key)} is empty.` })
    if (typeof rec.stress !== 'number' || typeof value !== 'number') return
    const n = typeof rec.stage === 'number' && Number.isInteger(rec.stage) && rec.stage >= 1 ? rec.stage : i + 1
    try {
      convertStages(convention, [{ stress: rec.stress, value }], basis)
    }
    catch (err) {
      if (!isGeotechError(err)) throw err
      const column = err.code === 'stress-not-positive' ? col('stress') : col(key)
      errors.push({ row, column, message: err.message.replace(/^Stage 1:/, `Stage ${n}:`) })
      return
    }
    const shape = StageInputSchema.safeParse({ stress: rec.stress, value })
    if (!shape.success) {
      for (const issue of shape.error.issues) {
        const k = issue.path[0] === 'stress' ? 'stress' : key
        errors.push({ row, column: col(k), message: `Stage ${n}: ${k === 'stress' ? issue.message : `${label(key)} ${issue.message}`}.` })
      }
    }
  })
}

/** Field vane rows: the point must exist, the reading fit the hole and the form's bounds, and not be there already. */
function checkVane(records: Record<string, ParsedValue>[], rowNumbers: number[], mapping: ImportMapping, ctx: ImportContext, errors: RowError[], pointOf: (rec: Record<string, ParsedValue>, i: number) => { finalDepth: number } | null) {
  const fields = TARGET_FIELDS.vane
  const col = (k: string) => mapping[k] ?? fields.find(x => x.key === k)!.label
  const seen = new Map<string, number>()
  const dw = depthWordsOf(ctx)
  records.forEach((rec, i) => {
    const row = rowNumbers[i]!
    const p = pointOf(rec, i)
    if (typeof rec.depth !== 'number' || typeof rec.peak !== 'number') return
    const shape = VaneInputSchema.safeParse({ depth: rec.depth, peak: rec.peak, remoulded: rec.remoulded })
    if (!shape.success) {
      for (const issue of shape.error.issues) {
        const k = String(issue.path[0])
        // The depth's own messages name it; peak and remoulded messages need their label.
        errors.push({ row, column: col(k), message: k === 'depth' ? `${issue.message}.` : `${fields.find(x => x.key === k)!.label} ${issue.message}.` })
      }
    }
    if (!p) return
    if (rec.depth > p.finalDepth) errors.push({ row, column: col('depth'), message: `Depth (${dw(rec.depth)}) is below the hole's final depth (${dw(p.finalDepth)}).` })
    const k = vaneKey(String(rec.point), rec.depth)
    const first = seen.get(k)
    if (first !== undefined) errors.push({ row, column: col('depth'), message: `${String(rec.point)} at ${dw(rec.depth)} appears twice in the file (first on row ${first}).` })
    else seen.set(k, row)
    if (ctx.vaneDepths?.has(k)) errors.push({ row, column: col('depth'), message: `${String(rec.point)} already has a vane reading at ${dw(rec.depth)}.` })
  })
}
