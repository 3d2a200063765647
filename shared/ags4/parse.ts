/**
 * Reads AGS4 text into groups, reporting every structural problem with the
 * rule number of the standard's "Rules for AGS4 format" and the 1-based line.
 * Pure: no I/O, so it runs in the browser and in Node alike.
 */
import type { AgsFile, AgsGroup, AgsIssue, AgsRow } from './types'

export const DATA_DESCRIPTORS = ['GROUP', 'HEADING', 'UNIT', 'TYPE', 'DATA'] as const
type HeaderKind = 'HEADING' | 'UNIT' | 'TYPE'
const HEADER_ORDER: readonly HeaderKind[] = ['HEADING', 'UNIT', 'TYPE']

export interface LineProblem {
  rule: '5' | '6'
  message: string
  severity: 'error' | 'warning'
}

export interface TokenizedLine {
  fields: string[]
  problems: LineProblem[]
}

/**
 * Splits one line into its fields. Rule 5 wants every field in double quotes
 * with inner quotes doubled, rule 6 wants fields separated by commas only.
 * Malformed input is still read as well as it can be, so one bad quote does
 * not hide the rest of the file: a lone quote inside a field is kept as a
 * character, an unquoted field is read up to the next comma.
 */
export function tokenizeAgsLine(text: string): TokenizedLine {
  const fields: string[] = []
  const problems: LineProblem[] = []
  const unquoted: number[] = []
  const strayQuotes: number[] = []
  const padded: number[] = []
  let unterminated = false
  const n = text.length
  let i = 0
  for (;;) {
    const fieldNumber = fields.length + 1
    let start = i
    while (start < n && (text[start] === ' ' || text[start] === '\t')) start++
    if (start < n && text[start] === '"') {
      if (start > i) padded.push(fieldNumber)
      i = start + 1
      let value = ''
      for (;;) {
        if (i >= n) {
          unterminated = true
          break
        }
        const c = text[i]
        if (c === '"') {
          if (text[i + 1] === '"') {
            value += '"'
            i += 2
            continue
          }
          let j = i + 1
          while (j < n && (text[j] === ' ' || text[j] === '\t')) j++
          if (j >= n || text[j] === ',') {
            if (j > i + 1) padded.push(fieldNumber)
            i = j
            break
          }
          strayQuotes.push(fieldNumber)
          value += '"'
          i++
          continue
        }
        value += c
        i++
      }
      fields.push(value)
    }
    else {
      const comma = text.indexOf(',', i)
      const end = comma === -1 ? n : comma
      fields.push(text.slice(i, end).trim())
      unquoted.push(fieldNumber)
      i = end
    }
    if (i >= n) break
    // text[i] is a comma here: another field follows, possibly an empty unquoted one at the end.
    i++
    if (i >= n) {
      fields.push('')
      unquoted.push(fields.length)
      break
    }
  }
  if (unquoted.length > 0) problems.push({ rule: '5', severity: 'error', message: `every field must be enclosed in double quotes (not so for field ${list(unquoted)})` })
  if (strayQuotes.length > 0) problems.push({ rule: '5', severity: 'error', message: `a double quote inside a field is not doubled ("") (field ${list(unique(strayQuotes))})` })
  if (unterminated) problems.push({ rule: '5', severity: 'error', message: 'the last field has no closing double quote; a line break inside a field is not allowed either (rule 6)' })
  if (padded.length > 0) problems.push({ rule: '6', severity: 'warning', message: `spaces outside the quotes next to a separating comma (field ${list(unique(padded))}); they were ignored` })
  return { fields, problems }
}

interface HeaderRow {
  kind: HeaderKind
  line: number
  fields: string[]
  afterData: boolean
}

interface OpenGroup {
  name: string
  line: number
  header: HeaderRow[]
  data: { line: number, fields: string[] }[]
}

/** Parses AGS4 text. Never throws: whatever cannot be read is an issue in `errors`. */
export function parseAgs(text: string): AgsFile {
  const errors: AgsIssue[] = []
  const groups: AgsGroup[] = []
  const seenNames = new Set<string>()
  let body = text
  if (body.charCodeAt(0) === 0xFEFF) {
    body = body.slice(1)
    errors.push({ rule: '1', line: 1, group: '', severity: 'warning', message: 'the file starts with a byte-order mark (not an ASCII character); it was ignored' })
  }

  const { lines, bareEnds } = splitLines(body)
  if (bareEnds.count > 0) {
    errors.push({
      rule: '2a',
      line: bareEnds.first,
      group: '',
      severity: 'error',
      message: `each row must end with CR LF (${plural(bareEnds.count, 'line')} end with LF or CR alone, the first at line ${bareEnds.first})`,
    })
  }

  let open: OpenGroup | null = null
  const close = (): void => {
    if (!open) return
    const group = finishGroup(open, errors)
    if (seenNames.has(group.name)) {
      errors.push({ rule: '2', line: group.line, group: group.name, severity: 'warning', message: `group ${group.name} appears more than once in the file` })
    }
    seenNames.add(group.name)
    groups.push(group)
    open = null
  }

  for (let index = 0; index < lines.length; index++) {
    const lineNo = index + 1
    const raw = lines[index] ?? ''
    if (raw.trim() === '') {
      if (raw !== '') errors.push({ rule: '3', line: lineNo, group: open?.name ?? '', severity: 'warning', message: 'the line holds only spaces; it was read as an empty line' })
      continue
    }
    const groupName = open?.name ?? ''
    const nonAscii = firstNonAscii(raw)
    if (nonAscii) errors.push({ rule: '1', line: lineNo, group: groupName, severity: 'error', message: `non-ASCII character ${JSON.stringify(nonAscii.char)} at column ${nonAscii.column}` })

    const { fields, problems } = tokenizeAgsLine(raw)
    for (const problem of problems) errors.push({ rule: problem.rule, line: lineNo, group: groupName, severity: problem.severity, message: problem.message })

    const descriptor = fields[0] ?? ''
    if (descriptor === 'GROUP') {
      close()
      if (fields.length !== 2) errors.push({ rule: '4', line: lineNo, group: fields[1] ?? '', severity: 'error', message: `a GROUP row holds the descriptor and one group name; this one has ${fields.length} fields` })
      open = { name: fields[1] ?? '', line: lineNo, header: [], data: [] }
      continue
    }
    if (descriptor === 'HEADING' || descriptor === 'UNIT' || descriptor === 'TYPE' || descriptor === 'DATA') {
      const current: OpenGroup | null = open
      if (!current) {
        errors.push({ rule: '2', line: lineNo, group: '', severity: 'error', message: `a ${descriptor} row before any GROUP row belongs to no group; it was skipped` })
        continue
      }
      if (descriptor === 'DATA') current.data.push({ line: lineNo, fields: fields.slice(1) })
      else current.header.push({ kind: descriptor, line: lineNo, fields: fields.slice(1), afterData: current.data.length > 0 })
      continue
    }
    if (descriptor.startsWith('**') && groups.length === 0 && !open) {
      errors.push({ rule: '3', line: lineNo, group: '', severity: 'error', message: 'this looks like an AGS3 file ("**GROUP" rows); Pastload reads AGS4 files only' })
      return { groups, errors }
    }
    errors.push({ rule: '3', line: lineNo, group: groupName, severity: 'error', message: `the row does not start with a data descriptor (GROUP, HEADING, UNIT, TYPE or DATA): ${JSON.stringify(descriptor)}; it was skipped` })
  }
  close()
  if (groups.length === 0) errors.push({ rule: '2', line: 0, group: '', severity: 'error', message: 'the file holds no GROUP' })
  return { groups, errors }
}

/** Turns the collected rows of one group into an AgsGroup, checking rules 2, 2b and 4. */
function finishGroup(open: OpenGroup, errors: AgsIssue[]): AgsGroup {
  const { name } = open
  const first = new Map<HeaderKind, HeaderRow>()
  for (const row of open.header) {
    if (first.has(row.kind)) {
      errors.push({ rule: '2b', line: row.line, group: name, severity: 'error', message: `a second ${row.kind} row in group ${name}; the first one is used` })
      continue
    }
    first.set(row.kind, row)
  }
  for (const kind of HEADER_ORDER) {
    if (!first.has(kind)) errors.push({ rule: '2b', line: open.line, group: name, severity: 'error', message: `the ${kind} row is missing from group ${name}` })
  }
  // Rule 2b fixes the order GROUP, HEADING, UNIT, TYPE, then DATA: flag every row that breaks it.
  const misplaced = new Set<HeaderRow>()
  const present = HEADER_ORDER.map(kind => first.get(kind)).filter((row): row is HeaderRow => row !== undefined)
  for (let a = 0; a < present.length; a++) {
    for (let b = a + 1; b < present.length; b++) {
      const early = present[a]
      const late = present[b]
      if (early && late && late.line < early.line) {
        misplaced.add(early)
        misplaced.add(late)
      }
    }
  }
  for (const row of present) if (row.afterData) misplaced.add(row)
  for (const row of [...misplaced].sort((x, y) => y.line - x.line)) {
    errors.push({ rule: '2b', line: row.line, group: name, severity: 'error', message: `the ${row.kind} row is misplaced: the order is GROUP, HEADING, UNIT, TYPE, then DATA` })
  }

  const headingRow = first.get('HEADING')
  const headings = headingRow?.fields ?? []
  const duplicates = unique(headings.filter((h, i) => headings.indexOf(h) !== i))
  for (const heading of duplicates) {
    errors.push({ rule: '2b', line: headingRow?.line ?? open.line, group: name, severity: 'error', message: `heading ${heading} appears more than once in group ${name}; the first column is used` })
  }

  const aligned = (kind: 'UNIT' | 'TYPE'): string[] => {
    const row = first.get(kind)
    if (!row) return headings.map(() => '')
    if (headingRow && row.fields.length !== headings.length) {
      errors.push({ rule: '4', line: row.line, group: name, severity: 'error', message: `the ${kind} row has ${row.fields.length} fields for ${headings.length} headings` })
    }
    return headings.map((_, i) => row.fields[i] ?? '')
  }
  const units = aligned('UNIT')
  const types = aligned('TYPE')

  const rows: AgsRow[] = []
  for (const data of open.data) {
    if (headingRow && data.fields.length !== headings.length) {
      errors.push({ rule: '4', line: data.line, group: name, severity: 'error', message: `the DATA row has ${data.fields.length} fields for ${headings.length} headings` })
    }
    const values: Record<string, string> = {}
    headings.forEach((heading, i) => {
      if (!(heading in values)) values[heading] = data.fields[i] ?? ''
    })
    rows.push({ line: data.line, values })
  }
  if (rows.length === 0) errors.push({ rule: '2', line: open.line, group: name, severity: 'error', message: `group ${name} has no DATA rows` })

  return {
    name,
    headings,
    units,
    types,
    rows,
    line: open.line,
    headingLine: headingRow?.line ?? 0,
    unitLine: first.get('UNIT')?.line ?? 0,
    typeLine: first.get('TYPE')?.line ?? 0,
  }
}

/** Splits on CR LF, LF or CR, counting the lines that do not end with CR LF (rule 2a). */
function splitLines(text: string): { lines: string[], bareEnds: { count: number, first: number } } {
  const lines: string[] = []
  const bareEnds = { count: 0, first: 0 }
  const breaks = /\r\n|\n|\r/g
  let last = 0
  for (let match = breaks.exec(text); match; match = breaks.exec(text)) {
    lines.push(text.slice(last, match.index))
    if (match[0] !== '\r\n') {
      bareEnds.count++
      if (bareEnds.first === 0) bareEnds.first = lines.length
    }
    last = match.index + match[0].length
  }
  if (last < text.length) lines.push(text.slice(last))
  return { lines, bareEnds }
}

function firstNonAscii(line: string): { char: string, column: number } | null {
  for (let i = 0; i < line.length; i++) {
    if (line.charCodeAt(i) > 127) return { char: String.fromCodePoint(line.codePointAt(i) ?? 0), column: i + 1 }
  }
  return null
}

function unique<T>(items: readonly T[]): T[] {
  return [...new Set(items)]
}

function list(numbers: readonly number[]): string {
  return numbers.join(', ')
}

function plural(count: number, word: string): string {
  return `${count} ${word}${count === 1 ? '' : 's'}`
}

/**
 * Decodes the bytes of an uploaded file: UTF-8 when they are valid UTF-8,
 * otherwise Windows-1252, the usual encoding of older files (the 4.0.x
 * standard dictionaries among them). Rule 1 then flags any non-ASCII text.
 */
export function decodeAgs(bytes: Uint8Array): string {
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes)
  }
  catch (_err) {
    return new TextDecoder('windows-1252').decode(bytes)
  }
}
