/**
 * Checks a parsed AGS4 file against the standard's "Rules for AGS4 format"
 * (rules 1–20) and a dictionary. Every finding names its rule, line and group
 * so a user can go straight to the row that needs fixing.
 */
import { checkValue } from './datatypes'
import { keyHeadings, withFileDefinitions } from './dictionary'
import type { AgsDictionary, AgsGroupDefinition } from './dictionary'
import type { AgsFile, AgsGroup, AgsIssue, AgsRow } from './types'

export interface CheckOptions {
  /**
   * Paths of the files delivered with the data file, relative to it (for
   * example `FILE/FS1/log.pdf`). Rule 20 asks for a FILE sub-folder per
   * FILE_FSET; only when this list is given can that be checked, because the
   * data file alone does not show what was delivered beside it.
   */
  attachedFiles?: readonly string[]
}

/** Record-link delimiter and concatenator the file declares in TRAN (rules 11a, 11b), with the standard's defaults. */
export interface TransferSettings {
  delimiter: string
  concatenator: string
}

export const DEFAULT_DELIMITER = '|'
export const DEFAULT_CONCATENATOR = '+'

/**
 * The whole report for a file: the problems parseAgs found while reading it,
 * then those of the rules below. The dictionary is extended with the file's
 * own DICT entries first.
 */
export function checkAgs(file: AgsFile, dictionary: AgsDictionary, options: CheckOptions = {}): AgsIssue[] {
  const { dictionary: dict, issues: dictIssues } = withFileDefinitions(dictionary, file)
  const issues: AgsIssue[] = [...file.errors, ...dictIssues]
  // With no group read (an empty file, an AGS3 file) the reading errors say all there is to say.
  if (file.groups.length === 0) return sortIssues(issues)
  const byName = firstOfEach(file)
  const settings = readTransferSettings(byName.get('TRAN'), issues)
  let nonStandard = false

  checkSingleRowGroup(byName.get('PROJ'), 'PROJ', '13', issues)
  checkSingleRowGroup(byName.get('TRAN'), 'TRAN', '14', issues)

  for (const group of file.groups) {
    const definition = dict.groups.get(group.name)
    checkNames(group, definition, dict, issues)
    nonStandard = checkAgainstDictionary(group, definition, dict, issues) || nonStandard
    if (definition) {
      checkKeysAndRequired(group, definition, issues)
      checkParent(group, definition, dict, byName, issues)
    }
    checkValues(group, issues)
    checkRecordLinks(group, dict, byName, settings, issues)
  }

  checkDefinitionsUsed(file, byName.get('UNIT'), 'UNIT', 'UNIT_UNIT', '15', 'PU', 'unit', g => g.units, issues)
  checkDefinitionsUsed(file, byName.get('TYPE'), 'TYPE', 'TYPE_TYPE', '17', 'PT', 'data type', g => g.types, issues)
  checkAbbreviations(file, byName.get('ABBR'), settings, issues)
  if (nonStandard && !byName.has('DICT')) {
    issues.push({ rule: '18', line: 0, group: 'DICT', severity: 'error', message: 'the file uses groups or headings that are not in the AGS4 dictionary but has no DICT group defining them' })
  }
  checkFiles(file, byName.get('FILE'), options, issues)
  return sortIssues(issues)
}

function firstOfEach(file: AgsFile): Map<string, AgsGroup> {
  const map = new Map<string, AgsGroup>()
  for (const group of file.groups) if (!map.has(group.name)) map.set(group.name, group)
  return map
}

/** Rules 11a and 11b: TRAN must define a single-character delimiter and concatenator. */
export function readTransferSettings(tran: AgsGroup | undefined, issues: AgsIssue[] = []): TransferSettings {
  const settings = { delimiter: DEFAULT_DELIMITER, concatenator: DEFAULT_CONCATENATOR }
  const row = tran?.rows[0]
  if (!tran || !row) return settings
  const read = (heading: string, rule: string, what: string, fallback: string): string => {
    if (!tran.headings.includes(heading)) {
      issues.push({ rule, line: tran.headingLine || tran.line, group: 'TRAN', severity: 'error', message: `${heading} is missing: the ${what} must be defined in TRAN (the default is ${fallback}, which is used)` })
      return fallback
    }
    const value = row.values[heading] ?? ''
    if (value === '') {
      issues.push({ rule, line: row.line, group: 'TRAN', severity: 'error', message: `${heading} is empty: the ${what} must be defined in TRAN (the default is ${fallback}, which is used)` })
      return fallback
    }
    if (value.length !== 1) {
      issues.push({ rule, line: row.line, group: 'TRAN', severity: 'error', message: `${heading} must be a single character, not ${JSON.stringify(value)} (the default ${fallback} is used)` })
      return fallback
    }
    return value
  }
  settings.delimiter = read('TRAN_DLIM', '11a', 'record-link delimiter', DEFAULT_DELIMITER)
  settings.concatenator = read('TRAN_RCON', '11b', 'concatenation character', DEFAULT_CONCATENATOR)
  return settings
}

/** Rules 13 and 14: PROJ and TRAN must be present with one DATA row each. */
function checkSingleRowGroup(group: AgsGroup | undefined, name: string, rule: string, issues: AgsIssue[]): void {
  if (!group) {
    issues.push({ rule, line: 0, group: name, severity: 'error', message: `the ${name} group is missing; every AGS4 file must have one` })
    return
  }
  for (const row of group.rows.slice(1)) {
    issues.push({ rule, line: row.line, group: name, severity: 'error', message: `${name} must hold a single DATA row; this is an extra one` })
  }
}

/** Rules 19, 19a, 19b: the spelling of group and heading names. */
function checkNames(group: AgsGroup, definition: AgsGroupDefinition | undefined, dict: AgsDictionary, issues: AgsIssue[]): void {
  const { name } = group
  if (!/^[A-Z0-9]{4}$/.test(name)) {
    issues.push({ rule: '19', line: group.line, group: name, severity: 'error', message: `group name ${JSON.stringify(name)} must be four characters, uppercase letters or digits` })
  }
  const line = group.headingLine || group.line
  const generic = genericPrefixes(dict)
  for (const heading of group.headings) {
    if (!/^[A-Z0-9_]{1,9}$/.test(heading)) {
      issues.push({ rule: '19a', line, group: name, severity: 'error', message: `heading ${JSON.stringify(heading)} must be at most 9 characters of uppercase letters, digits and _` })
    }
    const parts = /^([^_]*)_(.+)$/.exec(heading)
    const prefix = parts?.[1] ?? ''
    if (!parts || prefix.length !== 4) {
      issues.push({ rule: '19b', line, group: name, severity: 'error', message: `heading ${JSON.stringify(heading)} must be a four-character group name, an underscore and a field name` })
      continue
    }
    if (prefix === name) continue
    const standardHere = definition?.headings.get(heading)?.source === 'standard'
    const definedInPrefixGroup = dict.groups.get(prefix)?.headings.has(heading) === true
    if (standardHere || definedInPrefixGroup || generic.has(prefix)) continue
    issues.push({ rule: '19b', line, group: name, severity: 'error', message: `heading ${heading} starts with ${prefix}_, which is neither its group ${name} nor a group that defines ${heading}` })
  }
}

const genericCache = new WeakMap<Map<string, AgsGroupDefinition>, Set<string>>()

/**
 * Prefixes the standard uses across groups without a group of that name
 * (TEST_STAT, SPEC_REF …): rule 19b lets headings borrow them like any shared heading.
 */
function genericPrefixes(dict: AgsDictionary): Set<string> {
  const cached = genericCache.get(dict.groups)
  if (cached) return cached
  const prefixes = new Set<string>()
  for (const group of dict.groups.values()) {
    if (group.source !== 'standard') continue
    for (const heading of group.headings.values()) {
      const prefix = heading.name.split('_')[0] ?? ''
      if (heading.source === 'standard' && !dict.groups.has(prefix)) prefixes.add(prefix)
    }
  }
  genericCache.set(dict.groups, prefixes)
  return prefixes
}

/**
 * Rules 7 and 9: names come from the dictionary (or the file's DICT), in
 * dictionary order, standard headings first and user-defined ones after them.
 * Returns whether the group uses any name the standard does not define.
 */
function checkAgainstDictionary(group: AgsGroup, definition: AgsGroupDefinition | undefined, dict: AgsDictionary, issues: AgsIssue[]): boolean {
  const { name } = group
  if (!definition || (definition.partial && dict.coverage === 'subset')) {
    if (dict.coverage === 'subset') {
      issues.push({ rule: '9', line: group.line, group: name, severity: 'warning', message: `group ${name} is not among the AGS4 groups built into Pastload, so its headings were not checked against the dictionary` })
      return false
    }
    issues.push({ rule: '9', line: group.line, group: name, severity: 'error', message: `group ${name} is neither in the AGS4 dictionary nor defined in the file's DICT group` })
    return true
  }
  const line = group.headingLine || group.line
  let nonStandard = definition.source === 'file'
  const standard = [...definition.headings.values()].filter(h => h.source === 'standard').map(h => h.name)
  const userDefined = [...definition.headings.values()].filter(h => h.source === 'file').map(h => h.name)
  const lastStandard = standard[standard.length - 1]

  let inUserPart = false
  for (const heading of group.headings) {
    const known = definition.headings.get(heading)
    if (!known) {
      // An undefined heading is already wrong by itself; it does not move the boundary of the user-defined part.
      issues.push({ rule: '9', line, group: name, severity: 'error', message: `heading ${heading} is neither in the AGS4 dictionary for ${name} nor defined in the file's DICT group` })
      nonStandard = true
      continue
    }
    if (known.source === 'file') {
      nonStandard = true
      inUserPart = true
      continue
    }
    if (inUserPart && definition.source === 'standard') {
      issues.push({ rule: '9', line, group: name, severity: 'error', message: `standard heading ${heading} comes after the user-defined part of the row (or after ${lastStandard}, the last standard heading); user-defined headings go at the end, after all standard ones` })
    }
    if (heading === lastStandard) inUserPart = true
  }

  const order = [...standard, ...userDefined]
  let previous = -1
  for (const heading of group.headings) {
    const position = order.indexOf(heading)
    if (position < 0) continue
    if (position < previous) {
      const expected = group.headings.filter(h => order.includes(h)).sort((a, b) => order.indexOf(a) - order.indexOf(b))
      issues.push({ rule: '7', line, group: name, severity: 'error', message: `headings are out of dictionary order from ${heading}; expected ${expected.join(', ')} (user-defined headings in DICT order)` })
      break
    }
    previous = position
  }
  return nonStandard
}

/** Rules 10a and 10b: key and required headings present, required values filled, key combinations unique. */
function checkKeysAndRequired(group: AgsGroup, definition: AgsGroupDefinition, issues: AgsIssue[]): void {
  const { name } = group
  const line = group.headingLine || group.line
  const present = new Set(group.headings)
  const keys = keyHeadings(definition)
  for (const key of keys) {
    if (!present.has(key)) issues.push({ rule: '10a', line, group: name, severity: 'error', message: `key heading ${key} is missing from ${name}` })
  }
  const required = [...definition.headings.values()].filter(h => h.required).map(h => h.name)
  for (const heading of required) {
    if (!present.has(heading) && !keys.includes(heading)) issues.push({ rule: '10b', line, group: name, severity: 'error', message: `required heading ${heading} is missing from ${name}` })
  }
  const requiredHere = required.filter(h => present.has(h))
  for (const row of group.rows) {
    const empty = requiredHere.filter(h => (row.values[h] ?? '') === '')
    if (empty.length > 0) issues.push({ rule: '10b', line: row.line, group: name, severity: 'error', message: `required ${empty.length === 1 ? 'field' : 'fields'} ${empty.join(', ')} empty` })
  }

  const keysHere = keys.filter(k => present.has(k))
  if (keysHere.length === 0) return
  const seen = new Map<string, number[]>()
  for (const row of group.rows) {
    const tuple = keyTuple(row, keysHere)
    const lines = seen.get(tuple) ?? []
    lines.push(row.line)
    seen.set(tuple, lines)
  }
  for (const lines of seen.values()) {
    if (lines.length < 2) continue
    for (const rowLine of lines) {
      const others = lines.filter(l => l !== rowLine)
      issues.push({ rule: '10a', line: rowLine, group: name, severity: 'error', message: `the key fields (${keysHere.join(', ')}) repeat those of line ${others.join(', ')}` })
    }
  }
}

function keyTuple(row: AgsRow, keys: readonly string[]): string {
  return keys.map(k => row.values[k] ?? '').join('\u0000')
}

/** Rule 10c: every row's parent key fields match a row of the parent group, which must be in the file. */
function checkParent(group: AgsGroup, definition: AgsGroupDefinition, dict: AgsDictionary, byName: Map<string, AgsGroup>, issues: AgsIssue[]): void {
  const parentName = definition.parent
  if (!parentName) return
  const parentDefinition = dict.groups.get(parentName)
  if (!parentDefinition) return // the parent's keys are unknown, so there is nothing to compare
  // Only the parent's key fields that the child carries link the two (LOCA carries no PROJ key, so it links to PROJ by rule 13 alone).
  const shared = keyHeadings(parentDefinition).filter(k => group.headings.includes(k))
  if (shared.length === 0) return
  const parent = byName.get(parentName)
  if (!parent) {
    issues.push({ rule: '10c', line: group.line, group: group.name, severity: 'error', message: `parent group ${parentName} of ${group.name} is not in the file` })
    return
  }
  const linked = shared.filter(k => parent.headings.includes(k))
  const parentKeys = new Set(parent.rows.map(row => keyTuple(row, linked)))
  for (const row of group.rows) {
    if (parentKeys.has(keyTuple(row, linked))) continue
    const shown = linked.map(k => `${k}=${JSON.stringify(row.values[k] ?? '')}`).join(', ')
    issues.push({ rule: '10c', line: row.line, group: group.name, severity: 'error', message: `no row of the parent group ${parentName} has ${shown}` })
  }
}

/** Rule 8: each value follows its column's TYPE (and UNIT for dates); one finding per column, at its first offending row. */
function checkValues(group: AgsGroup, issues: AgsIssue[]): void {
  group.headings.forEach((heading, index) => {
    const type = group.types[index] ?? ''
    const unit = group.units[index] ?? ''
    let first: { line: number, message: string, severity: 'error' | 'warning' } | null = null
    let count = 0
    for (const row of group.rows) {
      const problem = checkValue(type, unit, row.values[heading] ?? '')
      if (!problem) continue
      count++
      if (!first || (first.severity === 'warning' && problem.severity === 'error')) first = { line: row.line, ...problem }
    }
    if (!first) return
    const more = count > 1 ? ` (${count} rows in all)` : ''
    issues.push({ rule: '8', line: first.line, group: group.name, severity: first.severity, message: `${heading}: ${first.message}${more}` })
  })
}

/** Rule 11c: each record link (TYPE RL) names a group in the file and the key fields of one of its rows. */
function checkRecordLinks(group: AgsGroup, dict: AgsDictionary, byName: Map<string, AgsGroup>, settings: TransferSettings, issues: AgsIssue[]): void {
  group.headings.forEach((heading, index) => {
    if (group.types[index] !== 'RL') return
    for (const row of group.rows) {
      const value = row.values[heading] ?? ''
      if (value === '') continue
      for (const link of value.split(settings.concatenator)) {
        const problem = recordLinkProblem(link, dict, byName, settings)
        if (problem) issues.push({ rule: '11c', line: row.line, group: group.name, severity: 'error', message: `${heading}: record link ${JSON.stringify(link)} ${problem}` })
      }
    }
  })
}

function recordLinkProblem(link: string, dict: AgsDictionary, byName: Map<string, AgsGroup>, settings: TransferSettings): string | null {
  const [target = '', ...given] = link.split(settings.delimiter)
  const group = byName.get(target)
  if (!group) return `does not start with a group in the file followed by ${JSON.stringify(settings.delimiter)} (TRAN_DLIM)`
  const definition = dict.groups.get(target)
  const keys = definition ? keyHeadings(definition) : []
  if (keys.length === 0) return null // without the target's key fields the link cannot be resolved
  if (given.length > keys.length) return `gives ${given.length} key values; ${target} has ${keys.length} key fields (${keys.join(', ')})`
  const wanted = keys.map((_, i) => given[i] ?? '')
  const found = group.rows.some(row => keys.every((k, i) => (row.values[k] ?? '') === wanted[i]))
  return found ? null : `matches no row of ${target} (key fields ${keys.join(', ')})`
}

/**
 * Rules 15 and 17: the UNIT and TYPE groups must exist and define every unit
 * and type used, both in UNIT/TYPE rows and in PU/PT fields. A missing
 * definition is reported at the defining group, where it has to be added.
 */
function checkDefinitionsUsed(
  file: AgsFile,
  definitions: AgsGroup | undefined,
  groupName: string,
  keyHeading: string,
  rule: string,
  pickType: string,
  what: string,
  declared: (group: AgsGroup) => readonly string[],
  issues: AgsIssue[],
): void {
  const used = new Map<string, Set<string>>()
  const note = (value: string, where: string): void => {
    if (value === '') return
    const places = used.get(value) ?? new Set<string>()
    places.add(where)
    used.set(value, places)
  }
  for (const group of file.groups) {
    declared(group).forEach((value, i) => note(value, `${group.name}.${group.headings[i] ?? ''}`))
    group.headings.forEach((heading, i) => {
      if (group.types[i] !== pickType) return
      for (const row of group.rows) note(row.values[heading] ?? '', `${group.name}.${heading}`)
    })
  }
  if (!definitions) {
    const all = [...used.keys()]
    issues.push({ rule, line: 0, group: groupName, severity: 'error', message: `the ${groupName} group is missing; it must define every ${what} the file uses${all.length > 0 ? ` (${all.join(', ')})` : ''}` })
    return
  }
  const defined = new Set(definitions.rows.map(row => row.values[keyHeading] ?? ''))
  for (const [value, places] of used) {
    if (defined.has(value)) continue
    issues.push({ rule, line: definitions.line, group: groupName, severity: 'error', message: `${what} ${JSON.stringify(value)} (used in ${[...places].join(', ')}) is not defined in the ${groupName} group` })
  }
}

/** Rule 16 (and 16a): every abbreviation in a PA field, each part of a combination separately, is defined in ABBR. */
function checkAbbreviations(file: AgsFile, abbr: AgsGroup | undefined, settings: TransferSettings, issues: AgsIssue[]): void {
  const defined = new Set((abbr?.rows ?? []).map(row => `${row.values.ABBR_HDNG ?? ''}\u0000${row.values.ABBR_CODE ?? ''}`))
  const missingGroup: string[] = []
  for (const group of file.groups) {
    group.headings.forEach((heading, i) => {
      if (group.types[i] !== 'PA') return
      const found = new Map<string, { line: number, count: number }>()
      for (const row of group.rows) {
        const value = row.values[heading] ?? ''
        if (value === '') continue
        for (const code of value.split(settings.concatenator)) {
          if (code === '') continue
          const entry = found.get(code)
          if (entry) entry.count++
          else found.set(code, { line: row.line, count: 1 })
        }
      }
      if (found.size === 0) return
      if (!abbr) {
        missingGroup.push(`${group.name}.${heading}`)
        return
      }
      for (const [code, { line, count }] of found) {
        if (defined.has(`${heading}\u0000${code}`)) continue
        const rows = count > 1 ? ` (${count} rows)` : ''
        issues.push({ rule: '16', line, group: group.name, severity: 'error', message: `abbreviation ${JSON.stringify(code)} under ${heading} is not defined in the ABBR group${rows}` })
      }
    })
  }
  if (missingGroup.length > 0) {
    issues.push({ rule: '16', line: 0, group: 'ABBR', severity: 'error', message: `the ABBR group is missing, yet abbreviations are used in ${missingGroup.join(', ')}` })
  }
}

/** Rule 20: FILE_FSET references are listed in FILE; with the delivered files known, each FILE row's file is there. */
function checkFiles(file: AgsFile, fileGroup: AgsGroup | undefined, options: CheckOptions, issues: AgsIssue[]): void {
  const sets = new Set((fileGroup?.rows ?? []).map(row => row.values.FILE_FSET ?? ''))
  const unlisted: string[] = []
  for (const group of file.groups) {
    if (group.name === 'FILE' || !group.headings.includes('FILE_FSET')) continue
    for (const row of group.rows) {
      const reference = row.values.FILE_FSET ?? ''
      if (reference === '') continue
      if (!fileGroup) unlisted.push(`${group.name} line ${row.line}`)
      else if (!sets.has(reference)) issues.push({ rule: '20', line: row.line, group: group.name, severity: 'error', message: `FILE_FSET ${JSON.stringify(reference)} is not listed in the FILE group` })
    }
  }
  if (unlisted.length > 0) {
    issues.push({ rule: '20', line: 0, group: 'FILE', severity: 'error', message: `the FILE group is missing, yet FILE_FSET references are used (${unlisted.join(', ')})` })
  }
  if (!fileGroup || !options.attachedFiles) return
  const delivered = new Set(options.attachedFiles.map(path => path.replace(/\\/g, '/').replace(/^\.\//, '')))
  for (const row of fileGroup.rows) {
    const reference = row.values.FILE_FSET ?? ''
    const name = row.values.FILE_NAME ?? ''
    const folder = `FILE/${reference}/`
    if (![...delivered].some(path => path.startsWith(folder))) {
      issues.push({ rule: '20', line: row.line, group: 'FILE', severity: 'error', message: `no sub-folder ${folder} among the delivered files` })
    }
    else if (!delivered.has(folder + name)) {
      issues.push({ rule: '20', line: row.line, group: 'FILE', severity: 'error', message: `the file ${folder}${name} is not among the delivered files` })
    }
  }
}

function ruleOrder(rule: string): [number, string] {
  const match = /^(\d+)(.*)$/.exec(rule)
  return match ? [Number(match[1]), match[2] ?? ''] : [Number.MAX_SAFE_INTEGER, rule]
}

/** By line, then by rule number, keeping the order of findings on the same line and rule. */
export function sortIssues(issues: readonly AgsIssue[]): AgsIssue[] {
  return issues
    .map((issue, index) => ({ issue, index }))
    .sort((a, b) => {
      if (a.issue.line !== b.issue.line) return a.issue.line - b.issue.line
      const [na, sa] = ruleOrder(a.issue.rule)
      const [nb, sb] = ruleOrder(b.issue.rule)
      if (na !== nb) return na - nb
      if (sa !== sb) return sa < sb ? -1 : 1
      return a.index - b.index
    })
    .map(entry => entry.issue)
}
