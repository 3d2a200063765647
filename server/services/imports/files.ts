import Papa from 'papaparse'
import { eachCsvRow, isBlankRow, type PlainCsvText } from '#shared/imports/cpt-csv'
import { IMPORT_ROW_LIMITS, tooManyRows, UPLOAD_ROW_LIMIT } from '#shared/imports/limits'
import type { ImportTarget } from '#shared/imports/targets'
import type { ImportFormat, ServerImportCell } from '#shared/types/imports'
import { readWorkbookGrid } from './workbook'

/**
 * Reading uploaded files: the format is decided by content (never by the name
 * alone), text must be UTF-8, and every refusal says plainly what is wrong.
 */
export type UploadFormat = ImportFormat

export type Cell = ServerImportCell

export interface Table {
  sheets: string[]
  sheet: string | null
  headers: string[]
  rows: Cell[][]
  /** 1-based file row of each data row (blank lines are skipped but still counted). */
  rowNumbers: number[]
}

export class UploadError extends Error {
  constructor(message: string, readonly code: string) {
    super(message)
  }
}

const ZIP = [0x50, 0x4B, 0x03, 0x04]

export function detectFormat(buf: Buffer, filename: string): UploadFormat {
  if (buf.length === 0) throw new UploadError(`${filename} is empty.`, 'empty-file')
  if (ZIP.every((b, i) => buf[i] === b)) {
    if (!buf.includes(Buffer.from('xl/'))) throw new UploadError(`${filename} is a ZIP archive but not an Excel workbook (.xlsx).`, 'wrong-type')
    return 'xlsx'
  }
  if (buf.subarray(0, 4).toString('latin1') === '%PDF') throw new UploadError(`${filename} is a PDF. Upload CSV, XLSX or AGS4 data; attach reports to the project instead.`, 'wrong-type')
  if (buf.subarray(0, 8).equals(Buffer.from([0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1]))) throw new UploadError(`${filename} is an old binary Excel file (.xls): save it as .xlsx or CSV and upload again.`, 'wrong-type')
  if (buf.subarray(0, 8192).includes(0)) throw new UploadError(`${filename} is not a text or spreadsheet file.`, 'wrong-type')
  const text = decodeText(buf, filename)
  const first = firstNonBlankLine(text)
  if (/^"GROUP"\s*,/.test(first)) return 'ags4'
  if (first.trim() === '') throw new UploadError(`${filename} has no data (only blank lines).`, 'empty-file')
  return 'csv'
}

/** The first line (split on \n) that is not only whitespace, without splitting the whole text. */
function firstNonBlankLine(text: string): string {
  let start = 0
  for (;;) {
    const end = text.indexOf('\n', start)
    const line = end < 0 ? text.slice(start) : text.slice(start, end)
    if (line.trim() !== '') return line
    if (end < 0) return ''
    start = end + 1
  }
}

/** UTF-8 text (a BOM is dropped); anything else is refused with a way out. */
export function decodeText(buf: Buffer, filename: string): string {
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(buf)
    return text.charCodeAt(0) === 0xFEFF ? text.slice(1) : text
  }
  catch {
    throw new UploadError(`${filename} is not UTF-8 text (it may be saved in a legacy encoding). Save it as "CSV UTF-8" and upload again.`, 'wrong-encoding')
  }
}

/**
 * First row is the header; blank lines are skipped; headers must be present and unique.
 * `previewRows` reads only the header and that many rows (plus a cheap count of
 * the rest), so a preview of a 200 000-row file does not parse it all. `target`
 * (when known) sets the row limit; without it the largest target's applies. A
 * file over it is refused before its rows are parsed; a workbook is read in a
 * worker thread (`./workbook.ts`).
 */
export async function readTable(buf: Buffer, format: 'csv' | 'xlsx', filename: string, sheet?: string, previewRows?: number, target?: ImportTarget): Promise<Table & { rowCount: number }> {
  if (format === 'csv') return readCsvTable(buf, filename, previewRows, target)
  // The header and the limit's rows, and one more to tell that the sheet goes on.
  const sheetRows = (target ? IMPORT_ROW_LIMITS[target] : UPLOAD_ROW_LIMIT) + 2
  const book = await readWorkbookGrid(buf, filename, sheet, sheetRows)
  if (book.truncated) throw tooManyRows(filename, sheetRows - 1, target ?? null, true)
  return tableFromGrid(book.grid, book.sheets, book.sheet, filename, previewRows, null)
}

/** `readTable` for a CSV (on the calling thread: papaparse, with the row limit checked on a line count first). */
export function readCsvTable(buf: Buffer, filename: string, previewRows?: number, target?: ImportTarget): Table & { rowCount: number } {
  const rowLimit = target ? IMPORT_ROW_LIMITS[target] : UPLOAD_ROW_LIMIT
  const text = decodeText(buf, filename)
  // Counted before parsing: the header line and the data lines (a quoted line break counts twice, which only matters at the limit).
  const lines = countDataLines(text)
  if (lines - 1 > rowLimit) throw tooManyRows(filename, lines - 1, target ?? null)
  let parsed: Papa.ParseResult<string[]>
  if (previewRows && !text.includes('"')) {
    // Without quotes papaparse splits on the line break: the rows a preview keeps are those of the
    // text's first lines, parsed with the line break it would guess for the whole text.
    const newline = csvNewline(text)
    parsed = Papa.parse<string[]>(firstLines(text, newline, previewRows + 50), { skipEmptyLines: false, newline, preview: previewRows + 50 })
  }
  else {
    parsed = Papa.parse<string[]>(text, { skipEmptyLines: false, ...(previewRows ? { preview: previewRows + 50 } : {}) })
  }
  const fatal = parsed.errors.find(e => e.type === 'Quotes')
  if (fatal) throw new UploadError(`${filename} row ${(fatal.row ?? 0) + 1}: ${fatal.message}.`, 'malformed-csv')
  return tableFromGrid(parsed.data, [], null, filename, previewRows, previewRows ? lines : null)
}

function tableFromGrid(grid: Cell[][], sheets: string[], chosen: string | null, filename: string, previewRows: number | undefined, csvLineCount: number | null): Table & { rowCount: number } {
  const blank = (r: Cell[]) => r.every(c => c === null || c === undefined || String(c).trim() === '')
  const headIndex = grid.findIndex(r => !blank(r))
  const head = grid[headIndex]
  if (!head) throw new UploadError(`${filename} has no header row.`, 'empty-file')
  const rows: Cell[][] = []
  const rowNumbers: number[] = []
  for (let i = headIndex + 1; i < grid.length; i++) {
    if (blank(grid[i]!)) continue
    rows.push(grid[i]!)
    rowNumbers.push(i + 1)
  }
  const headers = headerNames(head, filename)
  if (rows.length === 0) throw new UploadError(`${filename} has a header but no data rows.`, 'empty-file')
  // A preview's count is of non-blank lines after the header (quoted line breaks are rare in data files).
  const rowCount = csvLineCount !== null ? Math.max(rows.length, csvLineCount - headIndex - 1) : rows.length
  return { sheets, sheet: chosen, headers, rows: previewRows ? rows.slice(0, previewRows) : rows, rowNumbers, rowCount }
}

function headerNames(head: Cell[], filename: string): string[] {
  const headers = head.map((c, i) => (c === null || c === undefined || String(c).trim() === '' ? `Column ${i + 1}` : String(c).trim()))
  const dup = headers.find((h, i) => headers.indexOf(h) !== i)
  if (dup) throw new UploadError(`${filename}: the column header "${dup}" appears twice.`, 'duplicate-header')
  return headers
}

/** Non-blank lines (split on \n); a line that starts with a printable character is counted without slicing it. */
function countDataLines(text: string): number {
  let n = 0
  let start = 0
  for (;;) {
    const end = text.indexOf('\n', start)
    const stop = end < 0 ? text.length : end
    const c = text.charCodeAt(start)
    if (start < stop && ((c > 32 && c < 127) || text.slice(start, stop).trim() !== '')) n++
    if (end < 0) return n
    start = end + 1
  }
}

/** The text up to (not including) its `count`-th line break, or all of it. */
function firstLines(text: string, newline: string, count: number): string {
  let at = -newline.length
  for (let i = 0; i < count; i++) {
    at = text.indexOf(newline, at + newline.length)
    if (at < 0) return text
  }
  return text.slice(0, at)
}

/**
 * The line break papaparse guesses for a text without quotes (its guessLineEndings:
 * the first megabyte, \n unless \r comes first and most \r are followed by \n).
 */
export function csvNewline(text: string): '\n' | '\r\n' | '\r' {
  const head = text.substring(0, 1024 * 1024)
  if (!head.includes('\r')) return '\n'
  const r = head.split('\r')
  const n = head.split('\n')
  if (n.length > 1 && n[0]!.length < r[0]!.length) return '\n'
  let withN = 0
  for (const part of r) if (part[0] === '\n') withN++
  return withN >= r.length / 2 ? '\r\n' : '\r'
}

/**
 * A CSV without quote characters, read by papaparse with the line break and
 * delimiter it guesses, with the same header rules as `readTable`, for a one-pass
 * check of its columns. Null when the text has a quote character: then the
 * general reader applies.
 */
export function openPlainCsv(buf: Buffer, filename: string): PlainCsvText | null {
  const text = decodeText(buf, filename)
  if (text.includes('"')) return null
  const newline = csvNewline(text)
  // papaparse guesses the delimiter from the first ten lines only.
  const delimiter = Papa.parse<string[]>(firstLines(text, newline, 10), { skipEmptyLines: false, newline, preview: 1 }).meta.delimiter
  // The header is the first non-blank row, and a data row must follow it: read the first lines, more if need be.
  for (let lines = 16; ; lines *= 16) {
    const part = firstLines(text, newline, lines)
    let header: { cells: string[], index: number } | null = null
    let hasData = false
    eachCsvRow(part, { newline, delimiter }, (cells, index) => {
      if (isBlankRow(cells)) return
      if (header) {
        hasData = true
        return false
      }
      header = { cells, index }
    })
    const found = header as { cells: string[], index: number } | null
    if (hasData || part.length === text.length) {
      if (!found) throw new UploadError(`${filename} has no header row.`, 'empty-file')
      const headers = headerNames(found.cells, filename)
      if (!hasData) throw new UploadError(`${filename} has a header but no data rows.`, 'empty-file')
      return { text, newline, delimiter, headers, headerRow: found.index }
    }
  }
}
