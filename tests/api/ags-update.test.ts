// AGS4 files for holes already in the project: the demo's own holes exported, edited (one interval's
// description changed, one interval added below a deeper final depth) and imported back with
// "add new only", "update" and "replace": the dry run's plan per hole, one audit entry per import,
// and the database exactly as planned. Problems are reported at their file line in plain words.
import { beforeAll, beforeEach, describe, expect, it } from 'vitest'
import { demoProjectId, signedInDemo } from '../helpers/http'
import { agsFields as fields, agsLine as line, editableAgs as editable, editBh01 } from '../helpers/ags-edit'
import { createProject } from '../helpers/project'
import { upload } from '../helpers/upload'

interface Counts { added: number, changed: number, removed: number, same: number, kept: number }
interface HolePreview { identifier: string, action: string, summary: string, header: string[], intervals: Counts, samples: Counts, blockers: string[], lines: { change: string, kind: string, top: number, label: string }[] }
interface Reply { dryRun: boolean, mode: string, holes: HolePreview[], holeCounts: Record<string, number>, refusal: string | null }
interface Interval { id: string, top: number, bottom: number, description: string }
interface PointDetail { point: { finalDepth: number }, intervals: Interval[], samples: { id: string, identifier: string }[] }
interface RowError { row: number, column: string, message: string }

describe('AGS4 import into holes already in the project', () => {
  const { owner } = signedInDemo('owner')
  let original: string
  /** The demo's file with BH-01 edited: its text, the edited description and the new final depth. */
  let edit: ReturnType<typeof editBh01>
  let base: string

  beforeAll(async () => {
    const demo = await demoProjectId(owner)
    const res = await fetch(`${owner.base}/exports/${demo}/logs.ags`, { headers: { cookie: owner.cookie! } })
    original = await res.text()
    edit = editBh01(original)
  })

  // Every test starts from a project of its own holding the demo's holes as they are.
  beforeEach(async () => {
    const p = await createProject(owner, 'AGU', 'AGS4 update test site')
    base = p.base
    const up = await upload<{ importId: string }>(owner, `${base}/imports`, 'demo.ags', original, 'text/plain')
    const done = await owner.post<Reply>(`${base}/imports/${up.body.importId}/commit-ags`, {})
    expect(done.status, JSON.stringify(done.body).slice(0, 400)).toBe(200)
    expect(done.body.holeCounts.add).toBeGreaterThan(10)
  })

  const bh01 = async () => {
    const pts = await owner.get<{ points: { id: string, identifier: string }[] }>(`${base}/points?q=BH-01`)
    const id = pts.body.points.find(p => p.identifier === 'BH-01')!.id
    return (await owner.get<PointDetail>(`${base}/points/${id}`)).body
  }
  const audits = async () => (await owner.get<{ events: { action: string, entity: string, after: { mode?: string, holes?: Record<string, number> } | null }[] }>(`${base}/audit?limit=100`)).body.events.filter(e => e.action === 'import' && e.entity === 'ags4')
  const testCount = async () => (await owner.get<{ tests: unknown[] }>(`${base}/tests/oedometer?limit=100`)).body.tests.length
  async function importAs(text: string, mode: string) {
    const up = await upload<{ importId: string, ags: { errors: unknown[] } }>(owner, `${base}/imports`, 'edited.ags', text, 'text/plain')
    expect(up.status).toBe(201)
    const dry = await owner.post<Reply>(`${base}/imports/${up.body.importId}/commit-ags`, { dryRun: true, mode })
    expect(dry.status, JSON.stringify(dry.body).slice(0, 400)).toBe(200)
    return { importId: up.body.importId, dry: dry.body }
  }

  it('"add new only" skips every hole already here, says so, and changes nothing', async () => {
    const before = await bh01()
    const auditsBefore = (await audits()).length
    const { importId, dry } = await importAs(edit.text, 'add-new')
    expect(dry.holeCounts.add).toBe(0)
    expect(dry.holeCounts.skip).toBe(dry.holes.length)
    expect(dry.holes.find(h => h.identifier === 'BH-01')!.summary).toBe('BH-01 is already in the project: skipped, left as it is.')
    const done = await owner.post<Reply>(`${base}/imports/${importId}/commit-ags`, { mode: 'add-new' })
    expect(done.status).toBe(200)
    expect(await bh01()).toEqual(before)
    const after = await audits()
    expect(after.length).toBe(auditsBefore + 1)
    expect(after[0]!.after!.mode).toBe('add-new')
  })

  it('"update" previews one interval changed and one added for BH-01 only, then writes exactly that', async () => {
    const before = await bh01()
    const tests = await testCount()
    const { importId, dry } = await importAs(edit.text, 'update')
    const hole = dry.holes.find(h => h.identifier === 'BH-01')!
    expect(hole.action).toBe('update')
    expect(hole.header).toEqual(['finalDepth'])
    expect([hole.intervals.added, hole.intervals.changed, hole.intervals.removed]).toEqual([1, 1, 0])
    expect(hole.intervals.same).toBe(before.intervals.length - 1)
    expect(hole.lines.map(l => [l.change, l.kind, l.label])).toEqual([['added', 'interval', 'Very dense grey sandy gravel.'], ['changed', 'interval', edit.editedDescription]])
    // Every other hole matches the file.
    expect(dry.holes.filter(h => h.identifier !== 'BH-01' && !h.summary.includes('matches the file: nothing changes.')).map(h => h.summary)).toEqual([])
    // The dry run wrote nothing.
    expect(await bh01()).toEqual(before)

    const auditsBefore = (await audits()).length
    const done = await owner.post<Reply>(`${base}/imports/${importId}/commit-ags`, { mode: 'update' })
    expect(done.status).toBe(200)
    expect(done.body.holes).toEqual(dry.holes)
    const after = await bh01()
    expect(after.point.finalDepth).toBe(edit.newFinalDepth)
    const expected = before.intervals.map((iv, i) => [iv.top, iv.bottom, i === 1 ? edit.editedDescription : iv.description])
    expected.push([before.intervals.at(-1)!.bottom, edit.newFinalDepth, 'Very dense grey sandy gravel.'])
    expect(after.intervals.map(iv => [iv.top, iv.bottom, iv.description])).toEqual(expected)
    // Unchanged intervals keep their rows; samples keep their ids, their tests stay.
    expect(after.intervals[0]!.id).toBe(before.intervals[0]!.id)
    expect(after.samples).toEqual(before.samples)
    expect(await testCount()).toBe(tests)
    const events = await audits()
    expect(events.length).toBe(auditsBefore + 1)
    expect(events[0]!.after!.mode).toBe('update')
    expect(events[0]!.after!.holes).toEqual({ add: 0, skip: 0, update: dry.holes.length, replace: 0 })
  })

  it('"replace" with the original file makes BH-01 exactly as exported again', async () => {
    const merged = await importAs(edit.text, 'update')
    expect((await owner.post<Reply>(`${base}/imports/${merged.importId}/commit-ags`, { mode: 'update' })).status).toBe(200)
    const before = await bh01()
    const { importId, dry } = await importAs(original, 'replace')
    const hole = dry.holes.find(h => h.identifier === 'BH-01')!
    expect(hole.action).toBe('replace')
    expect([hole.intervals.added, hole.intervals.changed, hole.intervals.removed]).toEqual([0, 1, 1])
    expect(hole.lines.map(l => [l.change, l.label])).toEqual([['changed', edit.editedDescription.replace(' Edited after review.', '')], ['removed', 'Very dense grey sandy gravel.']])
    expect(dry.refusal).toBeNull()
    const done = await owner.post<Reply>(`${base}/imports/${importId}/commit-ags`, { mode: 'replace' })
    expect(done.status).toBe(200)
    const after = await bh01()
    expect(after.point.finalDepth).toBe(edit.newFinalDepth - 2)
    expect(after.intervals.map(iv => [iv.top, iv.bottom, iv.description])).toEqual(before.intervals.slice(0, -1).map((iv, i) => [iv.top, iv.bottom, i === 1 ? edit.editedDescription.replace(' Edited after review.', '') : iv.description]))
    expect(after.samples).toEqual(before.samples)
  })

  it('refuses (409) to replace away a sample that has an oedometer test, and writes nothing', async () => {
    const e = editable(original)
    const cong = e.headings('CONG')
    const firstTest = fields(e.lines[e.rows('CONG', 'BH-01')[0]!]!)
    const ref = firstTest[cong.indexOf('SAMP_REF')]!
    // Every row of that sample goes, in every group keyed by it.
    const drop = new Set<number>()
    for (const group of ['SAMP', 'LNMC', 'LLPL', 'LDEN', 'CONG', 'CONS']) {
      const at = e.headings(group).indexOf('SAMP_REF')
      for (const i of e.rows(group, 'BH-01')) if (fields(e.lines[i]!)[at] === ref) drop.add(i)
    }
    const text = e.lines.filter((_, i) => !drop.has(i)).join('\r\n')
    const before = await bh01()
    const { importId, dry } = await importAs(text, 'replace')
    const hole = dry.holes.find(h => h.identifier === 'BH-01')!
    expect(hole.blockers).toEqual([expect.stringMatching(new RegExp(`^Replacing BH-01 would remove sample ${ref}, which has 1 oedometer test\\.`))])
    expect(dry.refusal).toBe(hole.blockers[0])
    const r = await owner.post<{ message: string }>(`${base}/imports/${importId}/commit-ags`, { mode: 'replace' })
    expect(r.status).toBe(409)
    expect(r.body.message).toBe(hole.blockers[0])
    expect(await bh01()).toEqual(before)
    // Merging the same file removes nothing, so it may go ahead.
    const merge = await owner.post<Reply>(`${base}/imports/${importId}/commit-ags`, { dryRun: true, mode: 'update' })
    expect(merge.body.refusal).toBeNull()
    expect(merge.body.holes.find(h => h.identifier === 'BH-01')!.samples.kept).toBe(1)
  })

  it('reports an interval that overlaps the stored log at its own file line, in plain words, and writes nothing', async () => {
    const e = editable(original)
    const geol = e.headings('GEOL')
    const bh = e.rows('GEOL', 'BH-01')
    const first = fields(e.lines[bh[0]!]!)
    // A new interval from 0.05 m, overlapping the stored first interval.
    const overlap = [...first]
    overlap[geol.indexOf('GEOL_TOP')] = '0.05'
    overlap[geol.indexOf('GEOL_DESC')] = 'Overlapping interval.'
    e.lines.splice(bh[0]! + 1, 0, line(overlap))
    const text = e.text()
    const before = await bh01()
    const up = await upload<{ importId: string }>(owner, `${base}/imports`, 'overlap.ags', text, 'text/plain')
    const r = await owner.post<{ message: string, data: { errors: RowError[], errorCount: number } }>(`${base}/imports/${up.body.importId}/commit-ags`, { mode: 'update' })
    expect(r.status).toBe(422)
    const lines = text.split(/\r\n/)
    const mine = r.body.data.errors.filter(x => x.row === bh[0]! + 2)
    expect(mine.length).toBeGreaterThan(0)
    expect(lines[mine[0]!.row - 1]).toContain('"Overlapping interval."')
    expect(mine[0]!.column).toBe('GEOL')
    expect(mine[0]!.message).toMatch(/^BH-01 0\.05–/)
    expect(r.body.data.errors.every(x => x.row > 0 && !/^Rule/.test(x.message))).toBe(true)
    expect(r.body.data.errorCount).toBe(r.body.data.errors.length)
    expect(r.body.message).toMatch(new RegExp(`^${r.body.data.errorCount} problem\\(s\\) in overlap\\.ags; nothing was imported\\. First: line \\d+, GEOL: BH-01`))
    expect(await bh01()).toEqual(before)
  })

  it('an interval table (CSV) says whose log it replaces, with how many intervals, before it is committed', async () => {
    const csv = 'point,top,bottom,description\nBH-01,0,1.2,Fill\nBH-01,1.2,5,Clay\n'
    const up = await upload<{ importId: string }>(owner, `${base}/imports`, 'bh01.csv', csv)
    const mapping = { point: 'point', top: 'top', bottom: 'bottom', description: 'description' }
    const dry = await owner.post<{ replaces: { point: string, before: number, after: number }[] }>(`${base}/imports/${up.body.importId}/commit`, { target: 'intervals', mapping, dryRun: true })
    expect(dry.status).toBe(200)
    expect(dry.body.replaces).toEqual([{ point: 'BH-01', before: (await bh01()).intervals.length, after: 2 }])
  })
})
