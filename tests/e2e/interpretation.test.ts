import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import type { ProjectRole } from '../../shared/auth/roles'
import { useDemoCopy } from '../helpers/demo-project'
import { demoEmail, signIn } from '../helpers/http'
import { createPoint, createProject, must } from '../helpers/project'
import { asDial, bilinearCurve, ESTUARINE, testBody } from '../helpers/lab'
import { openProjectAs, screenshot, SCREENSHOTS, useBrowser } from './helpers'

const STAGE_LABEL = 'Compression Δh (mm)'

/** A project of the test's own with `member`, made by the owner: one borehole (10 m) holding one tube sample. */
async function projectWithSample(tag: string, name: string, member: ProjectRole, point: string, sample: { identifier: string, top: number, bottom: number }) {
  const owner = await signIn(demoEmail('owner'))
  const { id: projectId } = await createProject(owner, tag, name, [member])
  const pointId = await createPoint(owner, projectId, { identifier: point, groundElevation: 1, finalDepth: 10 })
  const created = await must('sample', owner.post<{ sample: { id: string } }>(`/api/projects/${projectId}/points/${pointId}/samples`, { ...sample, type: 'thin-walled-tube' }), 201)
  return { owner, projectId, sampleId: created.sample.id }
}
/** Sample-quality classes as the pages name them (Lunne, Berre & Strandvik 1997). */
const QUALITY: Record<string, string> = { 'very-good-to-excellent': 'Very good to excellent', 'good-to-fair': 'Good to fair', 'poor': 'Poor', 'very-poor': 'Very poor' }

interface ListedTest { id: string, label: string, point: { identifier: string }, sample: { identifier: string }, adoption: { id: string, value: number } | null, reading: { casagrande: number | null, qualityClass: string | null } }

describe('oedometer interpretation in Chromium', () => {
  const browser = useBrowser()
  // Adopting writes: the first test works in a copy of the demo site of this file's own.
  const copy = useDemoCopy('E2E-OED')

  it('the engineer opens a demo test, sees the four constructions, adopts with a reason, and finds the point in the σ\'p data list', async () => {
    const api = await signIn(demoEmail('engineer'))
    const projectId = copy.id
    const list = await api.get<{ tests: ListedTest[] }>(`/api/projects/${projectId}/tests/oedometer`)
    expect(list.body.tests).toHaveLength(14)
    // A test the demo engineer already adopted, so the two disturbed ones stay open for the reviewer.
    const target = list.body.tests.find(t => t.adoption && t.point.identifier === 'BH-02' && t.reading.casagrande !== null)!
    expect(target).toBeDefined()

    const page = await openProjectAs(browser.context, 'engineer', projectId, '/tests')
    await page.getByTestId('tests-table').waitFor()
    expect(await page.locator('[data-testid="tests-table"] tbody tr').count()).toBe(14)
    // Every row carries its sample-quality badge; the two disturbed specimens class as very poor.
    expect(await page.locator('[data-testid="tests-table"] [data-quality]').count()).toBe(14)
    expect(await page.locator('[data-testid="tests-table"] [data-quality="very-poor"]').count()).toBe(2)
    await screenshot(page, 'lab-tests-list')

    await page.getByRole('link', { name: target.label, exact: true }).click()
    await page.getByTestId('method-table').waitFor()
    await page.locator('[data-construction]').nth(3).waitFor()
    const groups = await page.locator('[data-construction]').evaluateAll(els => els.map(e => e.getAttribute('data-construction')))
    expect(groups.sort()).toEqual(['bilinear', 'casagrande', 'pachecoSilva', 'work'])
    // Each construction in its own colour.
    const colours = await page.locator('[data-construction]').evaluateAll(els => els.map(e => e.getAttribute('stroke')))
    expect(new Set(colours).size).toBe(4)
    expect(await page.getByTestId('sigma-v0').count()).toBe(1)
    expect(await page.getByTestId('quality-heading').textContent()).toContain(QUALITY[target.reading.qualityClass ?? ''] ?? 'Not assessed')
    expect(await page.getByTestId('caution').textContent()).toContain('licensed engineer')
    expect(await page.getByTestId('time-curves').textContent()).toContain('cv')
    await screenshot(page, 'lab-interpretation')
    await page.getByTestId('compression-plot').screenshot({ path: join(SCREENSHOTS, 'lab-interpretation-plot.png') })
    await page.getByTestId('zoom-toggle').click()
    expect(await page.locator('[data-construction]').count()).toBe(4)
    await page.getByTestId('compression-plot').screenshot({ path: join(SCREENSHOTS, 'lab-interpretation-plot-zoom.png') })
    await page.getByTestId('zoom-toggle').click()

    // The strain view redraws the same four constructions.
    await page.getByTestId('strain-toggle').click()
    await page.getByText('Vertical strain ε (%)').waitFor()
    expect(await page.locator('[data-construction]').count()).toBe(4)
    await screenshot(page, 'lab-interpretation-strain')

    // Adopt Pacheco Silva by clicking its row, with a reason.
    await page.locator('[data-testid="method-table"] tr[data-method="pachecoSilva"]').click()
    expect(await page.getByTestId('adopt-candidate').textContent()).toContain('Pacheco Silva')
    await page.getByTestId('adopt-submit').click()
    await page.getByText('Reason: a reason of at least 3 characters is required').waitFor()
    await page.getByLabel('Reason (required)').fill('Pacheco Silva sits on the sharpest part of the bend; reviewed with the CPT nearby.')
    await page.getByTestId('adopt-submit').click()
    await page.locator('[data-testid="current-adoption"]', { hasText: 'Pacheco Silva' }).waitFor()
    expect(await page.locator('[data-testid="adoption-history"] li').count()).toBe(2)

    // Then drag the marker on the plot and adopt the value read from it.
    await page.getByTestId('place-marker').click()
    const surface = await page.getByTestId('plot-surface').boundingBox()
    const handle = await page.locator('[data-testid="drag-marker"] circle').boundingBox()
    expect(surface && handle).toBeTruthy()
    await page.mouse.move(handle!.x + handle!.width / 2, handle!.y + handle!.height / 2)
    await page.mouse.down()
    await page.mouse.move(handle!.x + 40, surface!.y + surface!.height / 2, { steps: 6 })
    await page.mouse.up()
    const candidate = await page.getByTestId('adopt-candidate').textContent()
    expect(candidate).toContain('Marker on the plot')
    const dragged = Number(/([\d.]+) kPa/.exec(candidate ?? '')![1])
    expect(dragged).toBeGreaterThan(0)
    await page.getByLabel('Reason (required)').fill('Read at the end of the bend on the plot.')
    await page.getByTestId('adopt-submit').click()
    await page.locator('[data-testid="current-adoption"]', { hasText: 'Marker on the plot' }).waitFor()
    expect(await page.locator('[data-testid="adoption-history"] li').count()).toBe(3)
    await page.getByTestId('adopted-line').waitFor()
    await screenshot(page, 'lab-interpretation-adopted')

    const after = await api.get<{ adoption: { id: string, value: number, method: string } }>(`/api/projects/${projectId}/tests/oedometer/${target.id}/adoptions`)
    expect(after.body.adoption.method).toBe('dragged')
    expect(after.body.adoption.value).toBe(dragged)

    // The adopted value is a point of the σ'p data list, with its quality.
    await page.getByRole('link', { name: 'σ\'p data' }).click()
    await page.getByTestId('points-table').waitFor()
    const row = page.locator(`[data-testid="points-table"] tr[data-id="${after.body.adoption.id}"]`)
    await row.waitFor()
    const text = await row.textContent()
    expect(text).toContain(target.point.identifier)
    expect(text).toContain(dragged.toFixed(1))
    expect(text).toContain('Marker on the plot')
    expect(text).toContain(QUALITY[target.reading.qualityClass ?? ''] ?? 'Not assessed')
    await screenshot(page, 'lab-sigma-p-data-all')
    await page.getByRole('region', { name: 'σ\'p against depth' }).screenshot({ path: join(SCREENSHOTS, 'lab-sigma-p-scatter.png') })
    // Filter to lab points only: 12 adopted oedometer values.
    await page.getByTestId('source-cpt').uncheck()
    await page.getByTestId('source-vane').uncheck()
    expect(await page.locator('[data-testid="points-table"] tbody tr').count()).toBe(12)
    await screenshot(page, 'lab-sigma-p-data')
    await page.close()
  })

  it('a curve with no yield shows the engine\'s reason instead of constructions', async () => {
    const { owner, projectId, sampleId } = await projectWithSample('E2E-LAB', 'No-yield check', 'engineer', 'BH-X', { identifier: 'U1', top: 3, bottom: 3.5 })
    const body = testBody(sampleId, 'OED-NY')
    body.stages = body.stages.map(st => ({ stress: st.stress, value: 2.1 - 0.3 * Math.log10(st.stress / 10) }))
    const t = await owner.post<{ test: { id: string } }>(`/api/projects/${projectId}/tests/oedometer`, body)
    expect(t.status).toBe(201)

    const page = await openProjectAs(browser.context, 'engineer', projectId, `/tests/oedometer/${t.body.test.id}`)
    const error = page.getByTestId('interpretation-error')
    await error.waitFor()
    expect(await error.textContent()).toContain('no yield')
    await page.getByTestId('compression-plot').waitFor()
    expect(await page.locator('[data-construction]').count()).toBe(0)
    expect(await page.locator('.lab-plot circle.reading').count()).toBe(9)
    await screenshot(page, 'lab-no-yield')
    await page.close()
  })

  it('a geologist adds a test by pasting compression readings from a spreadsheet, previewed before it is saved', async () => {
    const { projectId } = await projectWithSample('E2E-PASTE', 'Paste check', 'geologist', 'BH-P', { identifier: 'U3', top: 4.5, bottom: 5 })

    const page = await openProjectAs(browser.context, 'geologist', projectId, '/tests')
    await page.getByTestId('new-test').click()
    await page.getByLabel('Point', { exact: true }).selectOption({ label: 'BH-P' })
    await page.getByLabel('Sample', { exact: true }).selectOption({ label: 'U3 · 4.50–5.00 m' })
    await page.getByLabel('Label', { exact: true }).fill('OED-P1')
    await page.getByLabel('Initial water content w (%)').fill('79')
    await page.getByLabel('Specific gravity Gs').fill('2.66')
    await page.getByLabel(STAGE_LABEL, { exact: true }).check()
    // Compression in mm of a 20 mm specimen, as a spreadsheet puts it on the clipboard (header, tabs, decimal commas).
    const rows = asDial(bilinearCurve(ESTUARINE, 80), 2.1014, 20).map(r => `${r.stress}\t${r.value.toFixed(4).replace('.', ',')}`)
    await page.getByTestId('stage-paste').fill(['Stress (kPa)\tCompression (mm)', ...rows].join('\n'))
    await page.getByTestId('stage-preview').waitFor()
    expect(await page.locator('[data-testid="stage-preview"] tbody tr').count()).toBe(9)
    expect(await page.getByText('e0 = Gs·w/100 = 2.101, assuming a saturated specimen (S = 1).').count()).toBe(1)
    await screenshot(page, 'lab-test-form')
    await page.getByRole('button', { name: 'Add the test' }).click()
    await page.getByTestId('method-table').waitFor()
    await page.locator('[data-construction]').nth(3).waitFor()
    expect(await page.getByTestId('test-heading').textContent()).toContain('OED-P1')
    // A geologist writes tests but does not adopt σ'p.
    expect(await page.getByTestId('adopt-form').count()).toBe(0)
    await screenshot(page, 'lab-interpretation-geologist')
    await page.close()
  })
})
