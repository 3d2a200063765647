// The plan of an import of whole holes: add new only, merge (update) or replace, per hole, with
// every row's change; and the log rules on each hole as it would be after the import.
import { describe, expect, it } from 'vitest'
import { agsToInvestigation, investigationToAgs } from '../../../shared/ags4/investigation'
import { parseAgs } from '../../../shared/ags4/parse'
import { generateDemoInvestigation } from '../../../shared/demo/generate'
import { diffRows, type ExistingHole, holePlanIssues, planHoleImport, previewHole, sameValue } from '../../../shared/imports/hole-plan'
import type { PointRecord } from '../../../shared/investigation/types'
import { unitWords } from '../../../server/services/project-units'

const base: PointRecord = {
  identifier: 'BH-01', kind: 'borehole', easting: 1000, northing: 2000, groundElevation: 2.5, finalDepth: 10,
  startedOn: '2026-03-02', endedOn: '2026-03-03', method: 'Rotary', loggedBy: 'Demo logger', remarks: '',
  intervals: [
    { top: 0, bottom: 1.2, description: 'Made ground', uscs: 'GC', stratumCode: 'MG', moisture: null, consistency: null },
    { top: 1.2, bottom: 6, description: 'Soft grey clay', uscs: 'CH', stratumCode: 'EST', moisture: 'wet', consistency: 'soft' },
    { top: 6, bottom: 10, description: 'Firm clay', uscs: 'CL', stratumCode: 'GLAC', moisture: null, consistency: 'firm' },
  ],
  samples: [
    { identifier: 'U1', top: 2, bottom: 2.45, type: 'thin-walled-tube', recovery: 95, remarks: '', index: { waterContent: 48.2, liquidLimit: 62, plasticLimit: 27, bulkUnitWeight: 16.1 }, oedometer: null },
    { identifier: 'U2', top: 4, bottom: 4.45, type: 'thin-walled-tube', recovery: 90, remarks: '', index: null, oedometer: null },
  ],
  spt: [{ depth: 7, blows: [3, 4, 5], n: 9 }],
  groundwater: [{ kind: 'strike', observedAt: '2026-03-02T10:15:00.000Z', depth: 1.5, pressure: null, remarks: '' }],
  cpt: null,
  vane: [{ depth: 3, peak: 18, remoulded: 6 }],
}

const clone = (p: PointRecord): PointRecord => structuredClone(p)

function stored(p: PointRecord, ties: Partial<Record<string, { oedometerTests: number, attachments: number }>> = {}): ExistingHole {
  return {
    id: 'point-1', point: p,
    intervalIds: p.intervals.map((_, i) => `iv-${i}`),
    sampleIds: p.samples.map(s => `s-${s.identifier}`),
    sampleTies: p.samples.map(s => ties[s.identifier] ?? { oedometerTests: 0, attachments: 0 }),
    sptIds: p.spt.map((_, i) => `spt-${i}`), groundwaterIds: p.groundwater.map((_, i) => `gw-${i}`), vaneIds: p.vane.map((_, i) => `v-${i}`),
  }
}

/** The file: the middle interval's description changed, a new interval below, U2 dropped, a new sample U3. */
function edited(): PointRecord {
  const p = clone(base)
  p.finalDepth = 12
  p.intervals[1]!.description = 'Soft grey silty clay with shells'
  p.intervals.push({ top: 10, bottom: 12, description: 'Dense sand', uscs: 'SP', stratumCode: null, moisture: null, consistency: 'dense' })
  p.samples = [p.samples[0]!, { identifier: 'U3', top: 8, bottom: 8.45, type: 'piston', recovery: 100, remarks: '', index: null, oedometer: null }]
  return p
}

describe('planHoleImport', () => {
  const existing = new Map([['BH-01', stored(base)]])

  it('adds a hole new to the project with all its rows', () => {
    const p = { ...clone(base), identifier: 'BH-09' }
    const [plan] = planHoleImport([p], existing, 'update')
    expect(plan!.action).toBe('add')
    expect(plan!.intervals.added).toHaveLength(3)
    expect(plan!.samples.added.map(s => s.identifier)).toEqual(['U1', 'U2'])
    expect(previewHole(plan!).summary).toBe('BH-09 is new: added with 3 intervals and 2 samples.')
  })

  it('skips a matching hole when only new holes are added, and says so', () => {
    const [plan] = planHoleImport([edited()], existing, 'add-new')
    expect(plan!.action).toBe('skip')
    expect(plan!.intervals.added).toEqual([])
    expect(previewHole(plan!).summary).toBe('BH-01 is already in the project: skipped, left as it is.')
  })

  it('merges by natural keys: adds and changes, never removes', () => {
    const [plan] = planHoleImport([edited()], existing, 'update')
    expect(plan!.action).toBe('update')
    expect(plan!.header).toEqual(['finalDepth'])
    expect(plan!.intervals.added.map(i => i.top)).toEqual([10])
    expect(plan!.intervals.changed.map(c => [c.id, c.before.description, c.after.description])).toEqual([['iv-1', 'Soft grey clay', 'Soft grey silty clay with shells']])
    expect(plan!.intervals.removed).toEqual([])
    expect(plan!.intervals.same).toBe(2)
    expect(plan!.samples.added.map(s => s.identifier)).toEqual(['U3'])
    expect(plan!.samples.removed).toEqual([])
    expect(plan!.samples.kept).toBe(1)
    expect(plan!.spt.same + plan!.groundwater.same + plan!.vane.same).toBe(3)
    const preview = previewHole(plan!)
    expect(preview.summary).toBe('BH-01: final depth changed, 1 interval added, 1 interval changed, 1 sample added. Kept as they are: 1 sample not in the file.')
    expect(preview.lines.map(l => [l.change, l.kind, l.top, l.label])).toEqual([
      ['added', 'interval', 10, 'Dense sand'],
      ['changed', 'interval', 1.2, 'Soft grey silty clay with shells'],
      ['added', 'sample', 8, 'U3'],
    ])
  })

  it('replaces: rows only in the project are removed, matching samples keep their id', () => {
    const [plan] = planHoleImport([edited()], existing, 'replace')
    expect(plan!.action).toBe('replace')
    expect(plan!.samples.removed.map(r => [r.id, r.row.identifier])).toEqual([['s-U2', 'U2']])
    expect(plan!.samples.same).toBe(1)
    expect(plan!.blockers).toEqual([])
    expect(previewHole(plan!).summary).toBe('BH-01: final depth changed, 1 interval added, 1 interval changed, 1 sample added, 1 sample removed.')
  })

  it('refuses to replace away a sample with an oedometer test or attachments', () => {
    const tied = new Map([['BH-01', stored(base, { U2: { oedometerTests: 1, attachments: 2 } })]])
    const [plan] = planHoleImport([edited()], tied, 'replace')
    expect(plan!.blockers).toEqual(['Replacing BH-01 would remove sample U2, which has 1 oedometer test and 2 attachments. Keep the sample in the file, merge instead, or delete the sample in Pastload first.'])
    // Merging never removes it, so it is not refused.
    expect(planHoleImport([edited()], tied, 'update')[0]!.blockers).toEqual([])
  })

  it('matches groundwater by date and depth, and an SPT by its depth', () => {
    const p = clone(base)
    p.groundwater[0]!.observedAt = '2026-03-02T10:15:00Z'
    p.groundwater.push({ kind: 'standing', observedAt: '2026-03-03T08:00:00Z', depth: 1.4, pressure: null, remarks: '' })
    p.spt[0] = { depth: 7, blows: [3, 5, 6], n: 11 }
    const [plan] = planHoleImport([p], existing, 'update')
    expect(plan!.groundwater.same).toBe(1)
    expect(plan!.groundwater.added).toHaveLength(1)
    expect(plan!.spt.changed.map(c => [c.before.n, c.after.n])).toEqual([[9, 11]])
  })

  it('shows no change for a hole exported to AGS4 and read back unchanged', () => {
    const demo = generateDemoInvestigation()
    const back = agsToInvestigation(parseAgs(investigationToAgs(demo))).data
    const stores = new Map(demo.points.map(p => [p.identifier, { ...stored(p), id: p.identifier }]))
    const plans = planHoleImport(back.points, stores, 'replace')
    expect(plans.length).toBe(demo.points.length)
    const changed = plans.map(previewHole).filter(h => !h.summary.includes('matches the file: nothing changes.'))
    expect(changed.map(h => h.summary)).toEqual([])
  })
})

describe('holePlanIssues', () => {
  it('checks the merged log: a file interval that overlaps a kept one is named as from the file', () => {
    const p = clone(base)
    // Only one new interval in the file, overlapping the stored 6–10 m interval.
    p.intervals = [{ top: 9, bottom: 10.5, description: 'Sand', uscs: 'SP', stratumCode: null, moisture: null, consistency: null }]
    p.finalDepth = 12
    p.samples = []
    const existing = new Map([['BH-01', stored(base)]])
    const issues = holePlanIssues(planHoleImport([p], existing, 'update'), existing)
    expect(issues.map(i => [i.kind, i.top, i.fromFile])).toContainEqual(['interval', 9, true])
    expect(issues.every(i => !i.message.startsWith('Rule'))).toBe(true)
    expect(issues.find(i => i.fromFile)!.message).toMatch(/^BH-01 9–10\.5 m: /)
    // Replacing the hole leaves only the file's interval: nothing overlaps.
    expect(holePlanIssues(planHoleImport([p], existing, 'replace'), existing)).toEqual([])
  })

  /** The file makes BH-01 3.5 m deep, one interval and only its first sample: the stored U2 (to 4.45 m) is left below; its issues in `words`. */
  function shallowerHoleIssues(words?: Parameters<typeof holePlanIssues>[2]) {
    const p = clone(base)
    p.finalDepth = 3.5
    p.intervals = [{ top: 0, bottom: 3.5, description: 'Clay', uscs: 'CL', stratumCode: null, moisture: null, consistency: null }]
    p.samples = [base.samples[0]!]
    const existing = new Map([['BH-01', stored(base)]])
    return holePlanIssues(planHoleImport([p], existing, 'update'), existing, words)
  }

  it('names a stored sample left below a shallower final depth', () => {
    const issues = shallowerHoleIssues()
    expect(issues.map(i => i.message)).toContain('BH-01 sample U2 (already in the project): bottom (4.45 m) is below the hole\'s final depth (3.5 m).')
    expect(issues.some(i => i.kind === 'interval' && !i.fromFile)).toBe(true)
  })
  it('writes depths in feet for a US project (the project\'s words, 1 ft = 0.3048 m)', () => {
    const issues = shallowerHoleIssues(unitWords('US').intervals)
    expect(issues.map(i => i.message)).toContain('BH-01 sample U2 (already in the project): bottom (14.60 ft) is below the hole\'s final depth (11.48 ft).')
    const messages = issues.map(i => i.message).join('\n')
    expect(messages).not.toMatch(/\d m\b/)
    expect(messages).toMatch(/ft/)
  })
})

describe('diffRows and sameValue', () => {
  it('keeps duplicates apart and compares numbers at the file precision of their field', () => {
    const d = diffRows([{ depth: 1 }, { depth: 1 }], ['a', 'b'], [{ depth: 1.004 }], r => r.depth.toFixed(1), sameValue, true)
    expect(d.same).toBe(1)
    expect(d.removed.map(r => r.id)).toEqual(['b'])
    expect(sameValue({ depth: 1 }, { depth: 1.006 })).toBe(false)
    expect(sameValue({ n: 1 }, { n: 1.001 })).toBe(false)
    expect(sameValue({ a: null }, {})).toBe(true)
    expect(sameValue('Backfilled with cement–bentonite grout.', 'Backfilled with cement-bentonite grout.')).toBe(true)
    expect(sameValue('Soft clay', 'Soft silty clay')).toBe(false)
  })
})
