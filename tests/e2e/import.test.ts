import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { demoImportErrors } from '../../shared/demo/import-examples'
import { useDemoCopy } from '../helpers/demo-project'
import { baseUrl, demoEmail, demoProjectId, signIn } from '../helpers/http'
import { screenshot, signInAs, useBrowser } from './helpers'

describe('import page in Chromium', () => {
  const browser = useBrowser()
  // The upload is stored with the project: the geologist's test works in a copy of the demo site of this file's own.
  const copy = useDemoCopy('E2E-IMP')

  it('the geologist uploads the example file, maps it, and sees each deliberate error with its row', async () => {
    const projectId = copy.id
    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.goto(`${baseUrl()}/projects/${projectId}/import`)
    const file = resolve(import.meta.dirname, '../../docs/examples/saltmarsh-lane-intervals-with-errors.csv')
    await page.getByTestId('import-file').setInputFiles(file)
    await page.getByTestId('import-mapping').waitFor()
    // The headers map themselves onto the interval fields.
    expect(await page.locator('#map-top').inputValue()).toBe('top')
    expect(await page.locator('#map-uscs').inputValue()).toBe('uscs')
    await screenshot(page, 'import-mapping')
    await page.getByTestId('import-check').click()
    const report = page.getByTestId('import-report')
    await report.waitFor()
    const rows = await report.locator('tbody tr td:first-child').allTextContents()
    expect(rows.map(r => Number(r.trim()))).toEqual(demoImportErrors().map(e => e.row))
    await screenshot(page, 'import-report')
    expect(readFileSync(file, 'utf8').length).toBeGreaterThan(100)
    await page.close()
  })

  it('a designer sees that the role cannot import', async () => {
    const projectId = await demoProjectId(await signIn(demoEmail('designer')))
    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.goto(`${baseUrl()}/projects/${projectId}/import`)
    await page.getByText('Your role can read this project').waitFor()
    expect(await page.getByTestId('import-file').count()).toBe(0)
    await page.close()
  })
})

describe('a CPT file on a US project in Chromium', () => {
  const browser = useBrowser()
  const copy = useDemoCopy('E2E-IMP-US')

  it('reads cone readings whose headings name no unit as tsf and psi, and says so beside each column', async () => {
    const owner = await signIn(demoEmail('owner'))
    expect((await owner.patch(`/api/projects/${copy.id}`, { unitSystem: 'US', usStressUnit: 'psf' })).status).toBe(200)
    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.goto(`${baseUrl()}/projects/${copy.id}/import?target=cpt`)
    const csv = 'Depth (ft),qc,fs (MPa),u2\n1.0,10.5,0.05,2.1\n1.5,11.0,0.06,2.4\n'
    await page.getByTestId('import-file').setInputFiles({ name: 'cone-us.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) })
    await page.getByTestId('import-mapping').waitFor()
    await page.getByTestId('cone-unit-note').waitFor()
    expect(await page.getByTestId('unit-depth').inputValue()).toBe('ft')
    expect(await page.getByTestId('unit-qc').inputValue()).toBe('tsf')
    expect(await page.getByTestId('unit-fs').inputValue()).toBe('MPa')
    expect(await page.getByTestId('unit-u2').inputValue()).toBe('psi')
    expect(await page.getByTestId('unit-source-qc').textContent()).toBe('not in the heading: assumed')
    expect(await page.getByTestId('unit-source-fs').textContent()).toBe('named in the heading')
    // Another unit can be chosen per column.
    await page.getByTestId('unit-qc').selectOption('MPa')
    expect(await page.getByTestId('unit-source-qc').textContent()).toBe('your choice')
    await screenshot(page, 'import-cpt-us-units')
    await page.close()
  })
})
