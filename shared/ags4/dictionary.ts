/**
 * The AGS4 data dictionary: which groups exist, their parent group, and per
 * heading its status (KEY, REQUIRED, OTHER), TYPE and UNIT. The standard
 * dictionary is itself an AGS4 file whose DICT group lists every entry; a data
 * file may add its own entries in its DICT group (rule 18).
 */
import { STANDARD_EDITION, STANDARD_GROUPS } from './standard-groups'
import type { AgsFile, AgsGroup, AgsIssue } from './types'

export type AgsDefinitionSource = 'standard' | 'file'

export interface AgsHeadingDefinition {
  name: string
  /** As the dictionary writes it: 'KEY', 'REQUIRED', 'OTHER', 'KEY+REQUIRED', or '' when not given. */
  status: string
  key: boolean
  required: boolean
  type: string
  unit: string
  description: string
  source: AgsDefinitionSource
}

export interface AgsGroupDefinition {
  name: string
  description: string
  /** Parent group whose key fields each row must match (rule 10c); null for top-level groups. */
  parent: string | null
  /** In dictionary order, which is the order rule 7 asks of a HEADING row. */
  headings: Map<string, AgsHeadingDefinition>
  source: AgsDefinitionSource
  /**
   * True when a file's DICT gave headings for a group the dictionary lacks, with
   * no GROUP row: against a subset dictionary that group may well be standard.
   */
  partial?: boolean
}

export interface AgsDictionary {
  /** AGS edition the dictionary describes, e.g. '4.1'; '' when unknown. */
  edition: string
  /**
   * 'full' for a whole standard dictionary; 'subset' for the groups built into
   * Pastload, where a group missing from the dictionary is not proof that the
   * standard lacks it.
   */
  coverage: 'full' | 'subset'
  groups: Map<string, AgsGroupDefinition>
}

/** Groups Pastload reads or writes, plus the administrative ones every file carries and the parents they need. */
export const PASTLOAD_GROUPS = [
  'PROJ', 'TRAN', 'UNIT', 'TYPE', 'ABBR', 'DICT', 'FILE',
  'LOCA', 'GEOL', 'SAMP', 'ISPT', 'WSTG', 'WSTD', 'SCPG', 'SCPT',
  'LLPL', 'LNMC', 'LDEN', 'MOND', 'MONG', 'CONG', 'CONS', 'IVAN', 'GRAG', 'GRAT',
] as const

/** Reads a status such as 'KEY+REQUIRED' into its two flags. */
export function parseStatus(status: string): { key: boolean, required: boolean } {
  const parts = status.toUpperCase().split('+').map(part => part.trim())
  return { key: parts.includes('KEY'), required: parts.includes('REQUIRED') }
}

/** Key headings of a group in dictionary order (rule 10a; rule 11 lists record-link keys in this order). */
export function keyHeadings(group: AgsGroupDefinition): string[] {
  return [...group.headings.values()].filter(heading => heading.key).map(heading => heading.name)
}

function parentOf(text: string): string | null {
  const trimmed = text.trim()
  return trimmed === '' || trimmed === '-' ? null : trimmed
}

function dictRows(file: AgsFile): AgsGroup | undefined {
  return file.groups.find(group => group.name === 'DICT')
}

/** Loads a standard dictionary file (Standard_dictionary_v4_1.ags and the like): its DICT group becomes the definitions. */
export function dictionaryFromAgs(file: AgsFile, options: { edition?: string, coverage?: 'full' | 'subset' } = {}): AgsDictionary {
  const groups = new Map<string, AgsGroupDefinition>()
  const dict = dictRows(file)
  for (const row of dict?.rows ?? []) {
    const v = row.values
    const groupName = v.DICT_GRP ?? ''
    if (v.DICT_TYPE === 'GROUP') {
      const existing = groups.get(groupName)
      groups.set(groupName, { name: groupName, description: v.DICT_DESC ?? '', parent: parentOf(v.DICT_PGRP ?? ''), headings: existing?.headings ?? new Map<string, AgsHeadingDefinition>(), source: 'standard' })
    }
    else if (v.DICT_TYPE === 'HEADING') {
      let group = groups.get(groupName)
      if (!group) {
        group = { name: groupName, description: '', parent: null, headings: new Map(), source: 'standard' }
        groups.set(groupName, group)
      }
      const name = v.DICT_HDNG ?? ''
      const status = v.DICT_STAT ?? ''
      group.headings.set(name, { name, status, ...parseStatus(status), type: v.DICT_DTYP ?? '', unit: v.DICT_UNIT ?? '', description: v.DICT_DESC ?? '', source: 'standard' })
    }
  }
  return { edition: options.edition ?? '', coverage: options.coverage ?? 'full', groups }
}

/**
 * Adds a data file's own DICT entries (user-defined groups and headings, rule
 * 18) to a dictionary, without changing the one passed in. An entry that
 * redefines a standard heading is ignored: the standard order and status stay
 * in force, so a file cannot move a standard heading by redefining it.
 */
export function withFileDefinitions(base: AgsDictionary, file: AgsFile): { dictionary: AgsDictionary, issues: AgsIssue[] } {
  const dict = dictRows(file)
  const issues: AgsIssue[] = []
  if (!dict) return { dictionary: base, issues }
  const groups = new Map(base.groups)
  const owned = new Set<string>()
  const editable = (name: string): AgsGroupDefinition | undefined => {
    const group = groups.get(name)
    if (!group || owned.has(name)) return group
    const copy = { ...group, headings: new Map(group.headings) }
    groups.set(name, copy)
    owned.add(name)
    return copy
  }
  const redefined = new Map<string, { line: number, names: string[] }>()
  const orphanGroups = new Map<string, number>()
  for (const row of dict.rows) {
    const v = row.values
    const groupName = v.DICT_GRP ?? ''
    const kind = v.DICT_TYPE ?? ''
    if (kind === 'GROUP') {
      const existing = editable(groupName)
      if (existing?.source === 'standard') continue // listing a standard group changes nothing
      groups.set(groupName, { name: groupName, description: v.DICT_DESC ?? '', parent: parentOf(v.DICT_PGRP ?? ''), headings: existing?.headings ?? new Map<string, AgsHeadingDefinition>(), source: 'file' })
      owned.add(groupName)
      orphanGroups.delete(groupName)
      continue
    }
    if (kind !== 'HEADING') {
      issues.push({ rule: '18', line: row.line, group: 'DICT', severity: 'error', message: `DICT_TYPE must be GROUP or HEADING, not ${JSON.stringify(kind)}` })
      continue
    }
    const name = v.DICT_HDNG ?? ''
    if (name === '') {
      issues.push({ rule: '18', line: row.line, group: 'DICT', severity: 'error', message: `a DICT HEADING row for group ${groupName} names no heading (DICT_HDNG)` })
      continue
    }
    let group = editable(groupName)
    if (!group) {
      group = { name: groupName, description: '', parent: null, headings: new Map(), source: 'file', partial: true }
      groups.set(groupName, group)
      owned.add(groupName)
      orphanGroups.set(groupName, row.line)
    }
    if (group.headings.get(name)?.source === 'standard') {
      const entry = redefined.get(groupName) ?? { line: row.line, names: [] }
      entry.names.push(name)
      redefined.set(groupName, entry)
      continue
    }
    const status = v.DICT_STAT ?? ''
    group.headings.set(name, { name, status, ...parseStatus(status), type: v.DICT_DTYP ?? '', unit: v.DICT_UNIT ?? '', description: v.DICT_DESC ?? '', source: 'file' })
  }
  // Against a subset dictionary such a group may be a standard one Pastload does not hold, so nothing is said.
  for (const [groupName, line] of base.coverage === 'full' ? orphanGroups : []) {
    issues.push({ rule: '18', line, group: 'DICT', severity: 'warning', message: `DICT defines headings of ${groupName} but no GROUP row for it, so its description and parent group are unknown` })
  }
  for (const [groupName, { line, names }] of redefined) {
    const shown = names.length > 5 ? `${names.slice(0, 5).join(', ')} and ${names.length - 5} more` : names.join(', ')
    issues.push({ rule: '9', line, group: 'DICT', severity: 'warning', message: `DICT redefines standard headings of ${groupName} (${shown}); the standard definitions stay in force` })
  }
  return { dictionary: { ...base, groups }, issues }
}

const STATUS_CODES: Record<string, string> = { K: 'KEY', R: 'REQUIRED', KR: 'KEY+REQUIRED', O: 'OTHER', '': '' }
const STATUS_LETTERS: Record<string, string> = Object.fromEntries(Object.entries(STATUS_CODES).map(([code, status]) => [status, code]))

/** The groups built into Pastload (see standard-groups.ts), for use where the full dictionary file cannot be read. */
export function standardDictionary(): AgsDictionary {
  const groups = new Map<string, AgsGroupDefinition>()
  for (const [name, description, parent, packed] of STANDARD_GROUPS) {
    const headings = new Map<string, AgsHeadingDefinition>()
    for (const entry of packed.split(';')) {
      const [heading = '', code = '', type = '', unit = ''] = entry.split('|')
      const status = STATUS_CODES[code] ?? code
      headings.set(heading, { name: heading, status, ...parseStatus(status), type, unit, description: '', source: 'standard' })
    }
    groups.set(name, { name, description, parent: parentOf(parent), headings, source: 'standard' })
  }
  return { edition: STANDARD_EDITION, coverage: 'subset', groups }
}

/**
 * Writes the source of standard-groups.ts from a loaded standard dictionary:
 * only the named groups, and per heading only status, type and unit, one line
 * per group. The test suite compares this output with the committed file.
 */
export function renderStandardGroups(dictionary: AgsDictionary, names: readonly string[], sourceFile: string): string {
  const lines: string[] = [
    `// Generated from the AGS4 v${dictionary.edition} standard dictionary (${sourceFile}) by renderStandardGroups() in dictionary.ts.`,
    '// Only the groups Pastload uses; per heading: name|status|type|unit, status K = KEY, R = REQUIRED, KR = KEY+REQUIRED, O = OTHER.',
    '// Do not edit: regenerate with `npx vitest run --project unit tests/unit/ags4/dictionary.test.ts -u`.',
    '',
    `export const STANDARD_EDITION = ${quote(dictionary.edition)}`,
    '',
    '/** [group, description, parent group (- for none), packed headings in dictionary order] */',
    'export const STANDARD_GROUPS: readonly (readonly [string, string, string, string])[] = [',
  ]
  for (const name of names) {
    const group = dictionary.groups.get(name)
    if (!group) throw new Error(`group ${name} is not in the dictionary`)
    const packed = [...group.headings.values()].map((heading) => {
      const fields = [heading.name, STATUS_LETTERS[heading.status] ?? heading.status, heading.type, heading.unit]
      if (fields.some(field => field.includes('|') || field.includes(';'))) throw new Error(`heading ${heading.name} holds a | or ; the packed form cannot carry`)
      return fields.join('|')
    }).join(';')
    lines.push(`  [${quote(name)}, ${quote(group.description)}, ${quote(group.parent ?? '-')}, ${quote(packed)}],`)
  }
  lines.push(']', '')
  return lines.join('\n')
}

function quote(text: string): string {
  return `'${text.replace(/\\/g, '\\\\').replace(/'/g, '\\\'')}'`
}
