/**
 * Reading cells pasted from a spreadsheet: rows separated by line breaks, cells by tabs (what a
 * spreadsheet puts on the clipboard), or by semicolons or runs of spaces when there is no tab.
 * A decimal comma is read as a point when the cells are not comma-separated. Header rows (any
 * row whose first cell is not a number) are skipped; blank rows are ignored.
 */
import Papa from 'papaparse'

export interface PasteIssue {
  /** 1-based line of the pasted text. */
  line: number
  message: string
}

export interface PastedRows {
  rows: number[][]
  /** 1-based line of each row in `rows`. */
  lines: number[]
  issues: PasteIssue[]
  /** Header rows that were skipped. */
  skipped: number
}

/**
 * A line's cells, read by papaparse (so a cell a spreadsheet quoted comes back
 * without its quotes) with the line's own delimiter: a tab, else a semicolon,
 * else runs of spaces, else a comma.
 */
function splitLine(line: string): string[] {
  let text = line
  let delimiter = ','
  if (line.includes('\t')) delimiter = '\t'
  else if (line.includes(';')) delimiter = ';'
  else {
    text = line.trim()
    if (/\s/.test(text)) {
      text = text.replace(/\s+/g, ' ')
      delimiter = ' '
    }
  }
  return Papa.parse<string[]>(text, { delimiter, newline: '\n', skipEmptyLines: false }).data[0] ?? []
}

/** A cell as a number: "1.5", "1,5", " 2 560 " (thin or normal spaces as thousands separators). */
export function parseCell(cell: string): number {
  const t = cell.trim().replace(/[\u00a0\u2009\u202f]/g, '').replace(/ (?=\d{3}\b)/g, '')
  if (t === '') return Number.NaN
  const normalised = /^-?\d+,\d+$/.test(t) ? t.replace(',', '.') : t
  return /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(normalised) ? Number(normalised) : Number.NaN
}

/** Rows of `columns` numbers each; rows with fewer numbers, or non-numeric cells after the first row, are issues. */
export function parsePastedRows(text: string, columns: number): PastedRows {
  const out: PastedRows = { rows: [], lines: [], issues: [], skipped: 0 }
  const lines = text.replace(/\r\n?/g, '\n').split('\n')
  lines.forEach((raw, i) => {
    const line = i + 1
    if (raw.trim() === '') return
    const cells = splitLine(raw).map(c => c.trim())
    const values = cells.slice(0, columns).map(parseCell)
    if (out.rows.length === 0 && out.issues.length === 0 && !Number.isFinite(values[0] ?? Number.NaN)) {
      out.skipped++
      return
    }
    if (cells.length < columns) {
      out.issues.push({ line, message: `Line ${line}: expected ${columns} columns, found ${cells.length}.` })
      return
    }
    const bad = values.findIndex(v => !Number.isFinite(v))
    if (bad !== -1) {
      out.issues.push({ line, message: `Line ${line}, column ${bad + 1}: "${cells[bad]}" is not a number.` })
      return
    }
    out.rows.push(values)
    out.lines.push(line)
  })
  return out
}

/** Stages from two pasted columns: σ' (kPa) and the value in the test's convention. */
export function parseStagePaste(text: string): { stages: { stress: number, value: number }[], issues: PasteIssue[], skipped: number } {
  const parsed = parsePastedRows(text, 2)
  return { stages: parsed.rows.map(([stress, value]) => ({ stress: stress!, value: value! })), issues: parsed.issues, skipped: parsed.skipped }
}

/**
 * Time readings from three pasted columns: stage number (1-based, as in the stage table), minutes
 * since the load was applied, gauge reading (mm). Grouped by stage in the order given.
 */
export function parseReadingsPaste(text: string, stageCount: number): { readings: Map<number, { minutes: number, dial: number }[]>, issues: PasteIssue[], skipped: number } {
  const parsed = parsePastedRows(text, 3)
  const readings = new Map<number, { minutes: number, dial: number }[]>()
  const issues = [...parsed.issues]
  parsed.rows.forEach(([stage, minutes, dial], k) => {
    const line = parsed.lines[k]!
    if (!Number.isInteger(stage) || stage! < 1 || stage! > stageCount) {
      issues.push({ line, message: `Line ${line}: stage ${stage} is not one of the ${stageCount} stages.` })
      return
    }
    const list = readings.get(stage! - 1) ?? []
    list.push({ minutes: minutes!, dial: dial! })
    readings.set(stage! - 1, list)
  })
  return { readings, issues, skipped: parsed.skipped }
}
