import Papa from 'papaparse'
import { parseCell, type ImportMapping, type ImportUnits, type RowError, TARGET_FIELDS, unitFactorOf } from './targets'

/**
 * The CPT import's check of a CSV without quote characters in one pass of
 * papaparse's row reader: numbers go straight into typed columns and each row is
 * checked as it is read, with no table or records kept. It reports exactly what
 * the general row check (`validateRows` on the parsed table) reports, in the same
 * order with the same file row numbers.
 */
export interface PlainCsvText {
  text: string
  /** The line break and delimiter papaparse reads this text with. */
  newline: string
  delimiter: string
  headers: string[]
  /** 0-based index of the header row among papaparse's rows (blank rows above it included). */
  headerRow: number
}

export interface CptColumns {
  depth: Float64Array
  qc: Float64Array
  fs: Float64Array
  u2: Float64Array
}

export interface CheckedCpt {
  /** Data rows (blank lines are skipped but counted in row numbers). */
  rowCount: number
  columns: CptColumns
  errors: RowError[]
  /** Reading stopped at `maxRows` with more rows to come: nothing past them was read or checked. */
  overLimit?: boolean
}

/** A row whose every cell is blank after trimming, as the table reader skips it. */
export function isBlankRow(cells: readonly string[]): boolean {
  // A first cell that starts with a printable ASCII character is never trimmed away.
  const c = cells[0]?.charCodeAt(0) ?? 0
  if (c > 32 && c < 127) return false
  return cells.every(cell => cell.trim() === '')
}

/**
 * Reads `text` row by row with papaparse (each row handed to `onRow` with its
 * 0-based index; `onRow` returns false to stop reading).
 */
export function eachCsvRow(text: string, format: { newline: string, delimiter: string }, onRow: (cells: string[], index: number) => boolean | void): void {
  let index = 0
  Papa.parse<string[]>(text, {
    newline: format.newline as Papa.ParseConfig['newline'],
    delimiter: format.delimiter,
    skipEmptyLines: false,
    step: (result, parser) => {
      if (onRow(result.data, index++) === false) parser.abort()
    },
  })
}

/** `mapping` must already have passed `checkMapping` (every CPT field mapped to a header of the file). */
export function checkCptCsv(csv: PlainCsvText, mapping: ImportMapping, ctx: { cptFinalDepth?: number, maxRows?: number, units?: ImportUnits, depthWords?: (metres: number) => string }): CheckedCpt {
  const fields = TARGET_FIELDS.cpt
  // Numbers in the file's units become SI as they are read.
  const factors = fields.map(f => unitFactorOf('cpt', ctx.units, f.key))
  const headerOf = fields.map(f => mapping[f.key] ?? '')
  const columnOf = headerOf.map(h => csv.headers.indexOf(h))
  if (columnOf.some(c => c < 0)) throw new Error('checkCptCsv needs a checked mapping')
  const finalDepth = ctx.cptFinalDepth
  // Depths in messages in the project's units, as the general row check writes them.
  const dw = ctx.depthWords ?? ((m: number) => `${m} m`)
  let capacity = Math.max(64, Math.ceil(csv.text.length / 24))
  let cols = [new Float64Array(capacity), new Float64Array(capacity), new Float64Array(capacity), new Float64Array(capacity)]
  const values = [0, 0, 0, 0]
  // Per field of the current row: '' when read, else the reason it was not (pushed in field order).
  const problem = ['', '', '', '']
  const errors: RowError[] = []
  let n = 0
  let prev = -Infinity
  let overLimit = false
  eachCsvRow(csv.text, csv, (cells, index) => {
    if (index <= csv.headerRow || isBlankRow(cells)) return
    if (ctx.maxRows !== undefined && n >= ctx.maxRows) {
      overLimit = true
      return false
    }
    const row = index + 1
    for (let k = 0; k < 4; k++) {
      // As `parseCell` reads a number: a blank cell is empty, Number() first, then the general reading.
      const cell = cells[columnOf[k]!]
      let v = cell === undefined ? Number.NaN : Number(cell)
      let why = ''
      if (v === 0 && cell!.trim() === '') v = Number.NaN
      else if (cell !== undefined && !Number.isFinite(v)) {
        const parsed = parseCell(cell, 'number')
        v = Number.NaN
        if (parsed.error) why = parsed.error
        else if (parsed.value !== null) v = parsed.value as number
      }
      values[k] = factors[k] === 1 ? v : Number((v * factors[k]!).toPrecision(12))
      problem[k] = why ? `${fields[k]!.label} ${why}.` : Number.isNaN(v) ? `${fields[k]!.label} is empty.` : ''
    }
    for (let k = 0; k < 4; k++) if (problem[k]) errors.push({ row, column: headerOf[k]!, message: problem[k]! })
    if (!problem[0]) {
      const depth = values[0]!
      if (depth <= prev) errors.push({ row, column: headerOf[0]!, message: `Depth ${dw(depth)} does not increase from the row above (${dw(prev)}).` })
      if (finalDepth !== undefined && depth > finalDepth) errors.push({ row, column: headerOf[0]!, message: `Depth ${dw(depth)} is below the point's final depth (${dw(finalDepth)}).` })
      prev = depth
    }
    if (n === capacity) {
      capacity *= 2
      cols = cols.map((a) => {
        const b = new Float64Array(capacity)
        b.set(a)
        return b
      })
    }
    cols[0]![n] = values[0]!
    cols[1]![n] = values[1]!
    cols[2]![n] = values[2]!
    cols[3]![n] = values[3]!
    n++
  })
  const columns = { depth: cols[0]!.subarray(0, n), qc: cols[1]!.subarray(0, n), fs: cols[2]!.subarray(0, n), u2: cols[3]!.subarray(0, n) }
  return overLimit ? { rowCount: n, columns, errors, overLimit } : { rowCount: n, columns, errors }
}
