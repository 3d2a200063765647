import { parseCell, type ImportMapping, type RowError, TARGET_FIELDS } from './targets'

/**
 * The CPT import's check of a plain CSV (no quote characters) in one pass over
 * the text: numbers go straight into typed columns and each row is checked as
 * it is read, with no row arrays or records. It reports exactly what the
 * general row check (`validateRows` on the parsed table) reports, in the same
 * order with the same file row numbers; the server uses it only for text that
 * papaparse would split plainly on the line break and the delimiter.
 */
export interface PlainCsvText {
  text: string
  /** The line break and delimiter papaparse uses for this text. */
  newline: string
  delimiter: string
  headers: string[]
  /** Offset of the first line after the header row, and that line's 1-based file row. */
  dataStart: number
  dataRow: number
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

// Exact powers of ten: a mantissa below 2^53 divided by one of them is correctly rounded, as Number() is.
const POW10 = Array.from({ length: 16 }, (_, i) => 10 ** i)

/** A row whose every cell is blank after trimming, as the table reader skips it. */
export function isBlankLine(text: string, s: number, e: number, delimiter: string): boolean {
  if (s === e) return true
  const c = text.charCodeAt(s)
  // A printable ASCII character other than the delimiter is never trimmed away.
  if (c > 32 && c < 127 && c !== delimiter.charCodeAt(0)) return false
  return text.slice(s, e).split(delimiter).every(cell => cell.trim() === '')
}

/** `mapping` must already have passed `checkMapping` (every CPT field mapped to a header of the file). */
export function checkCptCsv(csv: PlainCsvText, mapping: ImportMapping, ctx: { cptFinalDepth?: number, maxRows?: number }): CheckedCpt {
  const { text, newline, delimiter } = csv
  const fields = TARGET_FIELDS.cpt
  const headerOf = fields.map(f => mapping[f.key] ?? '')
  const columnOf = headerOf.map(h => csv.headers.indexOf(h))
  if (columnOf.some(c => c < 0)) throw new Error('checkCptCsv needs a checked mapping')
  const lastColumn = Math.max(...columnOf)
  const wanted = Array.from({ length: lastColumn + 1 }, (_, c) => columnOf.includes(c))
  // papaparse guesses one of , \t | ; and two control characters: always one character.
  if (delimiter.length !== 1) throw new Error('checkCptCsv reads a one-character delimiter')
  const delimiterCode = delimiter.charCodeAt(0)
  const finalDepth = ctx.cptFinalDepth
  let capacity = Math.max(64, Math.ceil((text.length - csv.dataStart) / 24))
  let cols = [new Float64Array(capacity), new Float64Array(capacity), new Float64Array(capacity), new Float64Array(capacity)]
  const values = [0, 0, 0, 0]
  // Per field of the current row: '' when read, else the reason it was not (pushed in field order).
  const problem = ['', '', '', '']
  const errors: RowError[] = []
  let n = 0
  let prev = -Infinity
  let row = csv.dataRow
  let pos = csv.dataStart
  const nl = newline.length
  const dl = delimiter.length
  for (;;) {
    let end = text.indexOf(newline, pos)
    const last = end < 0
    if (last) end = text.length
    if (!isBlankLine(text, pos, end, delimiter)) {
      if (ctx.maxRows !== undefined && n >= ctx.maxRows) return { rowCount: n, columns: { depth: cols[0]!.subarray(0, n), qc: cols[1]!.subarray(0, n), fs: cols[2]!.subarray(0, n), u2: cols[3]!.subarray(0, n) }, errors, overLimit: true }
      let s = pos
      for (let c = 0; c <= lastColumn; c++) {
        // The cell is [s, e); past the line's last cell it is missing (s > end).
        let e: number
        let v = Number.NaN
        let why = ''
        if (s > end) e = s
        else if (!wanted[c]) {
          e = text.indexOf(delimiter, s)
          if (e < 0 || e > end) e = end
        }
        else {
          // A plain decimal (-?digits[.digits], at most 15 digits) is read while looking for the cell's end;
          // anything else (spaces, a plus sign, an exponent, a decimal comma, text) goes to the general cell parser.
          let i = s
          let neg = false
          if (i < end && text.charCodeAt(i) === 45) {
            neg = true
            i++
          }
          let m = 0
          let digits = 0
          let frac = 0
          let dot = false
          let plain = true
          for (; i < end; i++) {
            const ch = text.charCodeAt(i)
            if (ch >= 48 && ch <= 57) {
              m = m * 10 + (ch - 48)
              digits++
              if (dot) frac++
            }
            else if (ch === delimiterCode) break
            else if (ch === 46 && !dot) dot = true
            else {
              plain = false
              break
            }
          }
          if (plain) {
            e = i
            if (digits > 0 && digits <= 15) {
              const abs = frac === 0 ? m : m / POW10[frac]!
              v = neg ? -abs : abs
            }
          }
          else {
            e = text.indexOf(delimiter, i)
            if (e < 0 || e > end) e = end
          }
          if (Number.isNaN(v) && e > s) {
            const parsed = parseCell(text.slice(s, e), 'number')
            if (parsed.error) why = parsed.error
            else if (parsed.value !== null) v = parsed.value as number
          }
        }
        if (wanted[c]) {
          for (let k = 0; k < 4; k++) {
            if (columnOf[k] !== c) continue
            values[k] = v
            problem[k] = why ? `${fields[k]!.label} ${why}.` : Number.isNaN(v) ? `${fields[k]!.label} is empty.` : ''
          }
        }
        s = e + dl
      }
      for (let k = 0; k < 4; k++) if (problem[k]) errors.push({ row, column: headerOf[k]!, message: problem[k]! })
      if (!problem[0]) {
        const depth = values[0]!
        if (depth <= prev) errors.push({ row, column: headerOf[0]!, message: `Depth ${depth} m does not increase from the row above (${prev} m).` })
        if (finalDepth !== undefined && depth > finalDepth) errors.push({ row, column: headerOf[0]!, message: `Depth ${depth} m is below the point's final depth (${finalDepth} m).` })
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
    }
    if (last) break
    pos = end + nl
    row++
  }
  return { rowCount: n, columns: { depth: cols[0]!.subarray(0, n), qc: cols[1]!.subarray(0, n), fs: cols[2]!.subarray(0, n), u2: cols[3]!.subarray(0, n) }, errors }
}
