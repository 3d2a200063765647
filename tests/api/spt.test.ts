// SPT results over real HTTP: blows written as counted on the log (seating / test drive, increments
// stopped short), stored per increment; unreadable blows refused with the reason; and the demo's holes
// with a refusal added travel through an AGS4 file into another project with the same values.
import { describe, expect, it } from 'vitest'
import { parseAgs } from '../../shared/ags4/parse'
import { type Client, demoEmail, demoProjectId, signedInDemo, signIn } from '../helpers/http'
import { createPoint, createProject } from '../helpers/project'
import { upload } from '../helpers/upload'

interface Spt { id: string, depth: number, blows: number[], penetrations: number[] | null, seating: number | null, n: number, penetration: number | null, version: number }
interface PointRow { id: string, identifier: string }

describe('SPT results', () => {
  const { owner, geologist } = signedInDemo('owner', 'geologist')

  it('takes blows as written, stores the increments, and refuses unreadable blows with the reason', async () => {
    const project = await createProject(owner, 'SPT', 'Saltmarsh Lane SPT entry', ['geologist'])
    const pointId = await createPoint(geologist, project.id, { identifier: 'BH-S1', finalDepth: 20 })
    const base = `${project.base}/points/${pointId}/spt`

    // 75 mm increments: N = 4 + 5 + 6 + 7 = 22.
    const full = await geologist.post<{ row: Spt }>(base, { depth: 9, blows: '2 3 / 4 5 6 7' })
    expect(full.status).toBe(201)
    expect(full.body.row).toMatchObject({ depth: 9, blows: [2, 3, 4, 5, 6, 7], penetrations: [75, 75, 75, 75, 75, 75], seating: 2, n: 22, penetration: null })
    // A refusal: seating 25 blows for 75 mm, then 50 blows for 40 mm of the test drive; no N.
    const refusal = await geologist.post<{ row: Spt }>(base, { depth: 12, blows: '25/75 50/40' })
    expect(refusal.status).toBe(201)
    expect(refusal.body.row).toMatchObject({ blows: [25, 50], penetrations: [75, 40], seating: 1, n: 50, penetration: 40 })
    // The test drive's result alone.
    const alone = await geologist.post<{ row: Spt }>(base, { depth: 15, blows: '50/100mm' })
    expect(alone.body.row).toMatchObject({ blows: [50], penetrations: [100], seating: 0, n: 50, penetration: 100 })
    // Three counts per 150 mm, as before: N = 14 + 17 = 31.
    const coarse = await geologist.post<{ row: Spt }>(base, { depth: 16, blows: [6, 14, 17] })
    expect(coarse.body.row).toMatchObject({ blows: [6, 14, 17], penetrations: [150, 150, 150], seating: 1, n: 31, penetration: null })

    const bad = await geologist.post<{ message: string, data: { issues: { path: string, message: string }[] } }>(base, { depth: 10, blows: '2 3 / 4 5 6' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues).toEqual([{ path: 'blows', message: 'The test drive has 3 counts: give one count (300 mm), two (150 mm each) or four (75 mm each), or write the last as blows/mm if it stopped short.' }])
    expect(bad.body.message).toContain('The test drive has 3 counts')
    const words = await geologist.post<{ data: { issues: { message: string }[] } }>(base, { depth: 10, blows: 'refused' })
    expect(words.status).toBe(400)
    expect(words.body.data.issues[0]!.message).toBe('“refused” is not a blow count: write whole numbers such as 4, or blows/mm such as 50/100mm.')

    // An edit: the refusal re-counted as a full drive, N = 12 + 13 + 15 + 16 = 56.
    const edited = await geologist.request<{ row: Spt }>('PATCH', `${base}/${refusal.body.row.id}`, { depth: 12, blows: '10 15 / 12 13 15 16', version: refusal.body.row.version })
    expect(edited.status).toBe(200)
    expect(edited.body.row).toMatchObject({ n: 56, penetration: null, seating: 2 })
    const badEdit = await geologist.request('PATCH', `${base}/${refusal.body.row.id}`, { depth: 12, blows: '10 15 / 12 13 15 16 N=50', version: edited.body.row.version })
    expect(badEdit.status).toBe(400)

    const point = await geologist.get<{ spt: Spt[] }>(`${project.base}/points/${pointId}`)
    expect(point.body.spt.map(s => [s.depth, s.n, s.penetration])).toEqual([[9, 22, null], [12, 56, null], [15, 50, 100], [16, 31, null]])
  })

  it('round-trips the demo\'s holes with a refusal added through AGS4 (ISPT standard fields) into another project', async () => {
    const admin = await signIn(demoEmail('owner'))
    const demo = await demoProjectId(admin)
    const agsOf = async (c: Client, projectId: string) => {
      const res = await fetch(`${c.base}/exports/${projectId}/logs.ags`, { headers: { cookie: c.cookie } })
      expect(res.status).toBe(200)
      return res.text()
    }
    const importInto = async (text: string, name: string) => {
      const p = await admin.post<{ project: { id: string } }>('/api/projects', { jobNumber: `SPT-${Date.now().toString(36)}-${name.length}`, name })
      const base = `/api/projects/${p.body.project.id}`
      const up = await upload<{ importId: string, ags: { errors: unknown[] } }>(admin, `${base}/imports`, 'spt.ags', text, 'text/plain')
      expect(up.status).toBe(201)
      expect(up.body.ags.errors).toEqual([])
      const done = await admin.post(`${base}/imports/${up.body.importId}/commit-ags`, {})
      expect(done.status, JSON.stringify(done.body).slice(0, 500)).toBe(200)
      return p.body.project.id
    }
    const sptOf = async (projectId: string) => {
      const points = (await admin.get<{ points: PointRow[] }>(`/api/projects/${projectId}/points?limit=500`)).body.points
      const out: Record<string, unknown[]> = {}
      for (const p of points) {
        const spt = (await admin.get<{ spt: Spt[] }>(`/api/projects/${projectId}/points/${p.id}`)).body.spt
        if (spt.length) out[p.identifier] = spt.map(s => [s.depth, s.blows, s.penetrations, s.seating, s.n, s.penetration])
      }
      return out
    }

    // The demo's holes in a project of their own, with a refusal added to BH-01.
    const first = await importInto(await agsOf(admin, demo), 'SPT round trip, first')
    const bh = (await admin.get<{ points: PointRow[] }>(`/api/projects/${first}/points?limit=500`)).body.points.find(p => p.identifier === 'BH-01')!
    const added = await admin.post<{ row: Spt }>(`/api/projects/${first}/points/${bh.id}/spt`, { depth: 0.5, blows: '8 12 / 14 18 18/45mm' })
    expect(added.status).toBe(201)
    const before = await sptOf(first)
    expect(Object.keys(before).length).toBeGreaterThanOrEqual(3)

    const text = await agsOf(admin, first)
    const ispt = parseAgs(text).groups.find(g => g.name === 'ISPT')!
    const row = ispt.rows.map(r => r.values).find(v => v.LOCA_ID === 'BH-01' && v.ISPT_TOP === '0.50')
    // Seating 8 + 12 = 20; test 14 + 18 + 18 = 50 blows for 75 + 75 + 45 = 195 mm; 150 + 195 = 345 mm in all.
    expect(row).toMatchObject({ ISPT_SEAT: '20', ISPT_MAIN: '50', ISPT_NPEN: '345', ISPT_NVAL: '', ISPT_REP: '8 12 / 14 18 18/45mm', ISPT_INC5: '18', ISPT_PEN5: '45' })
    expect(ispt.headings.some(h => h === 'ISPT_TST1' || h === 'ISPT_TST2')).toBe(false)

    const second = await importInto(text, 'SPT round trip, second')
    expect(await sptOf(second)).toEqual(before)
  })
})
