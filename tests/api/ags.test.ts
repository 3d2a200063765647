// AGS4 through the server: export the demo project, import it into a new
// project and get the same data back; the example file with deliberate logging
// errors is refused with its GEOL lines and writes nothing.
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { demoImportAgs } from '../../shared/demo/import-examples'
import { demoEmail, demoProjectId, signIn } from '../helpers/http'
import { upload } from '../helpers/upload'

interface PointRow { id: string, identifier: string, kind: string, finalDepth: number, cptCount: number }

describe('AGS4 export and import', () => {
  it('round-trips the demo investigation through an AGS4 file into another project', async () => {
    const owner = await signIn(demoEmail('owner'))
    const demo = await demoProjectId(owner)
    const res = await fetch(`${owner.base}/exports/${demo}/logs.ags`, { headers: { cookie: owner.cookie } })
    expect(res.status).toBe(200)
    const text = await res.text()
    expect(text.startsWith('"GROUP","PROJ"')).toBe(true)
    expect(text).toContain('"GROUP","SCPT"')

    const p = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `AGS-${Date.now().toString(36)}`, name: 'AGS round trip' })
    const base = `/api/projects/${p.body.project.id}`
    const up = await upload<{ importId: string, format: string, ags: { errors: unknown[], summary: { points: number }, unknownGroups: string[] } }>(owner, `${base}/imports`, 'demo.ags', text, 'text/plain')
    expect(up.status).toBe(201)
    expect(up.body.format).toBe('ags4')
    expect(up.body.ags.errors).toEqual([])
    const done = await owner.post<{ summary: { points: number, intervals: number, cptRows: number } }>(`${base}/imports/${up.body.importId}/commit-ags`, {})
    expect(done.status, JSON.stringify(done.body).slice(0, 500)).toBe(200)

    const a = await owner.get<{ points: PointRow[] }>(`/api/projects/${demo}/points?limit=500`)
    const b = await owner.get<{ points: PointRow[] }>(`${base}/points?limit=500`)
    const key = (r: PointRow) => [r.identifier, r.kind, r.finalDepth, r.cptCount]
    expect(b.body.points.map(key)).toEqual(a.body.points.map(key))
    const one = async (projectId: string, rows: PointRow[]) => {
      const bh = rows.find(r => r.identifier === 'BH-03')!
      return (await owner.get<{ intervals: { top: number, bottom: number, uscs: string, description: string }[], samples: { identifier: string, top: number, index: { liquidLimit: number | null } | null }[] }>(`/api/projects/${projectId}/points/${bh.id}`)).body
    }
    const da = await one(demo, a.body.points)
    const db = await one(p.body.project.id, b.body.points)
    expect(db.intervals.map(i => [i.top, i.bottom, i.uscs, i.description])).toEqual(da.intervals.map(i => [i.top, i.bottom, i.uscs, i.description]))
    expect(db.samples.map(s => [s.identifier, s.top, s.index?.liquidLimit ?? null])).toEqual(da.samples.map(s => [s.identifier, s.top, s.index?.liquidLimit ?? null]))
    // Oedometer tests travel in CONG/CONS and come back with their stages.
    const tests = async (projectId: string) => (await owner.get<{ tests: { sample: { identifier: string }, point: { identifier: string }, e0: number, stageCount: number }[] }>(`/api/projects/${projectId}/tests/oedometer?limit=100`)).body.tests
      .map(t => [t.point.identifier, t.sample.identifier, t.e0, t.stageCount]).sort()
    const ta = await tests(demo)
    expect(ta.length).toBe(14)
    expect(await tests(p.body.project.id)).toEqual(ta)
  })

  it('refuses the example file with the deliberate logging errors at their GEOL lines, and writes nothing', async () => {
    const text = readFileSync(resolve(import.meta.dirname, '../../docs/examples/saltmarsh-lane-with-errors.ags'), 'utf8')
    // The shipped example is the generator's output, byte for byte.
    expect(text).toBe(demoImportAgs())
    const lines = text.split(/\r?\n/)
    const owner = await signIn(demoEmail('owner'))
    const p = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `AGE-${Date.now().toString(36)}`, name: 'AGS errors' })
    const base = `/api/projects/${p.body.project.id}`
    const up = await upload<{ importId: string, ags: { errorCount: number } }>(owner, `${base}/imports`, 'errors.ags', text, 'text/plain')
    const r = await owner.post<{ data: { errors: { row: number, column: string, message: string }[], errorCount: number } }>(`${base}/imports/${up.body.importId}/commit-ags`, {})
    expect(r.status).toBe(422)
    const errs = r.body.data.errors
    // The upload's summary and the check count the same problems, each named in plain words at its line.
    expect(r.body.data.errorCount).toBe(up.body.ags.errorCount)
    expect(errs.every(e => e.row > 0 && !e.message.startsWith('Rule'))).toBe(true)
    expect(errs.map(e => e.column)).toEqual(['GEOL', 'GEOL'])
    expect(errs[0]!.message).toMatch(/BH-01 2\.25–3\.35 m: Overlaps/)
    expect(errs[1]!.message).toMatch(/BH-02 .*below the hole's final depth/)
    // The reported lines are the offending GEOL DATA rows of the file.
    expect(lines[errs[0]!.row - 1]).toMatch(/^"DATA","BH-01","2\.25"/)
    expect(lines[errs[1]!.row - 1]).toMatch(/^"DATA","BH-02",.*"27\.00"/)
    const pts = await owner.get<{ points: unknown[] }>(`${base}/points`)
    expect(pts.body.points).toEqual([])
  })
})
