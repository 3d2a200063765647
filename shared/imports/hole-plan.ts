import { toAscii } from '../ags4/write'
import { checkIntervals, depthPhrases, type IntervalWords } from '../investigation/intervals'
import { pointHeader } from '../investigation/point-header'
import { sptFromStored, sptStored } from '../investigation/spt-blows'
import type { GroundwaterRecord, LogIntervalRecord, PointRecord, SampleRecord, SptRecord, VaneRecord } from '../investigation/types'

/**
 * What an import of whole holes (an AGS4 file) does with holes already in the project, decided per file:
 * - `add-new`: holes new to the project are added; a hole already there is skipped and left as it is;
 * - `update`: a hole already there is merged with the file by natural keys (intervals by top depth,
 *   samples by reference, SPT and vane readings by depth, groundwater by date and depth): rows of the
 *   file that are new are added, rows that differ are changed, rows only in the project stay;
 * - `replace`: a hole already there is made exactly as in the file: rows only in the project are removed.
 *   A sample that carries an oedometer test or attachments is never removed this way: the plan refuses.
 * Samples keep their identity (and with it their tests and attachments) whenever their reference matches.
 * Oedometer tests in the file are written for samples new to the project only; a sample already in the
 * project keeps its tests as they are.
 */
export const HOLE_IMPORT_MODES = ['add-new', 'update', 'replace'] as const
export type HoleImportMode = (typeof HOLE_IMPORT_MODES)[number]

export const HOLE_IMPORT_MODE_LABELS: Readonly<Record<HoleImportMode, string>> = {
  'add-new': 'Only add holes that are not here yet',
  'update': 'Merge into the holes already here',
  'replace': 'Make the holes already here match the file',
}

export const HOLE_IMPORT_MODE_HINTS: Readonly<Record<HoleImportMode, string>> = {
  'add-new': 'A hole already in the project is skipped and stays exactly as it is.',
  'update': 'Intervals (by top depth), samples (by reference) and readings (by depth; water by date and depth) are added or changed; nothing is removed.',
  'replace': 'Intervals, samples and readings of a matching hole that are not in the file are removed. A sample with an oedometer test or attachments is never removed.',
}

/** What depends on a sample already in the project (a replace never removes such a sample). */
export interface SampleTies {
  oedometerTests: number
  attachments: number
}

/** A hole already in the project: its record and the stored ids of its rows, in the record's order. */
export interface ExistingHole {
  id: string
  point: PointRecord
  intervalIds: readonly string[]
  sampleIds: readonly string[]
  sampleTies: readonly SampleTies[]
  sptIds: readonly string[]
  groundwaterIds: readonly string[]
  vaneIds: readonly string[]
}

export interface RowDiff<T> {
  added: T[]
  changed: { id: string, before: T, after: T }[]
  removed: { id: string, row: T }[]
  /** Rows in both that are the same. */
  same: number
  /** Rows only in the project that an update leaves as they are. */
  kept: number
}

export type HoleAction = 'add' | 'skip' | 'update' | 'replace'

export interface HolePlan {
  identifier: string
  action: HoleAction
  /** The stored point (null for a hole new to the project). */
  pointId: string | null
  /** The file's record of the hole. */
  incoming: PointRecord
  /** Header fields (final depth, coordinates …) the file changes. */
  header: string[]
  intervals: RowDiff<LogIntervalRecord>
  samples: RowDiff<SampleRecord>
  spt: RowDiff<SptRecord>
  groundwater: RowDiff<GroundwaterRecord>
  vane: RowDiff<VaneRecord>
  cpt: 'none' | 'add' | 'change' | 'remove' | 'same'
  /** Oedometer tests in the file for samples already in the project, left as they are. */
  keptTests: number
  /** Why this hole cannot be imported in this mode (the whole import is refused). */
  blockers: string[]
}

/** A problem of the hole as it would be after the import, with where it comes from. */
export interface HolePlanIssue {
  identifier: string
  kind: 'interval' | 'sample'
  /** Top depth of the interval or sample, m. */
  top: number
  /** True when the row comes from the file (its line can be named), false when it is already in the project. */
  fromFile: boolean
  message: string
}

/**
 * How close two stored and imported numbers must be to count as the same value: the precision an
 * AGS4 file carries them with (depths and coordinates to 0.01 m, limits and recovery to 1 %,
 * water content to 0.1 %, bulk density to 0.001 Mg/m³ ≈ 0.01 kN/m³), so that a hole exported and read
 * back unchanged shows no change. Any other number must match to 1e-9.
 */
export const SAME_VALUE_TOLERANCE: Readonly<Record<string, number>> = {
  top: 0.005, bottom: 0.005, depth: 0.005, finalDepth: 0.005, easting: 0.005, northing: 0.005, groundElevation: 0.005,
  recovery: 0.5, liquidLimit: 0.5, plasticLimit: 0.5, waterContent: 0.05, bulkUnitWeight: 0.01,
  peak: 0.05, remoulded: 0.05, pressure: 0.05, areaRatio: 0.0005, qc: 0.5, fs: 0.05, u2: 0.05,
}

const EPS = 1e-9

/** Deep sameness of two records, numbers within `SAME_VALUE_TOLERANCE` of their field. */
export function sameValue(a: unknown, b: unknown, field = ''): boolean {
  if (typeof a === 'number' && typeof b === 'number') return Math.abs(a - b) <= (SAME_VALUE_TOLERANCE[field] ?? 0) + EPS
  if (a === null || b === null || a === undefined || b === undefined) return (a ?? null) === (b ?? null)
  if (Array.isArray(a) || ArrayBuffer.isView(a)) {
    const x = a as unknown as ArrayLike<unknown>
    const y = b as unknown as ArrayLike<unknown>
    if (typeof y !== 'object' || x.length !== y.length) return false
    for (let i = 0; i < x.length; i++) if (!sameValue(x[i], y[i], field)) return false
    return true
  }
  if (typeof a === 'object' && typeof b === 'object') {
    const keys = new Set([...Object.keys(a), ...Object.keys(b)])
    for (const k of keys) if (!sameValue((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], k)) return false
    return true
  }
  // An AGS4 file is ASCII: text that differs only in what the file cannot carry ("–" written "-") is the same.
  if (typeof a === 'string' && typeof b === 'string') return a === b || toAscii(a) === toAscii(b)
  return a === b
}

const depthKey = (d: number | null) => (d === null ? '-' : (Math.round(d * 100) / 100).toFixed(2))
/** A date-time to the minute, whatever its offset notation. */
const minuteKey = (iso: string) => {
  const t = Date.parse(iso)
  return Number.isFinite(t) ? String(Math.floor(t / 60000)) : iso
}

export const NATURAL_KEYS = {
  interval: (r: LogIntervalRecord) => depthKey(r.top),
  sample: (r: SampleRecord) => r.identifier,
  spt: (r: SptRecord) => depthKey(r.depth),
  groundwater: (r: GroundwaterRecord) => `${minuteKey(r.observedAt)}@${depthKey(r.depth)}`,
  vane: (r: VaneRecord) => depthKey(r.depth),
}

const sameSample = (a: SampleRecord, b: SampleRecord) => sameValue({ ...a, oedometer: null }, { ...b, oedometer: null })
/** SPTs compared by their increments as stored, so a row kept as three counts per 150 mm equals the same test written as increments. */
const sameSpt = (a: SptRecord, b: SptRecord) => sameValue(a.depth, b.depth, 'depth') && sameValue(sptStored(sptFromStored(a)), sptStored(sptFromStored(b)))
const sameGroundwater = (a: GroundwaterRecord, b: GroundwaterRecord) => sameValue({ ...a, observedAt: minuteKey(a.observedAt) }, { ...b, observedAt: minuteKey(b.observedAt) })

/** Matches rows by natural key (the first unmatched stored row with the file row's key). */
export function diffRows<T>(existing: readonly T[], ids: readonly string[], incoming: readonly T[], key: (r: T) => string, same: (a: T, b: T) => boolean = sameValue, removeUnmatched = false): RowDiff<T> {
  const byKey = new Map<string, number[]>()
  existing.forEach((r, i) => {
    const k = key(r)
    byKey.set(k, [...(byKey.get(k) ?? []), i])
  })
  const matched = new Set<number>()
  const out: RowDiff<T> = { added: [], changed: [], removed: [], same: 0, kept: 0 }
  for (const r of incoming) {
    const i = byKey.get(key(r))?.find(j => !matched.has(j))
    if (i === undefined) {
      out.added.push(r)
      continue
    }
    matched.add(i)
    if (same(existing[i]!, r)) out.same++
    else out.changed.push({ id: ids[i]!, before: existing[i]!, after: r })
  }
  existing.forEach((r, i) => {
    if (matched.has(i)) return
    if (removeUnmatched) out.removed.push({ id: ids[i]!, row: r })
    else out.kept++
  })
  return out
}

const emptyDiff = <T>(): RowDiff<T> => ({ added: [], changed: [], removed: [], same: 0, kept: 0 })
const allAdded = <T>(rows: readonly T[]): RowDiff<T> => ({ ...emptyDiff<T>(), added: [...rows] })
const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`

/** One plan per hole of the file: add, skip, update or replace, with every row's change. No I/O. */
export function planHoleImport(incoming: readonly PointRecord[], existing: ReadonlyMap<string, ExistingHole>, mode: HoleImportMode): HolePlan[] {
  return incoming.map((p) => {
    const old = existing.get(p.identifier)
    const base = { identifier: p.identifier, incoming: p, header: [] as string[], keptTests: 0, blockers: [] as string[] }
    if (!old) {
      return {
        ...base, action: 'add', pointId: null,
        intervals: allAdded(p.intervals), samples: allAdded(p.samples), spt: allAdded(p.spt), groundwater: allAdded(p.groundwater), vane: allAdded(p.vane),
        cpt: p.cpt ? 'add' : 'none',
      }
    }
    if (mode === 'add-new') {
      return {
        ...base, action: 'skip', pointId: old.id,
        intervals: emptyDiff(), samples: emptyDiff(), spt: emptyDiff(), groundwater: emptyDiff(), vane: emptyDiff(), cpt: 'none',
      }
    }
    const remove = mode === 'replace'
    const o = old.point
    const newHeader = pointHeader(p)
    const oldHeader = pointHeader(o)
    const header = (Object.keys(newHeader) as (keyof typeof newHeader)[]).filter(k => !sameValue(oldHeader[k], newHeader[k], k))
    const samplesDiff = diffRows(o.samples, old.sampleIds, p.samples, NATURAL_KEYS.sample, sameSample, remove)
    const blockers: string[] = []
    for (const r of samplesDiff.removed) {
      const ties = old.sampleTies[old.sampleIds.indexOf(r.id)]
      if (!ties) continue
      const what = [ties.oedometerTests ? plural(ties.oedometerTests, 'oedometer test') : '', ties.attachments ? plural(ties.attachments, 'attachment') : ''].filter(Boolean)
      if (what.length) blockers.push(`Replacing ${p.identifier} would remove sample ${r.row.identifier}, which has ${what.join(' and ')}. Keep the sample in the file, merge instead, or delete the sample in Pastload first.`)
    }
    const matchedRefs = new Set(o.samples.map(s => s.identifier))
    const cpt = p.cpt
      ? (o.cpt ? (sameValue(o.cpt, p.cpt) ? 'same' : 'change') : 'add')
      : (o.cpt && remove ? 'remove' : 'none')
    return {
      ...base,
      action: mode,
      pointId: old.id,
      header,
      intervals: diffRows(o.intervals, old.intervalIds, p.intervals, NATURAL_KEYS.interval, sameValue, remove),
      samples: samplesDiff,
      spt: diffRows(o.spt, old.sptIds, p.spt, NATURAL_KEYS.spt, sameSpt, remove),
      groundwater: diffRows(o.groundwater, old.groundwaterIds, p.groundwater, NATURAL_KEYS.groundwater, sameGroundwater, remove),
      vane: diffRows(o.vane, old.vaneIds, p.vane, NATURAL_KEYS.vane, sameValue, remove),
      cpt,
      keptTests: p.samples.filter(s => s.oedometer && matchedRefs.has(s.identifier)).length,
      blockers,
    }
  })
}

/** The hole's log and samples as they would be after the import (stored rows that stay, then the file's). */
export function holeAfter(plan: HolePlan, existing: ExistingHole | undefined): { finalDepth: number, intervals: { row: LogIntervalRecord, fromFile: boolean }[], samples: { row: SampleRecord, fromFile: boolean }[] } {
  if (plan.action === 'add' || !existing) {
    return { finalDepth: plan.incoming.finalDepth, intervals: plan.incoming.intervals.map(row => ({ row, fromFile: true })), samples: plan.incoming.samples.map(row => ({ row, fromFile: true })) }
  }
  if (plan.action === 'skip') {
    return { finalDepth: existing.point.finalDepth, intervals: existing.point.intervals.map(row => ({ row, fromFile: false })), samples: existing.point.samples.map(row => ({ row, fromFile: false })) }
  }
  const after = <T>(d: RowDiff<T>, rows: readonly T[], ids: readonly string[]) => {
    const gone = new Set([...d.removed.map(r => r.id), ...d.changed.map(c => c.id)])
    return [
      ...rows.filter((_, i) => !gone.has(ids[i]!)).map(row => ({ row, fromFile: false })),
      ...[...d.changed.map(c => c.after), ...d.added].map(row => ({ row, fromFile: true })),
    ]
  }
  return {
    finalDepth: plan.incoming.finalDepth,
    intervals: after(plan.intervals, existing.point.intervals, existing.intervalIds).sort((a, b) => a.row.top - b.row.top),
    samples: after(plan.samples, existing.point.samples, existing.sampleIds),
  }
}

/**
 * Pastload's log rules on each hole as it would be after the import: intervals that overlap or go
 * below the final depth, samples below the final depth. Depths in `words`: the project's units (ft on a US project).
 */
export function holePlanIssues(plans: readonly HolePlan[], existing: ReadonlyMap<string, ExistingHole>, words: IntervalWords = {}): HolePlanIssue[] {
  const out: HolePlanIssue[] = []
  const { depth, span } = depthPhrases(words)
  for (const plan of plans) {
    // A skipped hole is checked as the file has it: a problem in the file is reported even if it is not written.
    const after = holeAfter(plan.action === 'skip' ? { ...plan, action: 'add' } : plan, existing.get(plan.identifier))
    const rows = after.intervals.map(i => i.row)
    for (const issue of checkIntervals(rows, after.finalDepth, words).issues) {
      const iv = after.intervals[issue.index]!
      const where = iv.fromFile ? '' : ' (already in the project)'
      out.push({ identifier: plan.identifier, kind: 'interval', top: iv.row.top, fromFile: iv.fromFile, message: `${plan.identifier} ${span(iv.row.top, iv.row.bottom)}${where}: ${issue.message.replace(/ \(row \d+\)/, '')}` })
    }
    for (const s of after.samples) {
      if (s.row.bottom > after.finalDepth + 1e-6) {
        const where = s.fromFile ? '' : ' (already in the project)'
        out.push({ identifier: plan.identifier, kind: 'sample', top: s.row.top, fromFile: s.fromFile, message: `${plan.identifier} sample ${s.row.identifier}${where}: bottom (${depth(s.row.bottom)}) is below the hole's final depth (${depth(after.finalDepth)}).` })
      }
    }
  }
  return out
}

/** Counts of one kind of row in a hole's plan, for the preview. */
export interface RowCounts { added: number, changed: number, removed: number, same: number, kept: number }
const counts = <T>(d: RowDiff<T>): RowCounts => ({ added: d.added.length, changed: d.changed.length, removed: d.removed.length, same: d.same, kept: d.kept })

/** One line of a hole's preview: an interval or sample added, changed or removed. */
export interface HoleChangeLine {
  change: 'added' | 'changed' | 'removed'
  kind: 'interval' | 'sample'
  top: number
  bottom: number
  /** The interval's description or the sample's reference. */
  label: string
  /** For a change: what it was (description or reference with depths). */
  before?: string
}

/** The preview of one hole, as the API answers it. */
export interface HolePreview {
  identifier: string
  action: HoleAction
  /** The whole preview in one sentence. */
  summary: string
  /** A matching hole the import leaves as it is (the file matches it). */
  unchanged: boolean
  header: string[]
  intervals: RowCounts
  samples: RowCounts
  spt: RowCounts
  groundwater: RowCounts
  vane: RowCounts
  cpt: HolePlan['cpt']
  keptTests: number
  blockers: string[]
  /** Intervals and samples that change (at most `MAX_PREVIEW_LINES`). */
  lines: HoleChangeLine[]
  /** Lines left out of `lines`. */
  moreLines: number
}

export const MAX_PREVIEW_LINES = 60

/** The header fields of a hole in the preview's words. */
const HEADER_WORDS: Readonly<Record<string, string>> = {
  identifier: 'identifier', kind: 'kind', easting: 'easting', northing: 'northing', groundElevation: 'ground elevation', finalDepth: 'final depth',
  startedOn: 'start date', endedOn: 'end date', method: 'method', loggedBy: 'logged by', remarks: 'remarks',
}

function describeCounts(c: RowCounts, one: string, many = `${one}s`): string[] {
  return [
    c.added ? `${plural(c.added, one, many)} added` : '',
    c.changed ? `${plural(c.changed, one, many)} changed` : '',
    c.removed ? `${plural(c.removed, one, many)} removed` : '',
  ].filter(Boolean)
}

/** A hole's plan in plain words and counts, bounded for the reply. */
export function previewHole(plan: HolePlan): HolePreview {
  const c = { intervals: counts(plan.intervals), samples: counts(plan.samples), spt: counts(plan.spt), groundwater: counts(plan.groundwater), vane: counts(plan.vane) }
  const parts = [
    ...(plan.header.length ? [`${plan.header.map(k => HEADER_WORDS[k] ?? k).join(', ')} changed`] : []),
    ...describeCounts(c.intervals, 'interval'),
    ...describeCounts(c.samples, 'sample'),
    ...describeCounts(c.spt, 'SPT'),
    ...describeCounts(c.groundwater, 'water reading'),
    ...describeCounts(c.vane, 'vane reading'),
    ...(plan.cpt === 'add' ? ['CPT sounding added'] : plan.cpt === 'change' ? ['CPT sounding replaced'] : plan.cpt === 'remove' ? ['CPT sounding removed'] : []),
  ]
  let summary: string
  if (plan.action === 'skip') summary = `${plan.identifier} is already in the project: skipped, left as it is.`
  else if (plan.action === 'add') summary = `${plan.identifier} is new: added with ${plural(plan.incoming.intervals.length, 'interval')} and ${plural(plan.incoming.samples.length, 'sample')}.`
  else if (!parts.length) summary = `${plan.identifier} is already in the project and matches the file: nothing changes.`
  else summary = `${plan.identifier}: ${parts.join(', ')}.`
  if (plan.action === 'update' && (c.intervals.kept || c.samples.kept)) {
    summary += ` Kept as they are: ${[c.intervals.kept ? plural(c.intervals.kept, 'interval') : '', c.samples.kept ? plural(c.samples.kept, 'sample') : ''].filter(Boolean).join(' and ')} not in the file.`
  }
  if (plan.keptTests) summary += ` The file's ${plural(plan.keptTests, 'oedometer test')} for samples already here ${plan.keptTests === 1 ? 'is' : 'are'} not imported; the stored tests stay.`
  const lines: HoleChangeLine[] = []
  if (plan.action === 'update' || plan.action === 'replace') {
    for (const r of plan.intervals.added) lines.push({ change: 'added', kind: 'interval', top: r.top, bottom: r.bottom, label: r.description })
    for (const r of plan.intervals.changed) lines.push({ change: 'changed', kind: 'interval', top: r.after.top, bottom: r.after.bottom, label: r.after.description, before: `${r.before.top}–${r.before.bottom} m ${r.before.description}` })
    for (const r of plan.intervals.removed) lines.push({ change: 'removed', kind: 'interval', top: r.row.top, bottom: r.row.bottom, label: r.row.description })
    for (const r of plan.samples.added) lines.push({ change: 'added', kind: 'sample', top: r.top, bottom: r.bottom, label: r.identifier })
    for (const r of plan.samples.changed) lines.push({ change: 'changed', kind: 'sample', top: r.after.top, bottom: r.after.bottom, label: r.after.identifier, before: `${r.before.identifier} ${r.before.top}–${r.before.bottom} m` })
    for (const r of plan.samples.removed) lines.push({ change: 'removed', kind: 'sample', top: r.row.top, bottom: r.row.bottom, label: r.row.identifier })
  }
  return {
    identifier: plan.identifier, action: plan.action, summary, unchanged: (plan.action === 'update' || plan.action === 'replace') && !parts.length, header: plan.header, ...c, cpt: plan.cpt, keptTests: plan.keptTests, blockers: plan.blockers,
    lines: lines.slice(0, MAX_PREVIEW_LINES), moreLines: Math.max(0, lines.length - MAX_PREVIEW_LINES),
  }
}
