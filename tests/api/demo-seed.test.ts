import { describe, expect, it } from 'vitest'
import { checkIntervals } from '../../shared/investigation/intervals'
import { demoEmail, demoProjectId, signIn } from '../helpers/http'

interface PointRow { id: string, identifier: string, kind: string, finalDepth: number, cptCount: number }

describe('the seeded demo project', () => {
  it('holds the scenario\'s investigation: 6 boreholes, 4 CPTu soundings, 3 piezometers and 10 vane holes', async () => {
    const c = await signIn(demoEmail('geologist'))
    const id = await demoProjectId(c)
    const r = await c.get<{ points: PointRow[], total: number }>(`/api/projects/${id}/points?limit=500`)
    const ids = r.body.points.map(p => p.identifier)
    expect(ids.filter(i => /^BH-0[1-6]$/.test(i))).toHaveLength(6)
    expect(r.body.points.filter(p => p.kind === 'cpt').map(p => p.identifier)).toEqual(['CPT-01', 'CPT-02', 'CPT-03', 'CPT-04'])
    expect(r.body.points.filter(p => p.kind === 'piezometer')).toHaveLength(3)
    expect(ids.filter(i => i.startsWith('VT-'))).toHaveLength(10)
    // CPTu at 0.02 m to about 22 m: over a thousand rows each.
    for (const p of r.body.points.filter(p => p.kind === 'cpt')) expect(p.cptCount).toBeGreaterThan(1000)

    const strata = await c.get<{ strata: { code: string }[] }>(`/api/projects/${id}/strata`)
    expect(strata.body.strata.map(s => s.code)).toEqual(['MG', 'CRUST', 'EST', 'GLAC', 'SAND'])

    const bh = r.body.points.find(p => p.identifier === 'BH-01')!
    const d = await c.get<{ intervals: { top: number, bottom: number, stratumId: string | null }[], samples: unknown[], groundwater: unknown[] }>(`/api/projects/${id}/points/${bh.id}`)
    expect(d.body.intervals.length).toBeGreaterThanOrEqual(5)
    expect(checkIntervals(d.body.intervals, bh.finalDepth).issues).toEqual([])
    expect(d.body.intervals.every(i => i.stratumId !== null)).toBe(true)
    expect(d.body.samples.length).toBeGreaterThan(5)
    expect(d.body.groundwater.length).toBeGreaterThan(0)
  })
})
