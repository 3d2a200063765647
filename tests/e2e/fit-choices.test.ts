// Fits that cannot mislead, in Chromium: the trend model chosen belongs to its stratum (another
// stratum starts at the best by AICc), points leave a fit and come back with the keyboard, a fit
// with problems is marked on its band and saved only with a reason, two versions compare in
// words, a note from one stratum never shows under another, and the caution appears once.
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { RESULT_CAUTION } from '../../shared/caution'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { screenshot, useProjectAs } from './helpers'

interface ModelRow { id: string, version: number, draft: SiteModelDefinition }

const CRUST = 1
const EST = 2
const GLAC = 3

async function pickBand(page: Page, band: number, code: string) {
  await page.getByTestId('band-select').selectOption(String(band))
  await page.getByTestId('fit-panel').and(page.locator(`[data-code="${code}"]`)).waitFor()
}

/** The model chosen in the panel's select (its value) and the words shown for it. */
async function chosen(page: Page): Promise<{ value: string, label: string }> {
  const select = page.getByTestId('fit-model')
  return { value: await select.inputValue(), label: (await select.locator('option:checked').textContent()) ?? '' }
}

describe('fits that cannot mislead, in Chromium', () => {
  const project = useProjectAs('engineer', 'E2E-FIT')

  async function newModel(suffix: string): Promise<ModelRow> {
    const created = await project.client.post<{ model: ModelRow }>(`/api/projects/${project.projectId}/models`, { name: `Fit checks ${suffix} ${Date.now().toString(36)}` })
    expect(created.status).toBe(201)
    return created.body.model
  }

  async function openModel(modelId: string): Promise<Page> {
    const page = await project.open(`/models/${modelId}`)
    await page.getByTestId('model-workspace').waitFor()
    await expect.poll(async () => Number(await page.getByTestId('point-layer').getAttribute('data-drawn')), { timeout: 20_000 }).toBeGreaterThan(100)
    return page
  }

  it('keeps the model choice with its stratum: EST fitted with constant POP, CRUST then fits with the best by AICc', async () => {
    const model = await newModel('choice')
    const page = await openModel(model.id)
    // The caution once for the page's panels.
    expect(await page.locator('.pl-caution', { hasText: RESULT_CAUTION }).count()).toBe(1)

    await pickBand(page, EST, 'EST')
    expect((await chosen(page)).value).toBe('auto')
    await page.getByTestId('fit-model').selectOption('pop')
    await page.getByTestId('fit-run').click()
    await page.getByTestId('fit-result').and(page.locator('[data-model="pop"]')).waitFor()

    // Another stratum: the best by AICc, never EST's constant POP.
    await pickBand(page, CRUST, 'CRUST')
    expect(await chosen(page)).toEqual({ value: 'auto', label: 'Best by AICc (auto)' })
    await page.getByTestId('fit-run').click()
    const result = page.getByTestId('fit-result')
    await page.getByTestId('fit-panel').and(page.locator('[data-code="CRUST"]')).getByTestId('fit-result').waitFor()
    // The automatic fit says why its model won; a sentence that opens with σ'p keeps it lower-case.
    await expect.poll(async () => (await page.getByTestId('fit-panel').textContent()) ?? '', { timeout: 15_000 }).toContain('fits best, with the lowest AICc')
    expect((await page.getByTestId('fit-panel').textContent()) ?? '').not.toContain('Σ\'p')
    const crustModel = await result.getAttribute('data-model')
    const saved = (await project.client.get<{ model: ModelRow }>(`/api/projects/${project.projectId}/models/${model.id}`)).body.model
    expect(saved.version).toBe(model.version) // nothing saved yet: the trends live in the session
    // CRUST stays "best by AICc" for its next fit, whatever model won.
    expect((await chosen(page)).value).toBe('auto')
    expect(crustModel).toBeTruthy()
    await screenshot(page, 'fit-choice-crust-auto')

    // Back in EST its own choice is there.
    await pickBand(page, EST, 'EST')
    expect((await chosen(page)).value).toBe('pop')
    await page.close()
  })

  it('leaves a point out of the fit and takes it back with the keyboard', async () => {
    const model = await newModel('keyboard')
    const page = await openModel(model.id)
    await pickBand(page, EST, 'EST')
    await page.getByTestId('fit-model').selectOption('pop')
    await page.getByTestId('fit-run').click()
    const result = page.getByTestId('fit-result')
    await result.and(page.locator('[data-model="pop"]')).waitFor()
    const n = Number(await result.getAttribute('data-n'))
    const list = page.getByTestId('point-checklist')
    const included = Number(await list.getAttribute('data-included'))
    expect(included).toBe(n)

    // Open the list from the keyboard, Tab into it, move with the arrows, Space to leave the point out.
    await list.locator('summary').focus()
    await page.keyboard.press('Enter')
    await page.keyboard.press('Tab')
    const focusedRow = () => page.evaluate(() => document.activeElement?.getAttribute('data-row') ?? null)
    expect(await focusedRow()).toBe('0')
    await page.keyboard.press('ArrowDown')
    await page.keyboard.press('ArrowDown')
    expect(await focusedRow()).toBe('2')
    const id = await page.evaluate(() => document.activeElement?.getAttribute('data-point-id') ?? '')
    expect(id).not.toBe('')
    await page.keyboard.press('Space')
    await expect.poll(async () => Number(await list.getAttribute('data-included'))).toBe(included - 1)
    await expect.poll(async () => Number(await result.getAttribute('data-n'))).toBe(n - 1)
    expect(await page.locator(`[data-testid="point-check"][data-point-id="${id}"]`).isChecked()).toBe(false)
    await screenshot(page, 'fit-keyboard-left-out')
    // ArrowUp and back down to the same point; Space takes it back.
    await page.keyboard.press('ArrowUp')
    expect(await focusedRow()).toBe('1')
    await page.keyboard.press('ArrowDown')
    await page.keyboard.press('Space')
    await expect.poll(async () => Number(await result.getAttribute('data-n'))).toBe(n)
    expect(Number(await list.getAttribute('data-included'))).toBe(included)
    await page.close()
  })

  it('shows the GLAC compressibility note under GLAC only', async () => {
    const model = await newModel('note')
    const page = await openModel(model.id)
    for (const [band, code] of [[EST, 'EST'], [GLAC, 'GLAC']] as const) {
      await pickBand(page, band, code)
      const compressible = page.getByTestId('band-compressible')
      if (!(await compressible.isChecked())) await compressible.check()
    }
    await page.getByTestId('compressibility-from-tests').click()
    const note = page.getByTestId('compressibility-note')
    await note.waitFor()
    expect(await note.textContent()).toContain('in GLAC')
    await pickBand(page, EST, 'EST')
    expect(await page.getByTestId('compressibility-note').count()).toBe(0)
    await screenshot(page, 'fit-note-own-stratum')
    await pickBand(page, GLAC, 'GLAC')
    expect(await page.getByTestId('compressibility-note').textContent()).toContain('in GLAC')
    await page.close()
  })

  it('marks a trend that could mislead, saves it only with a reason, and compares the versions in words', async () => {
    const model = await newModel('problem')
    // EST with constant POP −5 kPa and R² −0.30: σ'p below σ'v0 throughout its stratum.
    const draft = structuredClone(model.draft)
    draft.strata[EST]!.trend = { model: 'pop', logSpace: false, parameters: { pop: -5 }, n: 20, r2: -0.3, rmse: 9, aic: 40, aicc: 42, includedPointIds: [], excludedPointIds: [] }
    const put = await project.client.request<{ model: ModelRow }>('PUT', `/api/projects/${project.projectId}/models/${model.id}/draft`, { draft, version: model.version })
    expect(put.status).toBe(200)
    const page = await openModel(model.id)
    await pickBand(page, EST, 'EST')
    const mark = page.getByTestId(`trend-problem-${EST}`)
    await mark.waitFor()
    expect(await mark.getAttribute('data-open')).toBe('true')
    expect(await mark.textContent()).toContain('Check the trend')
    const problems = page.getByTestId('fit-problems')
    expect(await problems.locator('[data-problem]').evaluateAll(els => els.map(e => e.getAttribute('data-problem')))).toEqual(['negative-r2', 'below-effective-stress'])
    expect(await problems.textContent()).toContain('This trend could mislead')
    await screenshot(page, 'fit-problem-marked')

    // Not saved silently: the server names the problem.
    await page.getByTestId('version-message').fill('EST with the negative POP')
    await page.getByTestId('save-version').click()
    const message = page.getByTestId('session-message')
    await message.waitFor()
    expect(await message.textContent()).toContain('The σ\'p trend of EST needs a look before it is saved')
    expect(await page.getByTestId('version-row-1').count()).toBe(0)

    // With a reason it is kept, and the version records the reason.
    const reason = 'Underconsolidated under the recent fill: the piezometers still read excess pore pressure.'
    await page.getByTestId('fit-keep-reason').fill(reason)
    await expect.poll(() => mark.getAttribute('data-open')).toBe('false')
    await page.getByTestId('save-version').click()
    await page.getByTestId('version-row-1').waitFor()
    const v1 = (await project.client.get<{ version: { definition: SiteModelDefinition } }>(`/api/projects/${project.projectId}/models/${model.id}/versions/1`)).body.version
    expect(v1.definition.strata[EST]!.trend!.acceptedDespite).toEqual({ problems: ['negative-r2', 'below-effective-stress'], reason })
    await screenshot(page, 'fit-problem-kept-with-reason')

    // Nothing changed since version 1: refused in plain words.
    await page.getByTestId('version-message').fill('Same again')
    await page.getByTestId('save-version').click()
    await expect.poll(async () => (await page.getByTestId('session-message').textContent()) ?? '').toContain('Nothing changed since version 1')

    // The water table moved, saved as version 2, compared in words.
    await page.getByTestId('water-table-input').fill('1.75')
    await page.getByTestId('water-table-input').press('Enter')
    await page.getByTestId('version-message').fill('Water table at 1.75 m')
    await page.getByTestId('save-version').click()
    await page.getByTestId('version-row-2').waitFor()
    await page.goto(project.url(`/models/${model.id}/compare?a=1&b=2`))
    const summary = page.getByTestId('compare-summary')
    await summary.waitFor()
    const lines = await summary.locator('li').allTextContents()
    expect(lines).toEqual([`water table ${model.draft.groundwater.waterTableDepth.toFixed(2)} → 1.75 m`])
    await screenshot(page, 'fit-compare-in-words')
    await page.close()
  })
})
