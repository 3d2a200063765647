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
