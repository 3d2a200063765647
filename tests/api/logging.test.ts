// Logging API over real HTTP: points, the whole-log save with its interval rules,
// optimistic concurrency (409 with the current rows), samples, index tests, SPT,
// groundwater, CPT, strata, and the audit trail.
import { beforeEach, describe, expect, it } from 'vitest'
import { createUser, demoEmail, signIn, signedInDemo, useNewAccount } from '../helpers/http'
import { createPoint, useTestProject } from '../helpers/project'

interface Interval { id: string, version: number, top: number, bottom: number, description: string, uscs: string | null }

describe('logging API', () => {
  const { owner, geologist } = signedInDemo('owner', 'geologist')
  const viewerAccount = useNewAccount(owner, 'logviewer')
  const viewer = viewerAccount.client
  // Every test works in a project of its own, with the geologist and a viewer as members and borehole BH-01 (10 m, no log yet).
  const project = useTestProject(owner, 'LOG', 'Logging test site', () => ['geologist', { email: viewerAccount.email, role: 'viewer' }], { each: true })
  let projectId: string
  let pointId: string
  let base: string

  beforeEach(async () => {
    projectId = project.id
    pointId = await createPoint(geologist, projectId, {
      identifier: 'BH-01', easting: 40, northing: 25, groundElevation: 2.6, finalDepth: 10, startedOn: '2025-03-03', endedOn: '2025-03-04', method: 'Cable percussion', loggedBy: 'A. Ferreira',
    })
    base = `/api/projects/${projectId}/points/${pointId}`
  })

  /** BH-01's log: three intervals down to its final depth, with a gap at 3.4–4 m. */
  async function seedLog() {
    const r = await geologist.request('PUT', `${base}/intervals`, {
      intervals: [
        { top: 0, bottom: 1.2, description: 'Dense grey sandy GRAVEL (MADE GROUND)', uscs: 'GW' },
        { top: 1.2, bottom: 3.4, description: 'Stiff brown silty CLAY, desiccated', uscs: 'CL' },
        { top: 4, bottom: 10, description: 'Very soft grey CLAY with shells', uscs: 'CH' },
      ],
    })
    expect(r.status).toBe(200)
  }

  it('refuses a duplicate identifier in the project (409) and bad dates (400)', async () => {
    const dup = await geologist.post(`/api/projects/${projectId}/points`, { identifier: 'BH-01', kind: 'borehole', easting: 0, northing: 0, groundElevation: 0, finalDepth: 5 })
    expect(dup.status).toBe(409)
    const dates = await geologist.post<{ data: { issues: { path: string }[] } }>(`/api/projects/${projectId}/points`, { identifier: 'BH-09', kind: 'borehole', easting: 0, northing: 0, groundElevation: 0, finalDepth: 5, startedOn: '2025-03-05', endedOn: '2025-03-01' })
    expect(dates.status).toBe(400)
    expect(dates.body.data.issues[0]!.path).toBe('endedOn')
  })

  it('saves a whole log, reports gaps, and refuses overlaps and depths beyond the hole with row issues', async () => {
    const save = await geologist.request<{ intervals: Interval[], gaps: { top: number, bottom: number }[] }>('PUT', `${base}/intervals`, {
      intervals: [
        { top: 0, bottom: 1.2, description: 'Dense grey sandy GRAVEL (MADE GROUND)', uscs: 'GW' },
        { top: 1.2, bottom: 3.4, description: 'Stiff brown silty CLAY, desiccated', uscs: 'CL' },
        { top: 4, bottom: 10, description: 'Very soft grey CLAY with shells', uscs: 'CH' },
      ],
    })
    expect(save.status).toBe(200)
    expect(save.body.intervals.map(i => [i.top, i.bottom])).toEqual([[0, 1.2], [1.2, 3.4], [4, 10]])
    expect(save.body.gaps).toEqual([{ top: 3.4, bottom: 4 }])

    const overlap = await geologist.request<{ data: { issues: { index: number, field: string }[] } }>('PUT', `${base}/intervals`, {
      intervals: [{ top: 0, bottom: 2 }, { top: 1.5, bottom: 3 }, { top: 3, bottom: 11 }],
    })
    expect(overlap.status).toBe(422)
    expect(overlap.body.data.issues.map(i => [i.index, i.field])).toEqual([[1, 'top'], [2, 'bottom']])
    // Nothing was written.
    const after = await geologist.get<{ intervals: Interval[] }>(base)
    expect(after.body.intervals).toHaveLength(3)

    const badSymbol = await geologist.request('PUT', `${base}/intervals`, { intervals: [{ top: 0, bottom: 1, uscs: 'XX' }] })
    expect(badSymbol.status).toBe(400)
  })

  it('answers 409 with the current log when the rows changed since they were read', async () => {
    await seedLog()
    const read = await geologist.get<{ intervals: Interval[] }>(base)
    const rows = read.body.intervals
    // Someone else edits row 2 first.
    const other = await signIn(demoEmail('owner'))
    const first = await other.request<{ intervals: Interval[] }>('PUT', `${base}/intervals`, {
      intervals: rows.map(r => (r.top === 1.2 ? { ...r, description: 'Firm to stiff brown mottled CLAY' } : r)),
    })
    expect(first.status).toBe(200)
    const stale = await geologist.request<{ data: { current: Interval[] } }>('PUT', `${base}/intervals`, {
      intervals: rows.map(r => (r.top === 1.2 ? { ...r, description: 'my edit' } : r)),
    })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current.find(r => r.top === 1.2)!.description).toBe('Firm to stiff brown mottled CLAY')
  })

  it('versions a point: a stale PATCH is 409 with the current row; a shallower final depth must still hold the log', async () => {
    await seedLog()
    const { body } = await geologist.get<{ point: { version: number } }>(base)
    const ok = await geologist.patch<{ point: { version: number, remarks: string } }>(base, { remarks: 'Water strike at 1.6 m', version: body.point.version })
    expect(ok.status).toBe(200)
    expect(ok.body.point.version).toBe(body.point.version + 1)
    const stale = await geologist.patch<{ data: { current: { remarks: string } } }>(base, { remarks: 'older edit', version: body.point.version })
    expect(stale.status).toBe(409)
    expect(stale.body.data.current.remarks).toBe('Water strike at 1.6 m')
    const shallow = await geologist.patch(base, { finalDepth: 8, version: ok.body.point.version })
    expect(shallow.status).toBe(422)
  })

  it('adds samples with index tests, SPT with N, groundwater, and refuses depths below the hole', async () => {
    const s = await geologist.post<{ sample: { id: string } }>(`${base}/samples`, { identifier: 'U1', top: 4.5, bottom: 4.95, type: 'thin-walled-tube', recovery: 95 })
    expect(s.status).toBe(201)
    const it1 = await geologist.request<{ indexTest: { version: number, liquidLimit: number } }>('PUT', `${base}/samples/${s.body.sample.id}/index-test`, { waterContent: 78, liquidLimit: 82, plasticLimit: 31, bulkUnitWeight: 15.8 })
    expect(it1.status).toBe(200)
    const again = await geologist.request('PUT', `${base}/samples/${s.body.sample.id}/index-test`, { liquidLimit: 80 })
    expect(again.status).toBe(409)
    const it2 = await geologist.request<{ indexTest: { liquidLimit: number } }>('PUT', `${base}/samples/${s.body.sample.id}/index-test`, { liquidLimit: 80, plasticLimit: 30, version: it1.body.indexTest.version })
    expect(it2.body.indexTest.liquidLimit).toBe(80)
    const badPl = await geologist.request('PUT', `${base}/samples/${s.body.sample.id}/index-test`, { liquidLimit: 40, plasticLimit: 50, version: 2 })
    expect(badPl.status).toBe(400)

    const deep = await geologist.post(`${base}/samples`, { identifier: 'U9', top: 9.8, bottom: 10.4, type: 'thin-walled-tube' })
    expect(deep.status).toBe(422)

    const spt = await geologist.post<{ row: { n: number } }>(`${base}/spt`, { depth: 8, blows: [3, 5, 7] })
    expect(spt.status).toBe(201)
    expect(spt.body.row.n).toBe(12)

    const gw = await geologist.post<{ row: { id: string, version: number } }>(`${base}/groundwater`, { kind: 'strike', observedAt: '2025-03-03T10:20:00+00:00', depth: 1.6, remarks: 'rose to 1.5 m in 20 min' })
    expect(gw.status).toBe(201)
    const noValue = await geologist.post(`${base}/groundwater`, { kind: 'standing', observedAt: '2025-03-04T08:00:00Z' })
    expect(noValue.status).toBe(400)

    const detail = await viewer.get<{ samples: { identifier: string, index: { liquidLimit: number } | null }[], spt: unknown[], groundwater: unknown[] }>(base)
    expect(detail.status).toBe(200)
    expect(detail.body.samples[0]!.index!.liquidLimit).toBe(80)
    expect(detail.body.spt).toHaveLength(1)
    expect(detail.body.groundwater).toHaveLength(1)
  })

  it('stores and reads back a CPT sounding whole', async () => {
    const cpt = await geologist.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, { identifier: 'CPT-01', kind: 'cpt', easting: 60, northing: 30, groundElevation: 2.4, finalDepth: 22 })
    const url = `/api/projects/${projectId}/points/${cpt.body.point.id}/cpt`
    const n = 1000
    const depth = Array.from({ length: n }, (_, i) => 0.02 * (i + 1))
    const put = await geologist.request('PUT', url, { areaRatio: 0.8, depth, qc: depth.map(z => 300 + 20 * z), fs: depth.map(() => 10), u2: depth.map(z => 9.81 * z) })
    expect(put.status).toBe(200)
    const got = await viewer.get<{ count: number, depth: number[], qc: number[], areaRatio: number }>(url)
    expect(got.body.count).toBe(n)
    expect(got.body.depth[999]).toBeCloseTo(20, 9)
    expect(got.body.qc[499]).toBeCloseTo(300 + 20 * 10, 9)
    expect(got.body.areaRatio).toBe(0.8)
    const unordered = await geologist.request('PUT', url, { areaRatio: 0.8, depth: [1, 0.5], qc: [1, 1], fs: [1, 1], u2: [1, 1] })
    expect(unordered.status).toBe(422)
    const ragged = await geologist.request('PUT', url, { areaRatio: 0.8, depth: [1, 2], qc: [1], fs: [1, 1], u2: [1, 1] })
    expect(ragged.status).toBe(400)
  })

  it('manages strata and links intervals to them; another project\'s stratum is refused', async () => {
    await seedLog()
    const st = await geologist.post<{ stratum: { id: string, version: number } }>(`/api/projects/${projectId}/strata`, { code: 'EST', name: 'Estuarine clay', colour: 'clay-grey', pattern: 'clay', unitWeight: 16, unitWeightSaturated: 16, displayOrder: 2 })
    expect(st.status).toBe(201)
    expect((await geologist.post(`/api/projects/${projectId}/strata`, { code: 'EST', name: 'Copy', colour: 'x', pattern: 'y', unitWeight: 16, unitWeightSaturated: 16 })).status).toBe(409)
    const read = await geologist.get<{ intervals: Interval[] }>(base)
    const linked = await geologist.request<{ intervals: (Interval & { stratumId: string | null })[] }>('PUT', `${base}/intervals`, {
      intervals: read.body.intervals.map(r => (r.top === 4 ? { ...r, stratumId: st.body.stratum.id } : r)),
    })
    expect(linked.status).toBe(200)
    expect(linked.body.intervals.find(r => r.top === 4)!.stratumId).toBe(st.body.stratum.id)
    const stale = await geologist.patch(`/api/projects/${projectId}/strata/${st.body.stratum.id}`, { name: 'Soft estuarine clay', version: st.body.stratum.version + 5 })
    expect(stale.status).toBe(409)

    const demo = await signIn(demoEmail('owner'))
    const other = await demo.post<{ project: { id: string } }>('/api/projects', { jobNumber: `OTH-${Date.now().toString(36)}`, name: 'Other site' })
    const foreign = await demo.post<{ stratum: { id: string } }>(`/api/projects/${other.body.project.id}/strata`, { code: 'X', name: 'X', colour: 'x', pattern: 'x', unitWeight: 18, unitWeightSaturated: 19 })
    const again = await geologist.get<{ intervals: Interval[] }>(base)
    const cross = await owner.request('PUT', `${base}/intervals`, { intervals: again.body.intervals.map(r => ({ ...r, stratumId: foreign.body.stratum.id })) })
    expect(cross.status).toBe(422)
  })

  describe('editing a second hole', () => {
    let url: string
    let version: number
    // After the outer beforeEach: WS-02 in the test's own project.
    beforeEach(async () => {
      const pt = await geologist.post<{ point: { id: string, version: number } }>(`/api/projects/${projectId}/points`, { identifier: 'WS-02', kind: 'borehole', easting: 80, northing: 25, groundElevation: 2.2, finalDepth: 12 })
      expect(pt.status).toBe(201)
      url = `/api/projects/${projectId}/points/${pt.body.point.id}`
      version = pt.body.point.version
    })

    it('edits a vane reading: values read back, a stale version is 409 with the current row, bad input is 400, other callers are refused', async () => {
      const made = await geologist.post<{ row: { id: string, version: number } }>(`${url}/vane`, { depth: 6, peak: 24, remoulded: 8 })
      expect(made.status).toBe(201)
      const rowUrl = `${url}/vane/${made.body.row.id}`

      const edited = await geologist.patch<{ row: { depth: number, peak: number, remoulded: number | null, version: number } }>(rowUrl, { depth: 6.5, peak: 27.5, remoulded: null, version: made.body.row.version })
      expect(edited.status).toBe(200)
      expect(edited.body.row).toMatchObject({ depth: 6.5, peak: 27.5, remoulded: null, version: made.body.row.version + 1 })
      const read = await viewer.get<{ vane: { id: string, depth: number, peak: number, remoulded: number | null }[] }>(url)
      expect(read.body.vane).toEqual([expect.objectContaining({ id: made.body.row.id, depth: 6.5, peak: 27.5, remoulded: null })])

      const stale = await owner.patch<{ message: string, data: { current: { peak: number, version: number } } }>(rowUrl, { depth: 6, peak: 20, remoulded: 5, version: made.body.row.version })
      expect(stale.status).toBe(409)
      expect(stale.body.data.current).toMatchObject({ peak: 27.5, version: made.body.row.version + 1 })

      const bad = await geologist.patch<{ data: { issues: { path: string, message: string }[] } }>(rowUrl, { depth: -1, peak: 0, version: edited.body.row.version })
      expect(bad.status).toBe(400)
      expect(bad.body.data.issues.map(i => i.path).sort()).toEqual(['depth', 'peak'])
      const deep = await geologist.patch(rowUrl, { depth: 12.5, peak: 20, version: edited.body.row.version })
      expect(deep.status).toBe(422)

      expect((await viewer.patch(rowUrl, { depth: 6, peak: 20, version: edited.body.row.version })).status).toBe(403)
      const outsider = await createUser(owner, 'vaneoutsider')
      expect((await outsider.client.patch(rowUrl, { depth: 6, peak: 20, version: edited.body.row.version })).status).toBe(404)
      // The reading belongs to WS-02: reached through BH-01 it does not exist.
      expect((await geologist.patch(`${base}/vane/${made.body.row.id}`, { depth: 6, peak: 20, version: edited.body.row.version })).status).toBe(404)

      const after = await viewer.get<{ vane: { peak: number, version: number }[] }>(url)
      expect(after.body.vane).toEqual([expect.objectContaining({ peak: 27.5, version: made.body.row.version + 1 })])
    })

    it('edits a sample; an identifier used at the point is 409 on its field', async () => {
      const u1 = await geologist.post<{ sample: { id: string } }>(`${url}/samples`, { identifier: 'U1', top: 3, bottom: 3.45, type: 'thin-walled-tube' })
      const u2 = await geologist.post<{ sample: { id: string, version: number } }>(`${url}/samples`, { identifier: 'U2', top: 5, bottom: 5.45, type: 'piston' })
      expect([u1.status, u2.status]).toEqual([201, 201])
      const sampleUrl = `${url}/samples/${u2.body.sample.id}`
      const moved = await geologist.patch<{ sample: { top: number, bottom: number, recovery: number, version: number } }>(sampleUrl, { top: 5.5, bottom: 6.1, recovery: 88, version: u2.body.sample.version })
      expect(moved.status).toBe(200)
      expect(moved.body.sample).toMatchObject({ top: 5.5, bottom: 6.1, recovery: 88 })
      const dup = await geologist.patch<{ message: string, data: { issues: { path: string }[], current?: unknown } }>(sampleUrl, { identifier: 'U1', version: moved.body.sample.version })
      expect(dup.status).toBe(409)
      expect(dup.body.message).toBe('Sample U1 already exists at this point.')
      expect(dup.body.data.issues.map(i => i.path)).toEqual(['identifier'])
      expect(dup.body.data.current).toBeUndefined()
      const stale = await geologist.patch<{ data: { current: { top: number } } }>(sampleUrl, { top: 5, version: u2.body.sample.version })
      expect(stale.status).toBe(409)
      expect(stale.body.data.current.top).toBe(5.5)
    })

    it('refuses a final depth above what is logged, naming the deepest thing, and a used identifier on its field', async () => {
      // Logged so far at WS-02: a vane reading at 6.5 m and a sample down to 6.1 m.
      const spt = await geologist.post(`${url}/spt`, { depth: 9.5, blows: [2, 3, 3] })
      expect(spt.status).toBe(201)
      const shallow = await geologist.patch<{ message: string, data: { issues: { path: string, message: string }[] } }>(url, { finalDepth: 9, version })
      expect(shallow.status).toBe(422)
      expect(shallow.body.message).toBe('The final depth (9 m) is above the deepest SPT (9.5 m).')
      expect(shallow.body.data.issues).toEqual([{ path: 'finalDepth', message: 'must be at least 9.5 m: the deepest SPT is at 9.5 m.' }])

      const dup = await geologist.patch<{ data: { issues: { path: string }[] } }>(url, { identifier: 'BH-01', version })
      expect(dup.status).toBe(409)
      expect(dup.body.data.issues.map(i => i.path)).toEqual(['identifier'])

      const okay = await geologist.patch<{ point: { finalDepth: number, groundElevation: number, method: string } }>(url, { finalDepth: 9.5, groundElevation: 2.35, method: 'Rotary open hole', version })
      expect(okay.status).toBe(200)
      const read = await viewer.get<{ point: { identifier: string, finalDepth: number, groundElevation: number, method: string } }>(url)
      expect(read.body.point).toMatchObject({ identifier: 'WS-02', finalDepth: 9.5, groundElevation: 2.35, method: 'Rotary open hole' })
    })
  })

  it('lets a viewer read but not write, and audits every write', async () => {
    // One write of each kind, then the audit trail must name every one.
    await seedLog()
    const s = await geologist.post<{ sample: { id: string } }>(`${base}/samples`, { identifier: 'U1', top: 4.5, bottom: 4.95, type: 'thin-walled-tube' })
    expect(s.status).toBe(201)
    expect((await geologist.request('PUT', `${base}/samples/${s.body.sample.id}/index-test`, { liquidLimit: 82, plasticLimit: 31 })).status).toBe(200)
    expect((await geologist.post(`${base}/spt`, { depth: 8, blows: [3, 5, 7] })).status).toBe(201)
    expect((await geologist.post(`${base}/groundwater`, { kind: 'strike', observedAt: '2025-03-03T10:20:00+00:00', depth: 1.6 })).status).toBe(201)
    expect((await geologist.post(`${base}/vane`, { depth: 6, peak: 24 })).status).toBe(201)
    const cpt = await geologist.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, { identifier: 'CPT-01', kind: 'cpt', easting: 60, northing: 30, groundElevation: 2.4, finalDepth: 22 })
    expect(cpt.status).toBe(201)
    expect((await geologist.request('PUT', `/api/projects/${projectId}/points/${cpt.body.point.id}/cpt`, { areaRatio: 0.8, depth: [0.02, 0.04], qc: [300, 310], fs: [5, 5], u2: [1, 2] })).status).toBe(200)
    expect((await geologist.post(`/api/projects/${projectId}/strata`, { code: 'EST', name: 'Estuarine clay', colour: 'clay-grey', pattern: 'clay', unitWeight: 16, unitWeightSaturated: 16 })).status).toBe(201)
    expect((await viewer.post(`/api/projects/${projectId}/points`, { identifier: 'BH-99', kind: 'borehole', easting: 0, northing: 0, groundElevation: 0, finalDepth: 5 })).status).toBe(403)
    const list = await viewer.get<{ points: { identifier: string }[], total: number }>(`/api/projects/${projectId}/points?q=bh`)
    expect(list.body.points.map(p => p.identifier)).toEqual(['BH-01'])
    expect(list.body.total).toBe(1)
    const kinds = await viewer.get<{ points: { identifier: string }[] }>(`/api/projects/${projectId}/points?kind=cpt`)
    expect(kinds.body.points.map(p => p.identifier)).toEqual(['CPT-01'])
    const audit = await viewer.get<{ events: { entity: string }[] }>(`/api/projects/${projectId}/audit?limit=100`)
    const entities = new Set(audit.body.events.map(e => e.entity))
    for (const e of ['point', 'log', 'sample', 'index-test', 'spt', 'groundwater', 'vane', 'cpt', 'stratum']) expect(entities).toContain(e)
  })
})
