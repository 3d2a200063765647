import { describe, expect, it } from 'vitest'
import { baseUrl, demoEmail, signedInDemo } from '../helpers/http'
import { testBody } from '../helpers/lab'
import { createPoint, createProject, createSavedModel, must } from '../helpers/project'
import { screenshot, signInAs, useBrowser } from './helpers'

describe('the model in force on the tests page, in Chromium', () => {
  const browser = useBrowser()
  const { owner, engineer } = signedInDemo('owner', 'engineer')

  it('says σ\'v0 is unavailable with no saved version, then names the saved version as not yet approved', async () => {
    const project = await createProject(owner, 'E2E-MIF', 'Model in force (browser)', ['engineer'])
    // One clay stratum (γ = 18 kN/m³) logged 0–20 m, water at 1.0 m, one oedometer test at 4.5–5.0 m.
    const st = await must('stratum', engineer.post<{ stratum: { id: string } }>(`${project.base}/strata`, { code: 'CLAY', name: 'Soft clay', colour: 'c', pattern: 'p', unitWeight: 18, unitWeightSaturated: 18 }), 201)
    const pointUrl = `${project.base}/points/${await createPoint(engineer, project.id, { identifier: 'BH-E1' })}`
    await must('log', engineer.request('PUT', `${pointUrl}/intervals`, { intervals: [{ top: 0, bottom: 20, description: 'Soft grey CLAY', uscs: 'CH', stratumId: st.stratum.id }] }))
    await must('groundwater', engineer.post(`${pointUrl}/groundwater`, { kind: 'standing', observedAt: '2025-03-04T08:00:00Z', depth: 1 }), 201)
    const s = await must('sample', engineer.post<{ sample: { id: string } }>(`${pointUrl}/samples`, { identifier: 'U1', top: 4.5, bottom: 5, type: 'thin-walled-tube' }), 201)
    await must('test', engineer.post(`${project.base}/tests/oedometer`, testBody(s.sample.id, 'OED-E1')), 201)

    const page = await signInAs(browser.context, demoEmail('engineer'))
    await page.goto(`${baseUrl()}/projects/${project.id}/tests`)
    const banner = page.getByTestId('model-in-force')
    await banner.waitFor()
    expect(await banner.getAttribute('data-state')).toBe('none')
    expect(await banner.textContent()).toContain('No saved version of the design model: values that need σ\'v0 are unavailable.')
    expect(await banner.getByRole('link', { name: 'Open the model' }).getAttribute('href')).toBe(`/projects/${project.id}/models`)

    const model = await createSavedModel(engineer, project.id, 'Yard model')
    await page.reload()
    await page.locator('[data-testid="model-in-force"][data-state="not-approved"]').waitFor()
    const text = (await banner.textContent())!.replace(/\s+/g, ' ')
    expect(text).toContain('Values use version 1 of Yard model, not yet approved.')
    expect(await banner.getByRole('link').getAttribute('href')).toBe(`/projects/${project.id}/models/${model.id}/versions/1`)
    // σ'v0(4.75 m) = 18 × 4.75 − 9.81 × 3.75 = 48.7 kPa from version 1 (hand calculation).
    expect(await page.getByTestId('tests-table').locator('tbody tr').first().textContent()).toContain('48.7')

    await page.setViewportSize({ width: 1280, height: 800 })
    await screenshot(page, 'model-in-force-tests-laptop')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'model-in-force-tests-phone')
    await page.close()
  })
})
