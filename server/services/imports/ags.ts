import { checkAgs } from '#shared/ags4/check'
import { standardDictionary } from '#shared/ags4/dictionary'
import { agsToInvestigation } from '#shared/ags4/investigation'
import { decodeAgs, parseAgs } from '#shared/ags4/parse'
import type { AgsFile, AgsIssue } from '#shared/ags4/types'
import { AGS_LINE_LIMIT, tooManyAgsLines } from '#shared/imports/limits'
import { checkIntervals, depthPhrases, type IntervalWords } from '#shared/investigation/intervals'
import type { InvestigationRecord } from '#shared/investigation/types'
import { asUploadRefusal } from './preview'

/**
 * Reads an uploaded AGS4 file: the format rules (checked against the standard
 * dictionary plus the file's own DICT entries), the mapping to Pastload's model,
 * and the groups Pastload keeps but does not map.
 */
/** `analyseAgs` with a file over the line limit refused (422) before it is parsed. */
export function analyseAgsOrThrow(content: Buffer, filename: string, words: IntervalWords = {}) {
  const lines = countLines(content)
  if (lines > AGS_LINE_LIMIT) throw asUploadRefusal(tooManyAgsLines(filename, lines))
  return analyseAgs(content, words)
}

/** Line breaks counted on the bytes (no decoding, no splitting), plus a last line without one. */
function countLines(content: Buffer): number {
  let n = 0
  let at = content.indexOf(10)
  while (at >= 0) {
    n++
    at = content.indexOf(10, at + 1)
  }
  return content.length > 0 && content[content.length - 1] !== 10 ? n + 1 : n
}

/** `words`: how the log rules write depths, in the project's units (`projectDepthWords(…).intervals`). */
export function analyseAgs(content: Buffer, words: IntervalWords = {}) {
  const file = parseAgs(decodeAgs(new Uint8Array(content)))
  const ruleIssues = checkAgs(file, standardDictionary())
  const mapped = agsToInvestigation(file)
  const issues: AgsIssue[] = [...ruleIssues, ...mapped.issues, ...logRuleIssues(file, mapped.data, words)]
  const errors = issues.filter(i => i.severity === 'error')
  const warnings = issues.filter(i => i.severity !== 'error')
  return {
    file,
    groups: file.groups.map(g => ({ name: g.name, rows: g.rows.length, line: g.line })),
    unknownGroups: mapped.unknownGroups,
    undefinedStrata: mapped.undefinedStrata,
    data: mapped.data,
    errors,
    warnings,
    summary: {
      points: mapped.data.points.length,
      intervals: mapped.data.points.reduce((n, p) => n + p.intervals.length, 0),
      samples: mapped.data.points.reduce((n, p) => n + p.samples.length, 0),
      cptRows: mapped.data.points.reduce((n, p) => n + (p.cpt?.depth.length ?? 0), 0),
      strata: mapped.data.strata.length,
    },
  }
}

/**
 * Issues as rows of the import report: the file line (0 only for what concerns the whole file, such
 * as a missing group), the group, and the message in plain words with its first letter capitalised;
 * the rule stays in its own field for those who look it up.
 */
export function asRowErrors(issues: AgsIssue[]) {
  return issues.map(i => ({ row: i.line, column: i.group, message: i.message.charAt(0).toUpperCase() + i.message.slice(1), rule: i.rule }))
}

/** The file line of a group's row for a hole whose heading is near `value` (the group's first line, else the hole's LOCA line). */
export function agsLineOf(file: AgsFile, group: string, loca: string, heading?: string, value?: number): number {
  const g = file.groups.find(x => x.name === group)
  const row = g?.rows.find(r => r.values.LOCA_ID === loca && (heading === undefined || value === undefined || Math.abs(Number(r.values[heading]) - value) < 1e-6))
  if (row) return row.line
  const loc = file.groups.find(x => x.name === 'LOCA')?.rows.find(r => r.values.LOCA_ID === loca)
  return loc?.line ?? g?.line ?? 0
}

/**
 * Pastload's own log rules on the mapped data (the AGS4 format rules say nothing
 * about overlaps or depths beyond the hole), reported at the GEOL or SAMP line, with depths in the
 * project's units (`words`; metres by default).
 */
export function logRuleIssues(file: AgsFile, data: InvestigationRecord, words: IntervalWords = {}): AgsIssue[] {
  const out: AgsIssue[] = []
  const { depth, span } = depthPhrases(words)
  const lineOf = (group: string, loca: string, topHeading: string, top: number) => agsLineOf(file, group, loca, topHeading, top)
  for (const p of data.points) {
    for (const issue of checkIntervals(p.intervals, p.finalDepth, words).issues) {
      const iv = p.intervals[issue.index]!
      out.push({ rule: 'pastload', severity: 'error', group: 'GEOL', line: lineOf('GEOL', p.identifier, 'GEOL_TOP', iv.top), message: `${p.identifier} ${span(iv.top, iv.bottom)}: ${issue.message.replace(/ \(row \d+\)/, '')}` })
    }
    for (const s of p.samples) {
      if (s.bottom > p.finalDepth + 1e-6) out.push({ rule: 'pastload', severity: 'error', group: 'SAMP', line: lineOf('SAMP', p.identifier, 'SAMP_TOP', s.top), message: `${p.identifier} sample ${s.identifier}: bottom (${depth(s.bottom)}) is below the hole's final depth (${depth(p.finalDepth)}).` })
    }
  }
  return out
}
