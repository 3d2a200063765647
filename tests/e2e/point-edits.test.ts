// The point page's edits in Chromium: the header's details, a sample's depths and
// a vane reading, each versioned (a stale save shows both sides) and checked at
// the field; a viewer sees none of the edit controls.
import { beforeEach, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { baseUrl, demoEmail, signedInDemo, TEST_PASSWORD, useNewAccount } from '../helpers/http'
import { createProject } from '../helpers/project'
import { screenshot, signInAs, useBrowser } from './helpers'

interface Point { identifier: string, groundElevation: number, finalDepth: number, method: string, version: number }
interface Detail { point: Point, samples: { identifier: string, top: number, bottom: number, recovery: number | null, remarks: string }[], vane: { id: string, version: number, depth: number, peak: number, remoulded: number | null }[] }

describe('editing a point, its samples and its vane readings in Chromium', () => {
  const browser = useBrowser()
  const { owner: admin, geologist } = signedInDemo('owner', 'geologist')
  let projectId = ''
  let pointId = ''
  const viewer = useNewAccount(admin, 'editviewer')

  const api = () => `/api/projects/${projectId}/points/${pointId}`
  const detail = async () => (await geologist.get<Detail>(api())).body
  /** The point's page for one account, once its facts are drawn. */
  async function openPoint(email: string, password?: string) {
    const page = await signInAs(browser.context, email, password)
    await page.goto(`${baseUrl()}/projects/${projectId}/points/${pointId}`)
    await page.getByTestId('point-facts').waitFor()
    return page
  }
  /** Sample U-1's edit form, opened from its row. */
  async function editSampleU1(page: Page) {
    await page.getByRole('button', { name: 'Edit sample U-1' }).click()
    return page.getByTestId('sample-edit-form')
  }
  const fact = (page: Page, label: string) => page.getByTestId('point-facts').locator('div').filter({ has: page.locator('dt', { hasText: label }) }).locator('dd')

  // Every test edits a project and a point of its own: WS-E1 with sample U-1 (4.00–4.45 m), an SPT at 9 m and a vane reading at 5 m.
  beforeEach(async () => {
    projectId = (await createProject(admin, 'TRN-EDIT', 'Saltmarsh Lane edits trial', ['geologist', { email: viewer.email, role: 'viewer' }])).id
    const pt = await geologist.post<{ point: { id: string } }>(`/api/projects/${projectId}/points`, {
      identifier: 'WS-E1', kind: 'borehole', easting: 22, northing: 31, groundElevation: 3.1, finalDepth: 15, startedOn: '2026-03-09', endedOn: '2026-03-09', method: 'Window sampler', loggedBy: 'A. Ferreira',
    })
    expect(pt.status).toBe(201)
    pointId = pt.body.point.id
    expect((await geologist.post(`${api()}/samples`, { identifier: 'U-1', top: 4, bottom: 4.45, type: 'thin-walled-tube', recovery: 90 })).status).toBe(201)
    expect((await geologist.post(`${api()}/spt`, { depth: 9, blows: [1, 2, 2] })).status).toBe(201)
    expect((await geologist.post(`${api()}/vane`, { depth: 5, peak: 18, remoulded: 6 })).status).toBe(201)
  })

  it('the geologist edits the ground elevation and method, saves, and sees them after a reload', async () => {
    const page = await openPoint(demoEmail('geologist'))
    await page.getByTestId('point-edit').click()
    const form = page.getByTestId('point-header-form')
    await form.getByLabel('Ground elevation (m)').fill('3.45')
    await form.getByLabel('Method').fill('Rotary cored')
    await screenshot(page, 'point-header-edit')
    await page.getByTestId('point-header-save').click()
    await page.getByTestId('point-header-notice').filter({ hasText: 'Saved the details of WS-E1.' }).waitFor()
    await page.reload()
    await page.getByTestId('point-facts').waitFor()
    expect(await fact(page, 'Ground elevation').textContent()).toBe('3.45 m')
    expect(await fact(page, 'Method').textContent()).toBe('Rotary cored')
    expect(await fact(page, 'Base elevation').textContent()).toBe('-11.55 m')
    const saved = (await detail()).point
    expect(saved).toMatchObject({ groundElevation: 3.45, method: 'Rotary cored', finalDepth: 15, loggedBy: 'A. Ferreira' })
    await page.close()
  })

  it('a final depth above the deepest SPT is refused at the field, and a used identifier too', async () => {
    expect((await geologist.post(`/api/projects/${projectId}/points`, { identifier: 'WS-E2', kind: 'borehole', easting: 40, northing: 31, groundElevation: 3, finalDepth: 6 })).status).toBe(201)
    const page = await openPoint(demoEmail('geologist'))
    await page.getByTestId('point-edit').click()
    const form = page.getByTestId('point-header-form')
    await form.getByLabel('Final depth (m)').fill('8')
    await page.getByTestId('point-header-save').click()
    const depthError = form.getByText('Final depth must be at least 9 m: the deepest SPT is at 9 m.')
    await depthError.waitFor()
    expect(await form.getByLabel('Final depth (m)').getAttribute('aria-invalid')).toBe('true')
    await screenshot(page, 'point-header-final-depth-refused')
    await form.getByLabel('Final depth (m)').fill('15')
    await form.getByLabel('Identifier').fill('WS-E2')
    await page.getByTestId('point-header-save').click()
    await form.getByText('Identifier is already used by another point in this project').waitFor()
    expect(await depthError.count()).toBe(0)
    expect((await detail()).point).toMatchObject({ identifier: 'WS-E1', finalDepth: 15 })
    await form.getByRole('button', { name: 'Cancel' }).click()
    await page.getByTestId('point-facts').waitFor()
    await page.close()
  })

  it('a save that meets a newer header shows both values, and "keep mine" saves over it', async () => {
    const page = await openPoint(demoEmail('geologist'))
    await page.getByTestId('point-edit').click()
    const form = page.getByTestId('point-header-form')
    await form.getByLabel('Logged by').fill('R. Okafor')
    // Someone else saves meanwhile.
    const { version } = (await detail()).point
    expect((await admin.patch(api(), { loggedBy: 'J. Lindqvist', remarks: 'Casing to 2 m', version })).status).toBe(200)
    await page.getByTestId('point-header-save').click()
    const conflict = page.getByTestId('row-conflict')
    await conflict.waitFor()
    expect(await conflict.locator('tr', { hasText: 'Logged by' }).textContent()).toContain('◆ Logged byR. OkaforJ. Lindqvist')
    // Only they changed the remarks: the form took their value, so it is no clash.
    expect(await conflict.locator('tr', { hasText: 'Remarks' }).textContent()).toBe('RemarksCasing to 2 mCasing to 2 m')
    expect(await form.getByLabel('Remarks').inputValue()).toBe('Casing to 2 m')
    await screenshot(page, 'point-header-conflict')
    await page.getByTestId('conflict-keep-mine').click()
    await page.getByTestId('point-header-notice').waitFor()
    expect((await detail()).point).toMatchObject({ loggedBy: 'R. Okafor', remarks: 'Casing to 2 m', version: version + 2 })
    await page.close()
  })

  it('the geologist changes a sample\'s depths and a vane reading, and both read back', async () => {
    const page = await openPoint(demoEmail('geologist'))
    const form = await editSampleU1(page)
    await form.getByLabel('Bottom (m)').fill('15.5')
    await page.getByTestId('sample-save').click()
    await form.getByText('The sample\'s bottom (15.5 m) is below the hole\'s final depth (15 m).').waitFor()
    await form.getByLabel('Top (m)').fill('4.2')
    await form.getByLabel('Bottom (m)').fill('4.7')
    await form.getByLabel('Recovery (%)').fill('85')
    await screenshot(page, 'sample-edit')
    await page.getByTestId('sample-save').click()
    await page.getByText('Sample U-1 saved.').waitFor()
    expect(await page.getByTestId('sample-edit-form').count()).toBe(0)
    await page.reload()
    await page.getByTestId('samples-table').waitFor()
    expect(await page.getByTestId('sample-row').first().textContent()).toContain('4.20–4.70')
    expect((await detail()).samples).toEqual([expect.objectContaining({ identifier: 'U-1', top: 4.2, bottom: 4.7, recovery: 85 })])

    await page.getByRole('tab', { name: /Vane/ }).click()
    await page.getByRole('button', { name: 'Edit vane reading at 5.00 m' }).click()
    await page.getByLabel('Peak (kPa)').fill('21.5')
    await page.getByRole('button', { name: 'Save changes' }).click()
    await page.getByText('Vane reading at 5.00 m updated.').waitFor()
    await page.getByTestId('vane-table').filter({ hasText: '21.5' }).waitFor()
    await screenshot(page, 'vane-edited')
    expect((await detail()).vane).toEqual([expect.objectContaining({ depth: 5, peak: 21.5, remoulded: 6 })])
    await page.close()
  })

  it('a vane reading saved meanwhile shows both sides; "keep mine" saves over it, keeping their other change', async () => {
    const page = await openPoint(demoEmail('geologist'))
    await page.getByRole('tab', { name: /Vane/ }).click()
    await page.getByRole('button', { name: 'Edit vane reading at 5.00 m' }).click()
    await page.getByLabel('Peak (kPa)').fill('22')
    const reading = (await detail()).vane[0]!
    expect((await admin.patch(`${api()}/vane/${reading.id}`, { depth: 5, peak: 21.5, remoulded: 6.5, version: reading.version })).status).toBe(200)
    await page.getByRole('button', { name: 'Save changes' }).click()
    const conflict = page.getByTestId('row-conflict')
    await conflict.waitFor()
    expect(await conflict.locator('tr', { hasText: 'Peak' }).textContent()).toContain('◆')
    // Only they changed the remoulded strength: the form already shows theirs.
    expect(await page.getByLabel('Remoulded (kPa)').inputValue()).toBe('6.5')
    await screenshot(page, 'vane-conflict')
    await conflict.getByTestId('conflict-keep-mine').click()
    await page.getByText('Vane reading at 5.00 m updated.').waitFor()
    expect((await detail()).vane).toEqual([expect.objectContaining({ depth: 5, peak: 22, remoulded: 6.5 })])
    await page.close()
  })

  it('a sample saved meanwhile shows both sides; "use theirs" loads their values to edit again', async () => {
    const page = await openPoint(demoEmail('geologist'))
    const form = await editSampleU1(page)
    await form.getByLabel('Remarks').fill('Slight smell')
    const sample = (await geologist.get<{ samples: { id: string, version: number }[] }>(api())).body.samples[0]!
    expect((await admin.patch(`${api()}/samples/${sample.id}`, { recovery: 70, remarks: 'Cutting shoe damaged', version: sample.version })).status).toBe(200)
    await page.getByTestId('sample-save').click()
    const conflict = form.getByTestId('row-conflict')
    await conflict.waitFor()
    expect(await conflict.locator('tr', { hasText: 'Remarks' }).textContent()).toBe('◆ RemarksSlight smellCutting shoe damaged')
    // Only they changed the recovery: the form already shows it.
    expect(await form.getByLabel('Recovery (%)').inputValue()).toBe('70')
    await screenshot(page, 'sample-conflict')
    await form.getByTestId('conflict-use-theirs').click()
    expect(await form.getByLabel('Remarks').inputValue()).toBe('Cutting shoe damaged')
    await form.getByLabel('Remarks').fill('Cutting shoe damaged; slight smell')
    await page.getByTestId('sample-save').click()
    await page.getByText('Sample U-1 saved.').waitFor()
    expect((await detail()).samples).toEqual([expect.objectContaining({ recovery: 70, remarks: 'Cutting shoe damaged; slight smell', top: 4, bottom: 4.45 })])
    await page.close()
  })

  it('a viewer sees the point, its samples and vane readings without any edit controls', async () => {
    const page = await openPoint(viewer.email, TEST_PASSWORD)
    expect(await fact(page, 'Method').textContent()).toBe('Window sampler')
    expect(await page.getByTestId('point-edit').count()).toBe(0)
    expect(await page.getByTestId('sample-row').count()).toBe(1)
    expect(await page.getByTestId('sample-edit').count()).toBe(0)
    await page.getByRole('tab', { name: /Vane/ }).click()
    expect(await page.getByTestId('vane-table').locator('tbody tr').count()).toBe(1)
    expect(await page.getByRole('button', { name: /^Edit / }).count()).toBe(0)
    expect(await page.getByRole('button', { name: 'Add reading' }).count()).toBe(0)
    await screenshot(page, 'point-viewer')
    await page.close()
  })
})
