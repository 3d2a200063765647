// The AGS4 import that merges into holes already in the project, in Chromium: the geologist
// uploads the site's own holes with BH-01 edited, chooses to merge, reads the plan per hole,
// confirms, and the log of BH-01 has the edited and the added interval.
import { describe, expect, it } from 'vitest'
import { editBh01 } from '../helpers/ags-edit'
import { screenshot, useProjectAs } from './helpers'

describe('AGS4 update of existing holes in Chromium', () => {
  const site = useProjectAs('geologist', 'E2E-AGU')

  it('the geologist merges an edited file into BH-01 after reading what changes', async () => {
    const projectId = site.projectId
    const geo = site.client
    const res = await fetch(`${geo.base}/exports/${projectId}/logs.ags`, { headers: { cookie: geo.cookie! } })
    expect(res.status).toBe(200)
    const { text, editedDescription, newFinalDepth } = editBh01(await res.text())

    const page = await site.open('/import')
    await page.getByTestId('import-file').setInputFiles({ name: 'saltmarsh-lane-edited.ags', mimeType: 'text/plain', buffer: Buffer.from(text) })
    await page.getByTestId('import-mode').waitFor()
    // Holes already here are skipped unless the user chooses otherwise.
    expect(await page.getByTestId('import-mode-add-new').isChecked()).toBe(true)
    await page.getByTestId('import-mode-update').check()
    await page.getByTestId('import-commit').click()

    // The plan: BH-01 merged with one interval added and one changed; nothing written yet.
    const row = page.getByTestId('hole-plan-BH-01')
    await row.waitFor()
    expect((await row.locator('td').nth(0).textContent())?.trim()).toBe('Merged')
    expect((await row.locator('td').nth(1).textContent())?.trim()).toBe('+1 ~1')
    expect(await row.textContent()).toContain('Very dense grey sandy gravel.')
    expect(await page.getByTestId('import-hole-plan').locator('tbody tr').count()).toBe(1)
    await page.getByTestId('import-confirm').waitFor()
    await screenshot(page, 'import-ags-update-plan')

    await page.getByTestId('import-confirm').click()
    await page.getByTestId('import-done').waitFor()
    expect(await page.getByTestId('import-done').textContent()).toContain('merged')

    const pts = await geo.get<{ points: { id: string, identifier: string }[] }>(`/api/projects/${projectId}/points?q=BH-01`)
    const id = pts.body.points.find(p => p.identifier === 'BH-01')!.id
    const d = await geo.get<{ point: { finalDepth: number }, intervals: { bottom: number, description: string }[] }>(`/api/projects/${projectId}/points/${id}`)
    expect(d.body.point.finalDepth).toBe(newFinalDepth)
    expect(d.body.intervals[1]!.description).toBe(editedDescription)
    expect(d.body.intervals.at(-1)).toMatchObject({ bottom: newFinalDepth, description: 'Very dense grey sandy gravel.' })
    await page.close()
  })
})
