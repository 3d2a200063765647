// The saved draft drawn by the server (GET …/models/:modelId/drawing), the drawing the stress-model page opens with:
// it draws the points the σ'p route gives through the same stresses, follows the draft's revision and the open
// reviewer flags, and answers 404 for a model that is not the project's.
import { describe, expect, it } from 'vitest'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { type Client, demoProjectId, signedInDemo } from '../helpers/http'

interface Model { id: string, version: number, draft: SiteModelDefinition }
interface Drawing { revision: number, svg: string, width: number, height: number, points: number }
interface Points { points: { id: string, source: string, depth: number }[] }

/** The slashes across flagged-out points: one path for all of them, beside the key's own. */
const SLASHES = /stroke="#c0392b" stroke-width="1.4"/g

/** A model made from the logs of a fresh copy of the demo site (each test its own: flags are the project's). */
async function freshModel(eng: Client, tag: string): Promise<{ projectId: string, model: Model, url: string }> {
  const projectId = await createDemoCopy(tag)
  const made = await eng.post<{ model: Model }>(`/api/projects/${projectId}/models`, { name: 'Drawn draft' })
  expect(made.status).toBe(201)
  return { projectId, model: made.body.model, url: `/api/projects/${projectId}/models/${made.body.model.id}/drawing` }
}

describe('the server\'s drawing of a model\'s draft', () => {
  const { engineer: eng, reviewer: rev, designer } = signedInDemo('engineer', 'reviewer', 'designer')

  it('draws the draft\'s strata and every σ\'p point its stresses give, at the revision read', async () => {
    const { projectId, model, url } = await freshModel(eng, 'MDR1')
    const r = await designer.get<Drawing>(url)
    expect(r.status).toBe(200)
    expect(r.body.revision).toBe(model.version)
    expect([r.body.width, r.body.height]).toEqual([720, 880])
    expect(r.body.svg.startsWith('<svg xmlns="http://www.w3.org/2000/svg" width="720" height="880"')).toBe(true)
    expect(r.body.svg.endsWith('</svg>')).toBe(true)
    for (const s of model.draft.strata) expect(r.body.svg).toContain(`>${s.code}</text>`)
    // The same points as the σ'p route through the draft's stresses (the page's own read, at its spacing).
    const through = await designer.post<Points>(`/api/projects/${projectId}/preconsolidation-points/evaluate`, { definition: model.draft, label: 'the draft' })
    expect(through.status).toBe(200)
    expect(through.body.points.length).toBeGreaterThan(20)
    expect(r.body.points).toBe(through.body.points.length)
    // Nothing to draw as flagged out yet: the only slash is the key's.
    expect(r.body.svg.match(SLASHES)?.length).toBe(1)
  })

  it('follows a saved edit of the draft and an open reviewer flag', async () => {
    const { projectId, model, url } = await freshModel(eng, 'MDR2')
    const before = (await designer.get<Drawing>(url)).body
    const draft = { ...model.draft, groundwater: { ...model.draft.groundwater, waterTableDepth: model.draft.groundwater.waterTableDepth + 0.5 } }
    const put = await eng.request<{ model: { version: number } }>('PUT', `/api/projects/${projectId}/models/${model.id}/draft`, { draft, version: model.version })
    expect(put.status).toBe(200)
    const moved = (await designer.get<Drawing>(url)).body
    expect(moved.revision).toBe(put.body.model.version)
    expect(moved.revision).toBeGreaterThan(before.revision)
    expect(moved.svg).not.toBe(before.svg)

    const pts = (await designer.post<Points>(`/api/projects/${projectId}/preconsolidation-points/evaluate`, { definition: draft })).body.points
    const cpt = pts.find(p => p.source === 'cpt')!
    const flag = await rev.post(`/api/projects/${projectId}/flags`, { targetType: 'cpt-point', targetId: cpt.id, verdict: 'exclude', comment: 'Spike at a sand lens.' })
    expect(flag.status).toBe(201)
    const flagged = (await designer.get<Drawing>(url)).body
    expect(flagged.revision).toBe(moved.revision)
    expect(flagged.svg.match(SLASHES)?.length).toBe(2)
  })

  it('is 404 for a model of another project, one that does not exist and a malformed id', async () => {
    const { projectId, model } = await freshModel(eng, 'MDR3')
    const other = await demoProjectId(designer)
    expect((await designer.get(`/api/projects/${other}/models/${model.id}/drawing`)).status).toBe(404)
    expect((await designer.get(`/api/projects/${projectId}/models/00000000-0000-4000-8000-000000000000/drawing`)).status).toBe(404)
    // A malformed id names nothing either (ids are not probed by shape).
    expect((await designer.get(`/api/projects/${projectId}/models/not-an-id/drawing`)).status).toBe(404)
  })
})
