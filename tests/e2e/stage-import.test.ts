import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { DEMO_STAGES_TEST, demoStagesExample } from '../../shared/demo/import-examples'
import { useDemoCopy } from '../helpers/demo-project'
import { baseUrl, demoEmail, signIn } from '../helpers/http'
import { screenshot, signInAs, useBrowser } from './helpers'

interface Stage { stress: number, entered: number, voidRatio: number, readings?: { minutes: number, dial: number }[] }
interface TestJson { id: string, label: string, version: number, convention: string, stages: Stage[] }
interface Adoption { method: string, value: number, reason: string }

describe('oedometer stage upload in Chromium', () => {
  const browser = useBrowser()
  // Replacing stages writes: a copy of the demo site of this file's own.
  const copy = useDemoCopy('E2E-STG')

  it('the engineer replaces a demo test\'s stages from the example sheet, checks the preview, commits, and the test page draws the new curve', async () => {
    const api = await signIn(demoEmail('engineer'))
    const labBase = `/api/projects/${copy.id}/tests/oedometer`
    const example = demoStagesExample()
    const list = await api.get<{ tests: { id: string, point: { identifier: string }, sample: { identifier: string } }[] }>(labBase)
    const listed = list.body.tests.find(t => t.point.identifier === DEMO_STAGES_TEST.point && t.sample.identifier === example.sample)!
    expect(listed).toBeDefined()
    const original = (await api.get<{ test: TestJson, adoption: Adoption | null }>(`${labBase}/${listed.id}`)).body
    expect(original.test.convention).toBe('void-ratio')
    expect(original.test.stages).toHaveLength(example.stages.length - 1)

    const page = await signInAs(browser.context, demoEmail('engineer'))
    try {
      await page.goto(`${baseUrl()}/projects/${copy.id}/tests/oedometer/${listed.id}`)
      await page.getByTestId('test-heading').waitFor()
      await page.getByTestId('upload-stages').click()
      await page.getByTestId('import-file').waitFor({ state: 'attached' })
      await page.getByTestId('import-file').setInputFiles(resolve(import.meta.dirname, '../../docs/examples/saltmarsh-lane-oedometer-stages.csv'))
      await page.getByTestId('import-mapping').waitFor()
      // The link chose the target and the test; the strain column sets the convention.
      expect(await page.getByTestId('import-target').inputValue()).toBe('oedometer-stages')
      await expect.poll(() => page.getByTestId('import-test').inputValue()).toBe(listed.id)
      expect(await page.locator('#map-stress').inputValue()).toBe('effective stress (kPa)')
      expect(await page.locator('#map-strain').inputValue()).toBe('strain (%)')
      expect(await page.getByTestId('import-stage-convention').textContent()).toBe('Strain ε (%)')
      expect(await page.getByTestId('import-stage-note').textContent()).toContain(`replaces the ${original.test.stages.length} stages of ${original.test.label}`)
      expect(await page.locator('table[aria-label="First rows of the file"] tbody tr').count()).toBe(example.stages.length)
      await screenshot(page, 'stage-import-preview')

      await page.getByTestId('import-check').click()
      await page.getByTestId('import-done').filter({ hasText: 'No problems found' }).waitFor()
      expect(await page.getByTestId('import-done').textContent()).toContain(`${example.stages.length} stages ready to replace those of ${original.test.label}`)
      await page.getByTestId('import-commit').click()
      await page.getByTestId('import-done').filter({ hasText: 'Replaced the stages' }).waitFor()
      await screenshot(page, 'stage-import-done')

      await page.getByTestId('import-open-test').click()
      await page.getByTestId('test-heading').waitFor()
      const plot = page.getByTestId('compression-plot')
      // One reading per stage on the e–log σ' plot, the final unloading stage included.
      await expect.poll(() => plot.locator('svg').first().locator('circle.reading').count()).toBe(example.stages.length)
      expect(await page.locator('dl').first().textContent()).toContain('Strain ε (%)')
      await page.locator('[data-construction]').first().waitFor()
      await screenshot(page, 'stage-import-test-page')

      const saved = (await api.get<{ test: TestJson }>(`${labBase}/${listed.id}`)).body.test
      expect(saved.version).toBe(original.test.version + 1)
      expect(saved.convention).toBe('strain')
      expect(saved.stages.map(s => [s.stress, s.entered])).toEqual(example.stages.map(s => [s.stress, s.strain]))
      // The readings of the demo stages stay: every one kept its place and its σ'.
      original.test.stages.forEach((s, i) => expect(saved.stages[i]!.readings).toEqual(s.readings))
    }
    finally {
      await page.close()
    }
  })
})
