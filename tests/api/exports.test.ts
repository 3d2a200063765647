import * as XLSX from 'xlsx-republish'
import { describe, expect, it } from 'vitest'
import { Client, demoEmail, signIn } from '../helpers/http'

describe('GET /exports/:projectId/logs.xlsx', () => {
  it('exports every logging table as its own sheet with the data written through the API', async () => {
    const owner = await signIn(demoEmail('owner'))
    const p = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `EXP-${Date.now().toString(36)}`, name: 'Export site' })
    const base = `/api/projects/${p.body.project.id}`
    const pt = await owner.post<{ point: { id: string } }>(`${base}/points`, { identifier: 'BH-01', kind: 'borehole', easting: 5, northing: 6, groundElevation: 2.5, finalDepth: 12 })
    await owner.request('PUT', `${base}/points/${pt.body.point.id}/intervals`, { intervals: [{ top: 0, bottom: 1.2, description: 'Fill', uscs: 'GW' }, { top: 1.2, bottom: 12, description: 'Soft CLAY', uscs: 'CH' }] })
    const s = await owner.post<{ sample: { id: string } }>(`${base}/points/${pt.body.point.id}/samples`, { identifier: 'U1', top: 3, bottom: 3.45, type: 'thin-walled-tube' })
    await owner.request('PUT', `${base}/points/${pt.body.point.id}/samples/${s.body.sample.id}/index-test`, { liquidLimit: 70, plasticLimit: 28 })

    const res = await fetch(`${owner.base}/exports/${p.body.project.id}/logs.xlsx`, { headers: { cookie: owner.cookie } })
    expect(res.status).toBe(200)
    expect(res.headers.get('content-disposition')).toMatch(/EXP-.*-logs\.xlsx/)
    const wb = XLSX.read(Buffer.from(await res.arrayBuffer()), { type: 'buffer' })
    expect(wb.SheetNames).toEqual(['About', 'Strata', 'Points', 'Intervals', 'Samples', 'Index tests', 'SPT', 'Groundwater', 'Vane', 'CPT'])
    const rows = (name: string) => XLSX.utils.sheet_to_json<unknown[]>(wb.Sheets[name]!, { header: 1 })
    expect(rows('Intervals').slice(1)).toEqual([['BH-01', 0, 1.2, 'Fill', 'GW'], ['BH-01', 1.2, 12, 'Soft CLAY', 'CH']])
    expect(rows('Index tests')[1]).toEqual(['BH-01', 'U1', undefined, 70, 28, 42])
    expect(String(rows('About')[4]![1])).toMatch(/licensed engineer/)
  })

  it('answers 404 to a non-member and 401 when signed out', async () => {
    const owner = await signIn(demoEmail('owner'))
    const p = await owner.post<{ project: { id: string } }>('/api/projects', { jobNumber: `EXQ-${Date.now().toString(36)}`, name: 'Private site' })
    const eng = await signIn(demoEmail('engineer'))
    expect((await eng.get(`/exports/${p.body.project.id}/logs.xlsx`)).status).toBe(404)
    expect((await new Client().get(`/exports/${p.body.project.id}/logs.xlsx`)).status).toBe(401)
  })
})
