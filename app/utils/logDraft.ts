import Papa from 'papaparse'
import { checkIntervals, type Gap } from '#shared/investigation/intervals'
import { isUscsGroupSymbol } from '#shared/geotech/plasticity'
import { IntervalInputSchema } from '#shared/schemas/investigation'
import { FOOT_M } from '#shared/units'
import { boundMessage } from '#shared/units/bounds'
import type { IntervalRow } from '#shared/types/investigation'

/**
 * The log table's editing model, kept free of Vue so its rules read in one place:
 * rows are edited as text, parsed into intervals, checked with the same zod schema
 * and interval rules as the server, and filled from spreadsheet pastes.
 */
export const LOG_COLUMNS = ['top', 'bottom', 'description', 'uscs', 'stratumId', 'moisture', 'consistency'] as const
export type LogColumn = (typeof LOG_COLUMNS)[number]

/** The unit depths are typed in: the project's length unit. The draft's text is in it; payloads are in metres. */
export type DepthUnit = 'm' | 'ft'
const METRES_PER: Record<DepthUnit, number> = { m: 1, ft: FOOT_M }

/** The column headings, depths in the given unit. */
export function logColumnLabels(unit: DepthUnit = 'm'): Record<LogColumn, string> {
  return {
    top: `Top (${unit})`,
    bottom: `Bottom (${unit})`,
    description: 'Description',
    uscs: 'USCS',
    stratumId: 'Stratum',
    moisture: 'Moisture',
    consistency: 'Consistency / density',
  }
}
export const LOG_COLUMN_LABELS: Record<LogColumn, string> = logColumnLabels('m')

/** A depth in metres as text in the unit: metres to 4 decimals at most, feet to 2 (trailing zeros dropped). */
export function depthText(metres: number, unit: DepthUnit = 'm'): string {
  return Number((metres / METRES_PER[unit]).toFixed(unit === 'm' ? 4 : 2)).toString()
}

/**
 * A typed depth in the unit as metres. From feet the metres are rounded to 0.1 mm, so a stored
 * depth shown in feet (4 decimals, within 0.02 mm) reads back as the same metres.
 */
export function depthToMetres(value: number, unit: DepthUnit = 'm'): number {
  if (unit === 'm' || !Number.isFinite(value)) return value
  return Math.round(value * METRES_PER[unit] * 1e4) / 1e4
}

export interface DraftRow {
  /** Stable key for Vue lists; not sent. */
  key: string
  id?: string
  version?: number
  top: string
  bottom: string
  description: string
  uscs: string
  stratumId: string
  moisture: string
  consistency: string
  /**
   * The saved depths in metres with the text first shown for them (feet rounded to 0.01): while a cell still
   * holds that text the row keeps its exact metres, so showing a log in feet never changes it.
   */
  saved?: { top: number, bottom: number, topText: string, bottomText: string }
}

/** A saved log interval as the point reply holds it (the fields the table edits). */
export type SavedInterval = Pick<IntervalRow, 'id' | 'version' | 'top' | 'bottom' | 'description' | 'uscs' | 'stratumId' | 'moisture' | 'consistency'>

export interface IntervalPayload {
  id?: string
  version?: number
  top: number
  bottom: number
  description: string
  uscs: string | null
  stratumId: string | null
  moisture: string | null
  consistency: string | null
}

export interface StratumRef { id: string, code: string, name: string }

let keyCounter = 0
export function newKey(): string {
  keyCounter += 1
  return `r${keyCounter}`
}

export function emptyRow(): DraftRow {
  return { key: newKey(), top: '', bottom: '', description: '', uscs: '', stratumId: '', moisture: '', consistency: '' }
}

export function draftFromInterval(iv: SavedInterval, unit: DepthUnit = 'm'): DraftRow {
  const top = depthText(iv.top, unit)
  const bottom = depthText(iv.bottom, unit)
  return {
    key: newKey(),
    id: iv.id,
    version: iv.version,
    top,
    bottom,
    ...(unit === 'm' ? {} : { saved: { top: iv.top, bottom: iv.bottom, topText: top, bottomText: bottom } }),
    description: iv.description,
    uscs: iv.uscs ?? '',
    stratumId: iv.stratumId ?? '',
    moisture: iv.moisture ?? '',
    consistency: iv.consistency ?? '',
  }
}

/** A depth as typed or pasted: "1.2", "1,2", "1.20 m", "3.9 ft" (the number as written); NaN when blank or not a depth. */
export function parseDepth(text: string): number {
  const t = text.trim().replace(/\s*(m|ft)$/i, '')
  if (!/^[-+]?(\d+([.,]\d*)?|[.,]\d+)$/.test(t)) return Number.NaN
  return Number(t.replace(',', '.'))
}

export function isBlankRow(r: DraftRow): boolean {
  return !r.id && LOG_COLUMNS.every(c => r[c].trim() === '')
}

export function toPayloadRow(r: DraftRow, unit: DepthUnit = 'm'): IntervalPayload {
  const opt = (s: string) => (s.trim() === '' ? null : s.trim())
  return {
    ...(r.id ? { id: r.id, version: r.version } : {}),
    top: r.saved && r.top.trim() === r.saved.topText ? r.saved.top : depthToMetres(parseDepth(r.top), unit),
    bottom: r.saved && r.bottom.trim() === r.saved.bottomText ? r.saved.bottom : depthToMetres(parseDepth(r.bottom), unit),
    description: r.description.trim(),
    uscs: opt(r.uscs),
    stratumId: opt(r.stratumId),
    moisture: opt(r.moisture),
    consistency: opt(r.consistency),
  }
}

/** The rows to send (blank new rows are left out) and, for each, its row index in the table. */
export function toPayload(rows: readonly DraftRow[], unit: DepthUnit = 'm'): { intervals: IntervalPayload[], rowIndex: number[] } {
  const intervals: IntervalPayload[] = []
  const rowIndex: number[] = []
  rows.forEach((r, i) => {
    if (isBlankRow(r)) return
    intervals.push(toPayloadRow(r, unit))
    rowIndex.push(i)
  })
  return { intervals, rowIndex }
}

export type RowErrors = Partial<Record<LogColumn, string>>

const FIELD_NAMES: Partial<Record<LogColumn, string>> = { uscs: 'USCS symbol', stratumId: 'Stratum', moisture: 'Moisture', consistency: 'Consistency', description: 'Description' }

/**
 * Live problems per table row: the zod schema for each row's shape, then the
 * interval rules (overlaps, depth past the hole) across the log; plus the gaps.
 */
export function validateDraft(rows: readonly DraftRow[], finalDepth: number, unit: DepthUnit = 'm'): { errors: RowErrors[], gaps: Gap[], count: number } {
  const errors: RowErrors[] = rows.map(() => ({}))
  const { intervals, rowIndex } = toPayload(rows, unit)
  let count = 0
  const put = (row: number, col: LogColumn, message: string) => {
    const e = errors[row]
    if (e && !e[col]) {
      e[col] = message
      count += 1
    }
  }
  intervals.forEach((iv, i) => {
    const parsed = IntervalInputSchema.safeParse(iv)
    if (parsed.success) return
    for (const issue of parsed.error.issues) {
      const col = issue.path[0]
      if (typeof col !== 'string' || !(LOG_COLUMNS as readonly string[]).includes(col)) continue
      const name = FIELD_NAMES[col as LogColumn]
      // The schema quotes its depth bounds in metres; the row was typed in the project's unit.
      const message = col === 'top' || col === 'bottom' ? boundMessage(issue, 'length', unit === 'ft' ? 'US' : 'SI') : issue.message
      put(rowIndex[i]!, col as LogColumn, name ? `${name} ${message}` : message)
    }
  })
  const rules = checkIntervals(intervals, finalDepth, { number: v => depthText(v, unit), unit })
  for (const issue of rules.issues) put(rowIndex[issue.index]!, issue.field, issue.message)
  return { errors, gaps: rules.gaps, count }
}

/**
 * Splits text copied from a spreadsheet: rows by line, cells by tab; a cell in
 * double quotes may hold tabs, line breaks and doubled quotes (papaparse reads
 * them). The trailing line break spreadsheets add is dropped.
 */
export function parseTsv(text: string): string[][] {
  const s = text.replace(/\r\n?/g, '\n').replace(/\n$/, '')
  if (s === '') return []
  return Papa.parse<string[]>(s, { delimiter: '\t', newline: '\n', quoteChar: '"', escapeChar: '"' }).data
}

/** True when a paste should be spread over cells rather than typed into one. */
export function isMultiCellPaste(text: string): boolean {
  return /[\t\n\r]/.test(text.replace(/[\r\n]+$/, ''))
}

function matchStratum(value: string, strata: readonly StratumRef[]): StratumRef | undefined {
  const v = value.trim().toLowerCase()
  if (!v) return undefined
  return strata.find(s => s.id === value.trim() || s.code.toLowerCase() === v || s.name.toLowerCase() === v)
}

/**
 * Fills the table from a pasted grid, starting at a cell and moving right and
 * down, adding rows at the end as needed. Returns the new rows and notes on what
 * could not be taken as given (unknown strata, a skipped header line).
 */
export function applyPaste(rows: readonly DraftRow[], startRow: number, startCol: LogColumn, grid: string[][], strata: readonly StratumRef[]): { rows: DraftRow[], notes: string[], filled: number } {
  const next = rows.map(r => ({ ...r }))
  const notes: string[] = []
  const col0 = LOG_COLUMNS.indexOf(startCol)
  let lines = grid
  // A header line copied with the data: a depth column whose first cell is not a number while the next is.
  const depthAt = ['top', 'bottom'].includes(startCol) ? 0 : LOG_COLUMNS.slice(col0).findIndex(c => c === 'top' || c === 'bottom')
  if (lines.length > 1 && depthAt >= 0) {
    const first = lines[0]![depthAt] ?? ''
    const second = lines[1]![depthAt] ?? ''
    if (first.trim() !== '' && Number.isNaN(parseDepth(first)) && !Number.isNaN(parseDepth(second))) {
      lines = lines.slice(1)
      notes.push('Skipped the first pasted line as a header.')
    }
  }
  lines.forEach((cells, i) => {
    const r = startRow + i
    while (next.length <= r) next.push(emptyRow())
    const row = next[r]!
    cells.forEach((raw, j) => {
      const col = LOG_COLUMNS[col0 + j]
      if (!col) return
      const value = raw.trim()
      if (col === 'stratumId') {
        if (!value) { row.stratumId = ''; return }
        const s = matchStratum(value, strata)
        if (s) row.stratumId = s.id
        else notes.push(`Row ${r + 1}: no stratum called “${value}” in this project; left unassigned.`)
      }
      else if (col === 'uscs') {
        row.uscs = value.toUpperCase()
      }
      else {
        row[col] = value
      }
    })
  })
  const extra = lines.some(cells => cells.length > LOG_COLUMNS.length - col0)
  if (extra) notes.push(`Pasted cells beyond the ${LOG_COLUMN_LABELS[LOG_COLUMNS[LOG_COLUMNS.length - 1]!]} column were ignored.`)
  return { rows: next, notes, filled: lines.length }
}

/** A USCS value the select cannot offer (pasted or imported): shown as it is, flagged by the schema. */
export function isUnknownUscs(value: string): boolean {
  return value.trim() !== '' && !isUscsGroupSymbol(value.trim())
}

/** The saved content of a row, for comparing drafts with the server (ids and versions aside). */
export function rowContent(r: IntervalPayload | SavedInterval): string {
  return JSON.stringify([r.top, r.bottom, r.description, r.uscs, r.stratumId, r.moisture, r.consistency])
}
