import { describe, expect, it } from 'vitest'
import { checkIntervals } from '../../shared/investigation/intervals'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { usePool } from '../../server/db/client'
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

  it('holds the review story: "Yard model" as the design model, version 1 approved by the reviewer, version 2 submitted with one open flag, notices waiting', async () => {
    const c = await signIn(demoEmail('designer'))
    const id = await demoProjectId(c)
    const pool = usePool()
    const model = (await pool.query<{ id: string, name: string }>('select m.id, m.name from projects p join site_models m on m.id = p.design_model_id where p.id = $1', [id])).rows[0]
    expect(model?.name).toBe('Yard model')
    const versions = (await pool.query<{ version: number, status: string, approval_hash: string | null, reviewer: string | null, definition: SiteModelDefinition }>(
      'select v.version, v.status, v.approval_hash, u.display_name as reviewer, v.definition from site_model_versions v left join users u on u.id = v.decided_by where v.model_id = $1 order by v.version',
      [model!.id],
    )).rows
    expect(versions.map(v => [v.version, v.status, v.reviewer])).toEqual([[1, 'approved', 'Priya Natarajan'], [2, 'submitted', null]])
    expect(versions[0]!.approval_hash).toMatch(/^[0-9a-f]{64}$/)
    // The fitted trends come out close to the scenario's truth (docs/demo.md): POP ≈ 25 kPa in the estuarine clay, OCR ≈ 2.4 in the glacial clay.
    const trend = (code: string) => versions[0]!.definition.strata.find(s => s.code === code)?.trend
    expect(trend('EST')?.model).toBe('pop')
    expect(trend('EST')?.parameters.pop).toBeGreaterThan(15)
    expect(trend('EST')?.parameters.pop).toBeLessThan(35)
    expect(trend('GLAC')?.model).toBe('ocr')
    expect(trend('GLAC')?.parameters.ocr).toBeGreaterThan(1.9)
    expect(trend('GLAC')?.parameters.ocr).toBeLessThan(2.9)
    expect(versions[0]!.definition.groundwater.piezometers.length).toBe(2)
    const open = (await pool.query<{ n: number }>('select count(*)::int as n from review_flags where project_id = $1 and status = \'open\' and target_type = \'cpt-point\'', [id])).rows[0]
    expect(open?.n).toBe(1)
    const inbox = (await pool.query<{ title: string }>('select n.title from notifications n join users u on u.id = n.user_id where u.email = $1', [demoEmail('designer')])).rows
    expect(inbox.map(n => n.title)).toContain('Version 1 of Yard model approved by Priya Natarajan')
    const mail = (await pool.query<{ n: number }>('select count(*)::int as n from mail_outbox where project_id = $1', [id])).rows[0]
    expect(mail?.n).toBeGreaterThanOrEqual(3)
  })
})
