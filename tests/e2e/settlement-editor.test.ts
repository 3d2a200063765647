import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import type { SettlementRun } from '../../shared/types/settlement-runs'
import { baseUrl, demoEmail, signedInDemo } from '../helpers/http'
import { createPoint, createProject, must } from '../helpers/project'
import { createApprovedRunModel } from '../helpers/settlement-run'
import { SCREENSHOTS, screenshot, signInAs, useBrowser } from './helpers'

/** Both screen sizes of the page as it stands. */
async function shoot(page: Page, name: string) {
  await page.setViewportSize({ width: 1366, height: 800 })
  await screenshot(page, `${name}-laptop`)
  await page.setViewportSize({ width: 390, height: 844 })
  await screenshot(page, `${name}-phone`)
  // The plan and its tools as a phone shows them, at full size.
  await page.getByTestId('draw-tools').scrollIntoViewIfNeeded()
  await page.screenshot({ path: join(SCREENSHOTS, `${name}-phone-plan.png`) })
  await page.getByTestId('load-table').scrollIntoViewIfNeeded()
  await page.screenshot({ path: join(SCREENSHOTS, `${name}-phone-table.png`) })
  await page.setViewportSize({ width: 1366, height: 800 })
}

/** A drag with the mouse from (x0, y0) to (x1, y1), page pixels, in small steps. */
async function drag(page: Page, x0: number, y0: number, x1: number, y1: number) {
  await page.mouse.move(x0, y0)
  await page.mouse.down()
  await page.mouse.move((x0 + x1) / 2, (y0 + y1) / 2, { steps: 5 })
  await page.mouse.move(x1, y1, { steps: 5 })
  await page.mouse.up()
}

describe('the settlement run editor in Chromium', () => {
  const browser = useBrowser()
  const people = signedInDemo('owner', 'engineer', 'reviewer', 'designer')
  let projectId = ''

  // A project of this file's own: two boreholes, and a model from the scenario's ground model, version 1 approved.
  beforeAll(async () => {
    projectId = (await createProject(people.owner, 'E2E-RUN', 'Run editor (browser)', ['engineer', 'reviewer', 'designer', 'geologist'])).id
    await createPoint(people.engineer, projectId, { identifier: 'BH-R1', easting: 10, northing: 20 })
    await createPoint(people.engineer, projectId, { identifier: 'BH-R2', easting: 150, northing: 90 })
    await createApprovedRunModel(people, projectId, 'For settlement runs')
  })

  it('a designer draws an embankment, places two points, edits and undoes a value, runs and lands on the run', async () => {
    const page = await signInAs(browser.context, demoEmail('designer'))
    // The live stream is not part of this story.
    await page.route('**/api/projects/*/events', route => route.abort())
    await page.goto(`${baseUrl()}/projects/${projectId}/settlement/new`)
    await page.locator('[data-testid="run-editor"][data-ready="yes"]').waitFor()

    // The model in force is the default, with its standing.
    const standing = page.getByTestId('version-standing')
    await standing.waitFor()
    expect(await standing.getAttribute('data-state')).toBe('approved')
    expect((await standing.textContent())!.replace(/\s+/g, ' ')).toMatch(/Version 1 of Yard model, approved by Priya Natarajan on /)
    await expect(page.getByTestId('run-caution').textContent()).resolves.toContain('Results are estimates for engineers to check.')
    expect(await page.getByTestId('project-nav').getByRole('link', { name: 'Settlement' }).getAttribute('aria-current')).toBe('page')

    // An embankment by dragging its toe on the plan.
    await page.getByTestId('tool-embankment').click()
    const surface = page.getByTestId('draw-surface')
    await surface.waitFor()
    const box = (await surface.boundingBox())!
    await drag(page, box.x + box.width * 0.35, box.y + box.height * 0.3, box.x + box.width * 0.65, box.y + box.height * 0.7)
    await page.getByTestId('load-row-0').waitFor()
    expect(await page.getByTestId('load-type-0').inputValue()).toBe('embankment')
    expect(await page.getByTestId('plan-load').count()).toBe(1)
    expect(await page.getByTestId('load-crest').count()).toBe(1)
    const crestWidth = Number(await page.getByTestId('load-0-crestWidth').inputValue())
    expect(crestWidth).toBeGreaterThan(1)

    // Two named points by clicking the plan.
    await page.getByTestId('tool-point').click()
    const box2 = (await surface.boundingBox())!
    await page.mouse.click(box2.x + box2.width * 0.5, box2.y + box2.height * 0.5)
    await page.getByTestId('point-row-0').waitFor()
    await page.mouse.click(box2.x + box2.width * 0.9, box2.y + box2.height * 0.5)
    await page.getByTestId('point-row-1').waitFor()
    expect(await page.getByTestId('plan-named-point').count()).toBe(2)
    expect(await page.getByTestId('point-0-label').inputValue()).toBe('P1')
    expect(await page.getByTestId('point-1-label').inputValue()).toBe('P2')

    // A value in the table: 6 m → 4 m of 20 kN/m³ fill is 80 kPa; undo brings back 6 m and 120 kPa.
    await expect(page.getByTestId('load-pressure-0').textContent()).resolves.toBe('q = 120.0 kPa')
    await page.getByTestId('load-0-height').fill('4')
    await page.getByTestId('load-0-height').press('Enter')
    await expect.poll(() => page.getByTestId('load-pressure-0').textContent()).toBe('q = 80.0 kPa')
    await page.getByTestId('undo').click()
    await expect.poll(() => page.getByTestId('load-0-height').inputValue()).toBe('6')
    expect(await page.getByTestId('load-pressure-0').textContent()).toBe('q = 120.0 kPa')
    // The drawn load and the points are still there after the undo.
    expect(await page.getByTestId('plan-named-point').count()).toBe(2)

    // A run without a name is refused next to the name field, before anything is sent.
    await page.getByTestId('run').click()
    await expect(page.getByTestId('run-name-error').textContent()).resolves.toContain('Name is required')
    await page.getByTestId('run-name').fill('Yard embankment, drawn')

    // A grid over the loads: its size is shown, and one past 10 000 points is refused before sending.
    await page.getByTestId('grid-on').check()
    const count = page.getByTestId('grid-count')
    await count.waitFor()
    await page.getByTestId('grid-spacing').fill('0.5')
    await page.getByTestId('grid-spacing').press('Enter')
    await expect.poll(() => count.textContent()).toMatch(/more than 10,000/)
    await page.getByTestId('run').click()
    await expect(page.getByTestId('grid-spacing-error').textContent()).resolves.toMatch(/at most 10,000/)
    await page.getByTestId('grid-spacing').fill('5')
    await page.getByTestId('grid-spacing').press('Enter')
    await expect.poll(() => count.textContent()).toMatch(/^\d{2,3} grid points\.$/)

    // A load beyond the site's ±5 km passes the form but the server refuses it (422): the reason shows on its row.
    const x = await page.getByTestId('load-0-x').inputValue()
    await page.getByTestId('load-0-x').fill('6000')
    await page.getByTestId('load-0-x').press('Enter')
    await page.getByTestId('run').click()
    await expect(page.getByTestId('load-0-error').textContent()).resolves.toMatch(/beyond ±5000 m of the site origin/)
    await page.getByTestId('undo').click()
    await expect.poll(() => page.getByTestId('load-0-x').inputValue()).toBe(x)

    // A reload keeps the draft (the tab's session).
    await page.getByTestId('run-name').press('Tab')
    await page.reload()
    await page.getByTestId('load-row-0').waitFor()
    expect(await page.getByTestId('run-name').inputValue()).toBe('Yard embankment, drawn')
    expect(await page.getByTestId('point-row-1').count()).toBe(1)

    await shoot(page, 'settlement-editor')

    await page.getByTestId('run').click()
    await page.waitForURL(/\/settlement\/[0-9a-f-]{36}$/)
    const runId = page.url().split('/').pop()!
    const { run } = await must('reading the run', people.designer.get<{ run: SettlementRun }>(`/api/projects/${projectId}/settlement-runs/${runId}`))
    expect(run.name).toBe('Yard embankment, drawn')
    expect(run.loads).toHaveLength(1)
    expect(run.loads[0]).toMatchObject({ type: 'embankment', height: 6, sideSlope: 2, unitWeight: 20, crestWidth })
    expect(run.points.map(p => p.label)).toEqual(['P1', 'P2'])
    expect(run.model).toMatchObject({ modelName: 'Yard model', version: 1, status: 'approved' })
    expect(run.grid).toEqual({ spacing: 5, margin: 10 })

    // The run's page: done (or its progress until then), the contour map, a point's sublayers, the workbook.
    await page.locator('[data-testid="run-progress"], [data-testid="run-status-finished"]').first().waitFor()
    await page.getByTestId('run-status-finished').first().waitFor({ timeout: 30_000 })
    await page.getByTestId('contour-band').first().waitFor()
    const table = page.getByTestId('sublayer-table')
    // The sublayer table is built once it comes near the screen.
    await page.getByTestId('sublayer-box').scrollIntoViewIfNeeded()
    await table.waitFor()
    expect(await table.getByTestId('sublayer-row').count()).toBeGreaterThan(10)
    await screenshot(page, 'settlement-editor-run-laptop')
    const xlsxHref = await page.getByTestId('export-xlsx').getAttribute('href')

    // Run again with changes: the editor opens with this run's inputs.
    await page.getByTestId('run-again').click()
    await page.waitForURL(/\/settlement\/new\?from=/)
    await page.getByTestId('from-run-note').waitFor()
    await expect.poll(() => page.getByTestId('run-name').inputValue()).toBe('Yard embankment, drawn (changed)')
    expect(await page.getByTestId('load-type-0').inputValue()).toBe('embankment')
    expect(await page.getByTestId('load-0-crestWidth').inputValue()).toBe(String(crestWidth))
    expect(await page.getByTestId('point-row-1').count()).toBe(1)
    expect(await page.getByTestId('grid-on').isChecked()).toBe(true)

    // The run's workbook downloads.
    const xlsx = await page.request.get(`${baseUrl()}${xlsxHref}`)
    expect(xlsx.status()).toBe(200)
    expect(xlsx.headers()['content-type']).toContain('spreadsheetml')
    await page.close()
  })

  it('a project in US units takes feet and psf in the table and keeps SI in the draft', async () => {
    const us = await createProject(people.owner, 'E2E-RUN-US', 'Run editor in US units (browser)', ['designer'], { unitSystem: 'US' })
    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.route('**/api/projects/*/events', route => route.abort())
    await page.goto(`${baseUrl()}/projects/${us.id}/settlement/new`)
    await page.locator('[data-testid="run-editor"][data-ready="yes"]').waitFor()
    await page.getByTestId('table-add-rectangle').click()
    await page.getByTestId('load-row-0').waitFor()
    expect(await page.getByTestId('load-row-0').getByText('Width').textContent()).toContain('(ft)')
    // The default 20 m is 65.617 ft (1 ft = 0.3048 m exactly, NIST SP 811, 2008, App. B.8).
    expect(await page.getByTestId('load-0-width').inputValue()).toBe('65.617')
    await page.getByTestId('load-0-width').fill('100')
    await page.getByTestId('load-0-width').press('Enter')
    await page.getByTestId('load-0-pressure').fill('2000')
    await page.getByTestId('load-0-pressure').press('Enter')
    await expect.poll(() => page.getByTestId('load-pressure-0').textContent()).toBe('q = 2000 psf')
    const kept = await page.evaluate(id => JSON.parse(sessionStorage.getItem(`pastload.settlement-draft.v1:${id}`) ?? 'null'), us.id) as { draft: { loads: { width: number, pressure: number }[] } }
    expect(kept.draft.loads[0]!.width).toBeCloseTo(30.48, 9)
    // 1 psf = 0.047880 kPa.
    expect(kept.draft.loads[0]!.pressure).toBeCloseTo(95.76, 2)
    await page.close()
  })

  it('a field geologist sees the editor read-only, without the Run button', async () => {
    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.route('**/api/projects/*/events', route => route.abort())
    await page.goto(`${baseUrl()}/projects/${projectId}/settlement/new`)
    await page.getByTestId('read-only-note').waitFor()
    expect(await page.getByTestId('run').count()).toBe(0)
    expect(await page.getByTestId('draw-tools').count()).toBe(0)
    await page.close()
  })
})
