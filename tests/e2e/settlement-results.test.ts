import { readFileSync } from 'node:fs'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SettlementRun } from '../../shared/types/settlement-runs'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { baseUrl, demoProjectId, signedInDemo } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { insertRunningCopy } from '../helpers/run-worker'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'
import { openProjectAs, screenshot, useBrowser } from './helpers'

interface Created { run: { id: string, status: string } }

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 })
afterAll(() => pool.end())

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
    const { model: m } = await must('model', engineer.get<{ model: { version: number, draft: SiteModelDefinition } }>(model.url))
    // A version must change something: the made ground's cone factor (no part of a settlement run).
    const draft = { ...m.draft, strata: m.draft.strata.map((s, i) => (i === 0 ? { ...s, cptFactor: 0.32 } : s)) }
    const put = await must('draft', engineer.request<{ model: { version: number } }>('PUT', `${model.url}/draft`, { draft, version: m.version }))
    await must('save v2', engineer.post(versions, { message: 'Second look', version: put.model.version }), 201)
    await must('submit v2', engineer.post(`${versions}/2/submit`, { message: 'Another check', reviewerIds: [reviewerId] }))
    const b = await must('run on v2', designer.post<Created>(`${project.base}/settlement-runs`, smallRunBody({ modelId: model.modelId, version: 2 }, { name: 'Slab on v2' })), 201)
    provisionalRun = b.run.id
    const { run } = await must('run', designer.get<{ run: SettlementRun }>(`${project.base}/settlement-runs/${provisionalRun}`))
    expect(run.model.status).toBe('submitted')
  })

  it('lists the runs with their headline, and opens a run: version line, contour map, section, sublayers and exports', async () => {
    const page = await openProjectAs(browser.context, 'designer', projectId, '/settlement', { viewport: { width: 1366, height: 800 } })
    const row = page.getByTestId(`run-row-${approvedRun}`)
    await row.waitFor()
    await page.getByTestId(`run-row-${provisionalRun}`).waitFor()
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
    // The settlement under the pointer, near the slab's centre.
    await page.getByTestId('named-point').first().scrollIntoViewIfNeeded()
    const centre = (await page.getByTestId('named-point').first().boundingBox())!
    await page.mouse.move(centre.x + centre.width / 2 + 25, centre.y + centre.height / 2 + 25)
    await expect.poll(() => page.getByTestId('contour-probe').textContent()).toMatch(/^\d+\.\d mm$/)

    // Dragging end B of the section towards the slab's centre changes the read-out.
    const readout = page.getByTestId('section-readout')
    const before = await readout.textContent()
    const handle = page.getByTestId('section-handle-b')
    // The point's tables arrive after the map, the sublayer table once it is scrolled to; drag once the page has
    // its final layout, with the handle on screen.
    await page.getByTestId('sublayer-box').scrollIntoViewIfNeeded()
    await page.getByTestId('sublayer-table').waitFor()
    await handle.scrollIntoViewIfNeeded()
    const box = (await handle.boundingBox())!
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2)
    await page.mouse.down()
    await page.mouse.move(box.x - 60, box.y - 50, { steps: 6 })
    await page.mouse.up()
    await expect.poll(() => readout.textContent()).not.toBe(before)
    // The section as a drawing: an SVG file with the caution under it.
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('section-plot').getByTestId('plot-svg').click()])
    expect(download.suggestedFilename()).toBe('settlement-section.svg')
    const svgText = readFileSync((await download.path())!, 'utf8')
    expect(svgText).toContain('<svg')
    expect(svgText).toContain('licensed engineer')

    // The first named point's sublayer table, its subtotals and the convergence line.
    const table = page.getByTestId('sublayer-table')
    await page.getByTestId('sublayer-box').scrollIntoViewIfNeeded()
    await table.waitFor()
    expect(await table.getByTestId('sublayer-row').count()).toBeGreaterThan(10)
    expect(await table.getByTestId('sublayer-subtotal').count()).toBeGreaterThan(1)
    expect(await page.getByTestId('convergence-line').textContent()).toMatch(/^Halving every sublayer changes the total by (less than 0\.01|\d+\.\d\d) %/)
    await page.getByTestId('depth-plot').waitFor()
    await page.getByTestId('time-curve').waitFor()
    // Another named point: its own table, whose total is that point's settlement in the headline card.
    const centreTotal = await page.getByTestId('sublayer-total').textContent()
    await page.getByTestId('point-select').selectOption({ label: (await page.getByTestId('point-select').locator('option').nth(1).textContent())! })
    await expect.poll(() => page.getByTestId('sublayer-total').textContent()).not.toBe(centreTotal)
    const cornerCard = (await page.getByTestId('headline-points').locator('li').nth(1).textContent())!.replace(/\s+/g, '')
    expect(cornerCard).toBe(`Corner${(await page.getByTestId('sublayer-total').textContent())!.trim()}mm`)
    // On a phone the table is wider than its box: the subtotals and the total say their value at the box's left, where it opens.
    await page.setViewportSize({ width: 390, height: 844 })
    await page.getByTestId('sublayer-box').scrollIntoViewIfNeeded()
    const totalLabel = page.getByTestId('sublayer-total-label')
    expect((await totalLabel.textContent())!.replace(/\s+/g, ' ').trim()).toBe(`Total primary settlement: ${(await page.getByTestId('sublayer-total').textContent())!.trim()} mm`)
    const inView = (el: Element) => {
      const region = el.closest('[role="region"]')!
      region.scrollLeft = 0
      const box = region.getBoundingClientRect()
      const said = el.querySelector('span')!.getBoundingClientRect()
      return said.width > 0 && said.left >= box.left && said.right <= box.right
    }
    expect(await totalLabel.evaluate(inView)).toBe(true)
    expect(await page.getByTestId('sublayer-subtotal-label').first().evaluate(inView)).toBe(true)
    await page.setViewportSize({ width: 1280, height: 800 })
    expect(await page.getByTestId('run-caution').textContent()).toContain('licensed engineer')

    expect(await page.getByTestId('export-xlsx').getAttribute('href')).toBe(`/api/projects/${projectId}/settlement-runs/${approvedRun}/export?format=xlsx`)
    expect(await page.getByTestId('run-again').getAttribute('href')).toBe(`/projects/${projectId}/settlement/new?from=${approvedRun}`)

    await screenshot(page, 'settlement-results-run-laptop')
    await page.setViewportSize({ width: 390, height: 844 })
    await page.getByTestId('sublayer-box').scrollIntoViewIfNeeded()
    await page.getByTestId('sublayer-table').waitFor()
    await screenshot(page, 'settlement-results-run-phone')
    await page.close()
  })

  it('warns that a run on a version in review is not based on an approved version, and compares two runs', async () => {
    const page = await openProjectAs(browser.context, 'designer', projectId, `/settlement/${provisionalRun}`, { viewport: { width: 1366, height: 800 } })
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

  it('moves the progress bar of a run being computed, then shows its results once it has finished', async () => {
    // A run of this test's own, written as a worker would leave it part-way (the page cannot tell).
    const copy = await insertRunningCopy(pool, approvedRun, 'Slab computing', 0.3)
    const page = await openProjectAs(browser.context, 'designer', projectId, `/settlement/${copy}`, { viewport: { width: 1366, height: 800 } })
    const bar = page.getByRole('progressbar', { name: 'Run progress' })
    await bar.waitFor()
    expect(await bar.getAttribute('aria-valuenow')).toBe('30')
    await screenshot(page, 'settlement-results-running-laptop')
    await pool.query('update settlement_runs set progress = 0.6 where id = $1', [copy])
    await expect.poll(() => bar.getAttribute('aria-valuenow'), { timeout: 10_000 }).toBe('60')
    await pool.query('insert into settlement_run_points (run_id, index, detail) select $1, index, detail from settlement_run_points where run_id = $2', [copy, approvedRun])
    await pool.query(`update settlement_runs r set status = 'finished', progress = 1, finished_at = now(), results = s.results from settlement_runs s where r.id = $1 and s.id = $2`, [copy, approvedRun])
    await page.getByTestId('headline-cards').waitFor({ timeout: 10_000 })
    expect(await page.getByTestId('run-progress').count()).toBe(0)
    expect(await page.getByTestId('headline-max').textContent()).toContain('at Centre')
    // The sublayer table is built once it comes near the screen.
    await page.getByTestId('sublayer-box').scrollIntoViewIfNeeded()
    await page.getByTestId('sublayer-table').waitFor()

    // Its creator deletes it from the list (after saying yes).
    await page.goto(`${baseUrl()}/projects/${projectId}/settlement`)
    page.once('dialog', d => void d.accept())
    await page.getByTestId(`run-delete-${copy}`).click()
    await page.getByTestId(`run-row-${copy}`).waitFor({ state: 'detached' })
    expect(await page.getByRole('status').textContent()).toContain('“Slab computing” deleted.')
    const { rows } = await pool.query('select 1 from settlement_runs where id = $1', [copy])
    expect(rows).toEqual([])
    await page.close()
  })

  it('shows the demo\'s seeded embankment run on its approved version (read only)', async () => {
    const demoId = await demoProjectId(designer)
    const page = await openProjectAs(browser.context, 'designer', demoId, '/settlement', { viewport: { width: 1366, height: 800 } })
    const link = page.getByTestId('run-list').getByRole('link', { name: 'Yard embankment, 6 m on version 1' })
    await link.waitFor()
    await link.click()
    await page.locator('[data-testid="run-version-line"][data-state="approved"]').waitFor()
    await page.getByTestId('contour-band').first().waitFor()
    // The embankment is outlined at its toe and its crest.
    expect(await page.getByTestId('load-outline').count()).toBe(2)
    await page.getByTestId('sublayer-box').scrollIntoViewIfNeeded()
    await page.getByTestId('sublayer-table').waitFor()
    await screenshot(page, 'settlement-results-demo-laptop')
    await page.close()
  })
})
