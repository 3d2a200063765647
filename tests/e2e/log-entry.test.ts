import { beforeEach, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { baseUrl, demoEmail, signedInDemo } from '../helpers/http'
import { createProject, createStrata } from '../helpers/project'
import { screenshot, signInAs, useBrowser } from './helpers'

interface Interval { top: number, bottom: number, uscs: string | null, stratumId: string | null }

/**
 * Entering a log at the keyboard in Chromium: the USCS and stratum lists of the log table chosen
 * with real key presses (and with a pick from the list), and an SPT refusal typed as written.
 */
describe('the log and SPT entered at the keyboard', () => {
  const browser = useBrowser()
  const { owner: admin, geologist } = signedInDemo('owner', 'geologist')
  let projectId = ''
  let boreholeId = ''
  const strata: Record<string, string> = {}

  const log = async () => (await geologist.get<{ intervals: Interval[] }>(`/api/projects/${projectId}/points/${boreholeId}`)).body.intervals

  beforeEach(async () => {
    projectId = (await createProject(admin, 'TRN-KEY', 'Saltmarsh Lane keyboard trial', ['geologist'], { client: 'Harrow Estuary Logistics' })).id
    const P = `/api/projects/${projectId}`
    Object.assign(strata, await createStrata(geologist, projectId, [
      { code: 'MG', name: 'Made ground', colour: 'fill-ochre', pattern: 'made-ground', unitWeight: 19, unitWeightSaturated: 20 },
      { code: 'EC', name: 'Estuarine clay', colour: 'estuary-slate', pattern: 'organic-clay', unitWeight: 16, unitWeightSaturated: 16 },
    ]))
    const r = await geologist.post<{ point: { id: string } }>(`${P}/points`, { identifier: 'BH-K1', kind: 'borehole', easting: 12, northing: 18, finalDepth: 10, groundElevation: 3.1, startedOn: '2026-03-05', endedOn: '2026-03-06', method: 'Cable percussion', loggedBy: 'A. Ferreira' })
    expect(r.status).toBe(201)
    boreholeId = r.body.point.id
    const intervals = [
      { top: 0, bottom: 1.2, description: 'Brown sandy GRAVEL with brick (fill)', uscs: null, stratumId: null, moisture: null, consistency: null },
      { top: 1.2, bottom: 6, description: 'Soft grey CLAY with shell fragments', uscs: null, stratumId: null, moisture: null, consistency: null },
    ]
    expect((await geologist.request('PUT', `${P}/points/${boreholeId}/intervals`, { intervals })).status).toBe(200)
  })

  async function openLog(): Promise<Page> {
    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.goto(`${baseUrl()}/projects/${projectId}/points/${boreholeId}`)
    await page.getByTestId('graphic-log').waitFor()
    await page.getByTestId('log-row').first().waitFor()
    return page
  }
  const cell = (page: Page, label: string) => page.getByLabel(label, { exact: true })

  it('typing a letter in the USCS and stratum lists chooses, and the choice stays through moving on and saving', async () => {
    const page = await openLog()
    await cell(page, 'USCS group symbol, row 1').focus()
    // The first symbol starting with G in the list's order (GW, GP, …).
    await page.keyboard.press('g')
    expect(await cell(page, 'USCS group symbol, row 1').inputValue()).toBe('GW')
    await page.keyboard.press('Tab')
    // The stratum list: "EC · Estuarine clay" is the first label starting with E.
    await page.keyboard.press('e')
    expect(await cell(page, 'Stratum, row 1').inputValue()).toBe(strata.EC)
    // Enter moves down, as the hint says; the choices above stay.
    await page.keyboard.press('Enter')
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Stratum, row 2')
    expect(await cell(page, 'USCS group symbol, row 1').inputValue()).toBe('GW')
    expect(await cell(page, 'Stratum, row 1').inputValue()).toBe(strata.EC)
    await page.keyboard.press('m')
    expect(await cell(page, 'Stratum, row 2').inputValue()).toBe(strata.MG)
    expect(await page.getByTestId('log-unsaved').count()).toBe(1)
    await screenshot(page, 'log-keyboard-typed')
    await page.keyboard.press('Control+s')
    await page.getByTestId('log-notice').filter({ hasText: 'Saved the log of BH-K1: 2 intervals' }).waitFor()
    const saved = await log()
    expect(saved.map(iv => [iv.uscs, iv.stratumId])).toEqual([['GW', strata.EC], [null, strata.MG]])
    await page.close()
  })

  it('Space opens a list, the arrows move through it and Enter chooses; the mouse still chooses too', async () => {
    const page = await openLog()
    const uscs2 = cell(page, 'USCS group symbol, row 2')
    await uscs2.focus()
    await page.keyboard.press(' ')
    await page.keyboard.press('ArrowDown')
    await page.keyboard.press('ArrowDown')
    await page.keyboard.press('Enter')
    // "—", then GW, GP: two steps down from the blank choice.
    await expect.poll(() => uscs2.inputValue()).toBe('GP')
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('USCS group symbol, row 2')
    await page.keyboard.press('Tab')
    await page.keyboard.press(' ')
    await page.keyboard.press('ArrowDown')
    await page.keyboard.press('Enter')
    await expect.poll(() => cell(page, 'Stratum, row 2').inputValue()).toBe(strata.MG)
    expect(await uscs2.inputValue()).toBe('GP')
    // The mouse (a pick from the list) on row 1.
    await cell(page, 'USCS group symbol, row 1').selectOption('CH')
    await cell(page, 'Stratum, row 1').selectOption(strata.EC!)
    expect(await uscs2.inputValue()).toBe('GP')
    await screenshot(page, 'log-keyboard-lists')
    await page.getByTestId('log-save').click()
    await page.getByTestId('log-notice').filter({ hasText: 'Saved the log of BH-K1: 2 intervals' }).waitFor()
    expect((await log()).map(iv => [iv.uscs, iv.stratumId])).toEqual([['CH', strata.EC], ['GP', strata.MG]])
    await page.close()
  })

  it('an SPT refusal is typed as written, previewed, saved per increment and shown as written on the page', async () => {
    const page = await openLog()
    await page.getByRole('tab', { name: /SPT/ }).click()
    await page.locator('#spt-depth').fill('7.5')
    const blows = page.getByLabel('Blows (seating / test drive)', { exact: true })
    await blows.fill('2 3 / 4 5 6')
    await page.getByRole('button', { name: 'Add SPT' }).click()
    expect(await page.getByText('Blows: The test drive has 3 counts').count()).toBe(1)
    await blows.fill('25/75 50/40')
    expect(await page.getByTestId('spt-preview').textContent()).toBe('seating 25 for 75 mm, stopped short: 50/40 mm, no N')
    await page.keyboard.press('Enter')
    await page.getByText('SPT at 7.50 m added.').waitFor()
    const table = page.getByTestId('spt-table')
    expect(await table.locator('tbody tr').first().locator('td').allTextContents()).toEqual(expect.arrayContaining(['7.50', '25/75mm / 50/40mm', '25 / 75 mm', '50 / 40 mm', '50/40 mm']))
    // The graphic log writes the refusal as written too.
    await expect.poll(() => page.getByTestId('log-spt').textContent()).toBe('50/40 mm')
    expect(await page.getByTestId('log-spt-refusal-key').textContent()).toContain('SPT stopped short')
    const spt = (await geologist.get<{ spt: { blows: number[], penetrations: number[], seating: number, n: number, penetration: number | null }[] }>(`/api/projects/${projectId}/points/${boreholeId}`)).body.spt
    expect(spt).toEqual([expect.objectContaining({ blows: [25, 50], penetrations: [75, 40], seating: 1, n: 50, penetration: 40 })])
    await screenshot(page, 'log-entry-spt-refusal')
    await page.close()
  })
})
