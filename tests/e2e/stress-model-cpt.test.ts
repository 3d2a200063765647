// CPT σ'p on the canvas follow the model on screen, before anything is saved:
// σ'p = k·qnet (Mayne 1995 form, shared/geotech/insitu.ts), so changing a band's
// cone factor k from k0 to k1 scales each CPT σ'p in that band by k1/k0, and a
// median of scaled values is the scaled median (the resampling is a median per
// window), up to the answer's rounding.
import { describe, expect, it } from 'vitest'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { demoEmail } from '../helpers/http'
import { openWorkspace, screenshot, signInAs, useProjectAs } from './helpers'

interface Answer { points: { id: string, source: string, stratumCode: string | null, depth: number, preconsolidation: number }[], stressModel: { source: string, description: string } }

describe('CPT σ\'p through the model on screen', () => {
  // The model it makes belongs to a copy of the demo site of this file's own.
  const project = useProjectAs('engineer', 'E2E-CPT')

  it('the engineer changes the estuarine clay\'s cone factor and the CPT σ\'p there scale with it, unsaved', async () => {
    const created = await project.client.post<{ model: { id: string, draft: SiteModelDefinition, version: number } }>(`/api/projects/${project.projectId}/models`, { name: `CPT factor check ${Date.now().toString(36)}` })
    expect(created.status).toBe(201)
    const model = created.body.model
    const est = model.draft.strata.findIndex(s => s.code === 'EST')
    const k0 = model.draft.strata[est]!.cptFactor
    const k1 = 0.5

    const page = await signInAs(project.browser.context, demoEmail('engineer'))
    const first = page.waitForResponse(r => r.url().endsWith('/preconsolidation-points/evaluate') && r.request().method() === 'POST')
    await page.goto(project.url(`/models/${model.id}`))
    await openWorkspace(page)
    const before = await (await first).json() as Answer
    expect(before.stressModel.source).toBe('given')
    await expect.poll(async () => (await page.getByTestId('workspace-summary').textContent()) ?? '', { timeout: 15_000 })
      .toContain('CPT and vane σ\'p use the stresses of the model on screen (unsaved edits included)')

    await page.getByTestId('band-select').selectOption(String(est))
    const next = page.waitForResponse(r => r.url().endsWith('/preconsolidation-points/evaluate') && (r.request().postData() ?? '').includes(`"cptFactor":${k1}`))
    const field = page.getByLabel('CPT factor k')
    await field.fill(String(k1))
    await field.press('Enter')
    const after = await (await next).json() as Answer

    const estBefore = before.points.filter(p => p.source === 'cpt' && p.stratumCode === 'EST')
    expect(estBefore.length).toBeGreaterThan(50)
    let checked = 0
    for (const p of estBefore) {
      const q = after.points.find(x => x.id === p.id)
      if (!q) continue
      // Both values are rounded to 0.1 kPa in the answer.
      expect(Math.abs(q.preconsolidation - p.preconsolidation * (k1 / k0))).toBeLessThanOrEqual(0.1 * (1 + k1 / k0) + 1e-9)
      checked++
    }
    expect(checked).toBeGreaterThan(50)
    // Points above the band do not move (k is the band's at each depth; the stratum code is the log's).
    const estTop = model.draft.strata.slice(0, est).reduce((t, s) => t + s.thickness, 0)
    const above = before.points.filter(p => p.source === 'cpt' && p.depth < estTop - 0.2)
    expect(above.length).toBeGreaterThan(3)
    for (const p of above) expect(after.points.find(x => x.id === p.id)?.preconsolidation).toBe(p.preconsolidation)
    // Nothing was saved: the server's draft keeps k0.
    expect(await page.getByTestId('session-bar').getAttribute('data-dirty')).toBe('true')
    const stored = (await project.client.get<{ model: { draft: SiteModelDefinition } }>(`/api/projects/${project.projectId}/models/${model.id}`)).body.model
    expect(stored.draft.strata[est]!.cptFactor).toBe(k0)
    await screenshot(page, 'stress-model-cpt-factor')
    await page.close()
  })
})
