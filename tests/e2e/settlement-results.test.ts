import { beforeAll, describe, expect, it } from 'vitest'
import type { SettlementRun } from '../../shared/types/settlement-runs'
import { baseUrl, demoEmail, signedInDemo } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'
import { screenshot, signInAs, useBrowser } from './helpers'

interface Created { run: { id: string, status: string } }

describe('settlement results in Chromium', () => {
  const browser = useBrowser()
  const { owner, engineer, designer, reviewer } = signedInDemo('owner', 'engineer', 'designer', 'reviewer')
  let projectId = ''
  let approvedRun = ''
  let provisionalRun = ''

  beforeAll(async () => {
    const project = await createProject(owner, 'E2E-SR', 'Settlement results (browser)', ['engineer', 'designer', 'reviewer'])
    projectId = project.id
    const members = await must('members', owner.get<{ members: { userId: string, role: string }[] }>(`${project.base}/members`))
    const reviewerId = members.members.find(m => m.role === 'reviewer')!.userId
    const model = await createRunModel(engineer, project.id, undefined, 'Yard model')
    const versions = `${model.url}/versions`
    // Version 1 reviewed and approved, then runs on it; version 2 only submitted.
    await must('submit v1', engineer.post(`${versions}/1/submit`, { message: 'Ready for a check', reviewerIds: [reviewerId] }))
    await must('approve v1', reviewer.post(`${versions}/1/decision`, { decision: 'approve', comment: 'Checked' }))
    const a = await must('run on v1', designer.post<Created>(`${project.base}/settlement-runs`, smallRunBody(model, { name: 'Slab on v1', grid: { spacing: 4, margin: 12 } })), 201)
    approvedRun = a.run.id
    const { model: m } = await must('model', engineer.get<{ model: { version: number, draft: unknown } }>(model.url))
    const put = await must('draft', engineer.request<{ model: { version: number } }>('PUT', `${model.url}/draft`, { draft: m.draft, version: m.version }))
    await must('save v2', engineer.post(versions, { message: 'Second look', version: put.model.version }), 201)
    await must('submit v2', engineer.post(`${versions}/2/submit`, { message: 'Another check', reviewerIds: [reviewerId] }))
    const b = await must('run on v2', designer.post<Created>(`${project.base}/settlement-runs`, smallRunBody({ modelId: model.modelId, version: 2 }, { name: 'Slab on v2' })), 201)
    provisionalRun = b.run.id
    const { run } = await must('run', designer.get<{ run: SettlementRun }>(`${project.base}/settlement-runs/${provisionalRun}`))
    expect(run.model.status).toBe('submitted')
  })

  it('lists the runs with their headline, and opens a run: version line, contour map, section, sublayers and exports', async () => {
    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.setViewportSize({ width: 1366, height: 800 })
    await page.goto(`${baseUrl()}/projects/${projectId}/settlement`)
    const row = page.getByTestId(`run-row-${approvedRun}`)
    await row.waitFor()
    expect(await page.locator('[data-run-row]').count()).toBe(2)
    expect(await row.textContent()).toContain('Slab on v1')
    expect(await row.getByTestId('run-headline-max').textContent()).toMatch(/\d+\.\d mm\s*Centre/)
    expect(await page.getByTestId('new-run').getAttribute('href')).toBe(`/projects/${projectId}/settlement/new`)
    await screenshot(page, 'settlement-results-list-laptop')

    await row.getByRole('link', { name: 'Slab on v1' }).click()
    const line = page.getByTestId('run-version-line')
    await line.waitFor()
    expect(await line.getAttribute('data-state')).toBe('approved')
    expect((await line.textContent())!.replace(/\s+/g, ' ')).toMatch(/Yard model, version 1, approved by .+ on \d{1,2} \w{3} \d{4}\./)
    await page.getByTestId('contour-band').first().waitFor()
    expect(await page.getByTestId('contour-band').count()).toBeGreaterThan(2)
    expect(await page.getByTestId('load-outline').count()).toBe(1)
    expect(await page.getByTestId('named-point').count()).toBe(3)
    expect(await page.getByTestId('headline-max').textContent()).toContain('at Centre')

    // Dragging end B of the section towards the slab's centre changes the read-out.
    const readout = page.getByTestId('section-readout')
    const before = await readout.textContent()
    const handle = page.getByTestId('section-handle-b')
    const box = (await handle.boundingBox())!
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2)
    await page.mouse.down()
    await page.mouse.move(box.x - 60, box.y - 50, { steps: 6 })
    await page.mouse.up()
    await expect.poll(() => readout.textContent()).not.toBe(before)

    // The first named point's sublayer table, its subtotals and the convergence line.
    const table = page.getByTestId('sublayer-table')
    await table.waitFor()
    expect(await table.getByTestId('sublayer-row').count()).toBeGreaterThan(10)
    expect(await table.getByTestId('sublayer-subtotal').count()).toBeGreaterThan(1)
    expect(await page.getByTestId('convergence-line').textContent()).toMatch(/^Halving every sublayer changes the total by (less than 0\.01|\d+\.\d\d) %/)
    await page.getByTestId('depth-plot').waitFor()
    await page.getByTestId('time-curve').waitFor()
    expect(await page.getByTestId('run-caution').textContent()).toContain('licensed engineer')

    expect(await page.getByTestId('export-xlsx').getAttribute('href')).toBe(`/api/projects/${projectId}/settlement-runs/${approvedRun}/export?format=xlsx`)
    expect(await page.getByTestId('run-again').getAttribute('href')).toBe(`/projects/${projectId}/settlement/new?from=${approvedRun}`)

    await screenshot(page, 'settlement-results-run-laptop')
    await page.setViewportSize({ width: 390, height: 844 })
    await page.getByTestId('sublayer-table').waitFor()
    await screenshot(page, 'settlement-results-run-phone')
    await page.close()
  })

  it('warns that a run on a version in review is not based on an approved version, and compares two runs', async () => {
    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.setViewportSize({ width: 1366, height: 800 })
    await page.goto(`${baseUrl()}/projects/${projectId}/settlement/${provisionalRun}`)
    const band = page.locator('[data-testid="run-version-line"][data-state="not-approved"]')
    await band.waitFor()
    expect(await band.textContent()).toContain('Based on a version that is not approved.')
    expect(await band.textContent()).toContain('version 2')
    const xlsx = await page.request.get(`${baseUrl()}${await page.getByTestId('export-xlsx').getAttribute('href')}`)
    expect(xlsx.status()).toBe(200)
    expect(xlsx.headers()['content-type']).toContain('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet')
    await screenshot(page, 'settlement-results-provisional-laptop')

    await page.goto(`${baseUrl()}/projects/${projectId}/settlement`)
    await page.getByTestId(`run-row-${approvedRun}`).getByTestId('run-pick').check()
    await page.getByTestId(`run-row-${provisionalRun}`).getByTestId('run-pick').check()
    await page.getByTestId('compare-runs').click()
    const inputs = page.getByTestId('compare-inputs')
    await inputs.waitFor()
    expect(await inputs.textContent()).toContain('Model version')
    expect(await inputs.textContent()).toContain('Grid')
    // Same loads and points on both: each point's difference is what the versions (the same ground) give, zero here.
    const points = page.getByTestId('compare-points')
    expect(await points.locator('tbody tr').count()).toBe(3)
    expect(await points.locator('tbody tr').first().textContent()).toContain('±0.0 mm')
    await page.getByTestId('time-curve').waitFor()
    await screenshot(page, 'settlement-results-compare-laptop')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'settlement-results-compare-phone')
    await page.close()
  })
})
