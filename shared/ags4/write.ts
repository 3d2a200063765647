/**
 * Writes AGS4 text: every field quoted with inner quotes doubled (rule 5),
 * comma-separated (rule 6), rows ending CR LF (rule 2a), each group as GROUP,
 * HEADING, UNIT, TYPE and DATA rows (rules 2b, 3) and numbers formatted to
 * the heading's TYPE (rule 8).
 */
import { formatNumber } from './datatypes'
import type { AgsGroup, AgsValue, AgsWritableGroup } from './types'

const CRLF = '\r\n'

/** Quotes one field; a line break cannot be carried by the format (rule 6), so it becomes a space. */
export function quoteField(value: string): string {
  return `"${toAscii(value.replace(/\r\n|\r|\n/g, ' ')).replace(/"/g, '""')}"`
}

/** Typographic characters with a plain ASCII spelling; everything else non-ASCII becomes "?". */
const ASCII_SPELLINGS: Record<string, string> = {
  '\u2013': '-', '\u2014': '-', '\u2212': '-', '\u2018': "'", '\u2019': "'", '\u201C': '"', '\u201D': '"', '\u2026': '...',
  '\u00D7': 'x', '\u00B0': 'deg', '\u00B5': 'u', '\u03BC': 'u', '\u00B2': '2', '\u00B3': '3', '\u00B1': '+/-', '\u2264': '<=', '\u2265': '>=',
  '\u03C3': 'sigma', '\u03B3': 'gamma', '\u0394': 'delta', '\u03B1': 'alpha', '\u00A0': ' ',
}

/**
 * AGS4 files are ASCII (rule 1): accented letters lose their accents, common
 * typographic marks get their ASCII spelling, and anything left is "?".
 */
export function toAscii(value: string): string {
  /* eslint-disable no-control-regex -- AGS4 files are ASCII: these ranges name the ASCII block itself */
  if (/^[\x00-\x7F]*$/.test(value)) return value
  return value
    .replace(/[^\x00-\x7F]/g, c => ASCII_SPELLINGS[c] ?? c)
    .normalize('NFKD')
    .replace(/[\u0300-\u036F]/g, '')
    .replace(/[^\x00-\x7F]/g, '?')
  /* eslint-enable no-control-regex */
}

function row(descriptor: string, fields: readonly string[]): string {
  return [descriptor, ...fields].map(quoteField).join(',')
}

/** The text of one value: a number in its TYPE's format, null as an empty field. */
export function formatValue(type: string, value: AgsValue | undefined): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return formatNumber(type, value)
  return value
}

/**
 * Writes groups as a file. A group must have as many units and types as
 * headings: a mismatch is a programming error, so it throws rather than
 * writing a file that breaks rule 4.
 */
export function writeAgs(groups: readonly AgsWritableGroup[]): string {
  const blocks: string[] = []
  for (const group of groups) {
    const { name, headings, units, types } = group
    if (units.length !== headings.length || types.length !== headings.length) {
      throw new Error(`group ${name}: ${headings.length} headings, ${units.length} units and ${types.length} types`)
    }
    const lines = [row('GROUP', [name]), row('HEADING', headings), row('UNIT', units), row('TYPE', types)]
    for (const values of group.rows) {
      lines.push(row('DATA', headings.map((heading, i) => formatValue(types[i] ?? '', values[heading]))))
    }
    blocks.push(lines.join(CRLF) + CRLF)
  }
  return blocks.join(CRLF)
}

/** A parsed group in the shape writeAgs takes, so a file's groups can be written back unchanged. */
export function writableGroup(group: AgsGroup): AgsWritableGroup {
  return { name: group.name, headings: group.headings, units: group.units, types: group.types, rows: group.rows.map(r => r.values) }
}

/** What a set of groups uses and so must define: units (rule 15), types (rule 17) and abbreviations (rule 16). */
export interface UsedDefinitions {
  units: Set<string>
  types: Set<string>
  /** Codes per heading, each part of a concatenated value separately (rule 16a). */
  abbreviations: Map<string, Set<string>>
}

/** Gathers what the UNIT, TYPE and ABBR groups of a written file must define, so the file passes rules 15–17. */
export function collectUsedDefinitions(groups: readonly AgsWritableGroup[], concatenator = '+'): UsedDefinitions {
  const used: UsedDefinitions = { units: new Set(), types: new Set(), abbreviations: new Map() }
  for (const group of groups) {
    group.headings.forEach((heading, i) => {
      const unit = group.units[i] ?? ''
      const type = group.types[i] ?? ''
      if (unit !== '') used.units.add(unit)
      if (type !== '') used.types.add(type)
      for (const values of group.rows) {
        const text = formatValue(type, values[heading])
        if (text === '') continue
        if (type === 'PU') used.units.add(text)
        if (type === 'PT') used.types.add(text)
        if (type === 'PA') {
          const codes = used.abbreviations.get(heading) ?? new Set<string>()
          for (const code of text.split(concatenator)) if (code !== '') codes.add(code)
          used.abbreviations.set(heading, codes)
        }
      }
    })
  }
  return used
}
