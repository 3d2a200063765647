// Project settings over real HTTP: the owner switches the units (SI ⇄ US, psf or tsf for US stresses),
// other roles are refused, unknown units are a 400, and the change is in the audit trail with the
// values before and after. Stored values stay SI: a point's depth reads the same after the switch.
import { describe, expect, it } from 'vitest'
import { signedInDemo } from '../helpers/http'
import { createPoint, must, useTestProject } from '../helpers/project'

interface ProjectBody { project: { id: string, unitSystem: string, usStressUnit: string, name: string } }
interface AuditBody { events: { action: string, entity: string, entityId: string, before: Record<string, unknown> | null, after: Record<string, unknown> | null }[] }

describe('project settings: units', () => {
  const { owner, engineer, reviewer } = signedInDemo('owner', 'engineer', 'reviewer')
  const project = useTestProject(owner, 'UNITS', 'Units site', () => ['engineer', 'reviewer'])

  it('starts in SI with psf kept for a later switch, and the owner switches to US in tsf, then back to psf', async () => {
    const before = await must('project', owner.get<ProjectBody>(project.base))
    expect(before.project.unitSystem).toBe('SI')
    expect(before.project.usStressUnit).toBe('psf')

    const us = await owner.patch<ProjectBody>(project.base, { unitSystem: 'US', usStressUnit: 'tsf' })
    expect(us.status).toBe(200)
    expect(us.body.project.unitSystem).toBe('US')
    expect(us.body.project.usStressUnit).toBe('tsf')
    const read = await must('project again', engineer.get<ProjectBody>(project.base))
    expect(read.project).toMatchObject({ unitSystem: 'US', usStressUnit: 'tsf', name: 'Units site' })

    const psf = await owner.patch<ProjectBody>(project.base, { usStressUnit: 'psf' })
    expect(psf.status).toBe(200)
    expect(psf.body.project).toMatchObject({ unitSystem: 'US', usStressUnit: 'psf' })
  })

  it('keeps stored values in SI whatever the units', async () => {
    const pointId = await createPoint(owner, project.id, { identifier: 'BH-U1', finalDepth: 30 })
    await must('to US', owner.patch(project.base, { unitSystem: 'US' }))
    const point = await must('point', owner.get<{ point: { finalDepth: number } }>(`${project.base}/points/${pointId}`))
    expect(point.point.finalDepth).toBe(30)
  })

  it('refuses the units to an engineer and a reviewer (403) and leaves them as they were', async () => {
    const now = (await must('project', owner.get<ProjectBody>(project.base))).project
    for (const c of [engineer, reviewer]) {
      const r = await c.patch<{ message: string }>(project.base, { unitSystem: now.unitSystem === 'US' ? 'SI' : 'US' })
      expect(r.status).toBe(403)
      expect((await c.patch(project.base, { usStressUnit: 'tsf' })).status).toBe(403)
    }
    expect((await must('project', owner.get<ProjectBody>(project.base))).project).toMatchObject({ unitSystem: now.unitSystem, usStressUnit: now.usStressUnit })
  })

  it('answers 400 to an unknown unit system or stress unit, naming the field', async () => {
    for (const body of [{ unitSystem: 'imperial' }, { usStressUnit: 'kPa' }, { unitSystem: 'us' }, { usStressUnit: null }]) {
      const r = await owner.patch<{ data?: { issues?: { path: string }[] } }>(project.base, body)
      expect(r.status, JSON.stringify(body)).toBe(400)
      expect(r.body.data?.issues?.map(i => i.path).join(' ')).toContain(Object.keys(body)[0])
    }
  })

  it('records each change in the audit trail with the units before and after', async () => {
    await must('to SI', owner.patch(project.base, { unitSystem: 'SI' }))
    const audit = await must('audit', owner.get<AuditBody>(`${project.base}/audit?limit=20`))
    const last = audit.events.find(e => e.entity === 'project' && e.action === 'update')
    expect(last?.entityId).toBe(project.id)
    expect(last?.before?.unitSystem).toBe('US')
    expect(last?.after?.unitSystem).toBe('SI')
    expect(last?.after?.usStressUnit).toBe('psf')
  })
})
