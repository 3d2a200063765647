import { beforeAll, describe, expect, it } from 'vitest'
import type { Locator, Page } from 'playwright-core'
import { drainSpacingFor } from '../../shared/geotech/radial-consolidation'
import { formatSettlement, formatYears } from '../../shared/plots/settlement-units'
import { RUN_DRAIN_DEFAULTS } from '../../shared/schemas/settlement-runs'
import type { SettlementRun } from '../../shared/types/settlement-runs'
import { signedInDemo } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { createApprovedRunModel } from '../helpers/settlement-run'
import { openProjectAs, screenshotLaptopAndPhone, useBrowser } from './helpers'

/** Types `value` into the field `testid` and commits it (Enter). */
async function type(page: Page, testid: string, value: string) {
  const f = page.getByTestId(testid)
  await f.fill(value)
  await f.press('Enter')
}

/** The element's text with its white space folded. */
async function words(l: Locator): Promise<string> {
  return ((await l.textContent()) ?? '').replace(/\s+/g, ' ').trim()
}

describe('designing the treatment in Chromium: stages, a surcharge taken off and vertical drains', () => {
  const browser = useBrowser()
  const { designer, ...people } = signedInDemo('owner', 'engineer', 'reviewer', 'designer')
  let projectId = ''

  // A project of this file's own with the scenario's ground model, version 1 approved (the model in force).
  beforeAll(async () => {
    projectId = (await createProject(people.owner, 'E2E-TREAT', 'Staged yard (browser)', ['engineer', 'reviewer', 'designer'])).id
    await createApprovedRunModel(people, projectId, 'For the treatment design')
  })

  it('a designer builds the embankment in two stages with a surcharge off at 9 months and drains at 1.5 m, reads t90 with and without drains and the residual, and uses the spacing aid', async () => {
    const page = await openProjectAs(browser.context, 'designer', projectId, '/settlement/new', { viewport: { width: 1280, height: 800 } })
    // The live stream is not part of this story.
    await page.route('**/api/projects/*/events', route => route.abort())
    await page.locator('[data-testid="run-editor"][data-ready="yes"]').waitFor()
    await page.getByTestId('version-standing').waitFor()
    await page.getByTestId('run-name').fill('Yard, two stages, surcharge and drains')

    // The embankment: 4.5 m of fill, half over the first two months, half over months 4 to 6.
    await page.getByTestId('table-add-embankment').click()
    await page.getByTestId('load-row-0').waitFor()
    await page.getByTestId('load-label-0').fill('Embankment')
    await type(page, 'load-0-height', '4.5')
    expect(await words(page.getByTestId('load-0-schedule-summary'))).toBe('The whole load at once, at time zero.')
    await page.getByTestId('load-0-add-stage').click()
    await page.getByTestId('load-0-stage-1').waitFor()
    await type(page, 'load-0-stage-0-duration', '2')
    await type(page, 'load-0-stage-1-start', '4')
    await type(page, 'load-0-stage-1-duration', '2')
    // The live check of the shares: 50 % + 40 % is not the whole load; back to 50 % it is.
    const total = page.getByTestId('load-0-stages-total')
    await expect.poll(() => words(total)).toBe('Stages add up to 100 %.')
    await type(page, 'load-0-stage-1-fraction', '40')
    await expect.poll(() => words(total)).toBe('Stages add up to 90 %: they must add up to 100 %.')
    expect(await total.getAttribute('data-complete')).toBe('no')
    await type(page, 'load-0-stage-1-fraction', '50')
    await expect.poll(() => total.getAttribute('data-complete')).toBe('yes')

    // The surcharge: 1.5 m more on the crest, placed over month 6 and taken off at 9 months.
    await page.getByTestId('table-add-embankment').click()
    await page.getByTestId('load-row-1').waitFor()
    await page.getByTestId('load-label-1').fill('Surcharge')
    await type(page, 'load-1-height', '1.5')
    await type(page, 'load-1-crestWidth', '30')
    await type(page, 'load-1-crestLength', '50')
    await page.getByTestId('load-1-add-stage').click()
    await page.getByTestId('load-1-stage-0-remove').click()
    await expect.poll(() => page.getByTestId('load-1-stage-1').count()).toBe(0)
    await type(page, 'load-1-stage-0-fraction', '100')
    await type(page, 'load-1-stage-0-start', '10')
    await type(page, 'load-1-stage-0-duration', '1')
    await page.getByTestId('load-1-removable').check()
    await type(page, 'load-1-removeAt', '9')

    // One named point under the middle.
    await page.getByTestId('table-add-point').click()
    await page.getByTestId('point-row-0').waitFor()
    await page.getByTestId('point-0-label').fill('Centre')

    // Drains at 1.5 m in a triangular layout through the estuarine clay.
    await page.getByTestId('drains-on').check()
    await page.getByTestId('drain-stratum-EST').check()
    expect(await page.getByTestId('drain-pattern-triangular').isChecked()).toBe(true)
    await type(page, 'drain-spacing', '1.5')
    // The drain's default size: a 100 × 4 mm band, 52 mm.
    expect(await page.getByTestId('drain-diameter').inputValue()).toBe('52')
    // The aid answers from the version's strata while the designer types.
    await page.getByTestId('aid-triangular-spacing').waitFor()
    expect(Number(await page.getByTestId('aid-triangular-spacing').getAttribute('data-value'))).toBeGreaterThan(0.5)

    // The surcharge goes on at 10 months but comes off at 9: the server refuses it (422) and says so beside the stage.
    await page.getByTestId('run').click()
    await expect(page.getByTestId('load-1-stage-0-start-error').textContent()).resolves.toMatch(/after the load is removed/)
    await type(page, 'load-1-stage-0-start', '6')
    await screenshotLaptopAndPhone(page, 'settlement-treatment-editor')

    await page.getByTestId('run').click()
    await page.waitForURL(/\/settlement\/[0-9a-f-]{36}$/)
    const runId = page.url().split('/').pop()!
    const { run: sent } = await must('reading the run', designer.get<{ run: SettlementRun }>(`/api/projects/${projectId}/settlement-runs/${runId}`))
    expect(sent.loads[0]).toMatchObject({ label: 'Embankment', height: 4.5 })
    expect(sent.loads[0]!.stages!.map(s => [s.start * 12, s.duration * 12, s.fraction].map(v => Math.round(v * 1e6) / 1e6))).toEqual([[0, 2, 0.5], [4, 2, 0.5]])
    expect(sent.loads[1]).toMatchObject({ label: 'Surcharge', height: 1.5, removeAt: 0.75 })
    expect(sent.options.drains).toMatchObject({ strata: ['EST'], pattern: 'triangular', spacing: 1.5, diameter: RUN_DRAIN_DEFAULTS.diameter })

    // The results: t90 with and without drains, the residual after the surcharge comes off.
    await page.getByTestId('run-status-finished').first().waitFor({ timeout: 60_000 })
    await page.getByTestId('headline-t90').waitFor()
    const { run } = await must('reading the results', designer.get<{ run: SettlementRun }>(`/api/projects/${projectId}/settlement-runs/${runId}`))
    const centre = run.results!.points[0]!
    expect(centre.t90WithoutDrains).toBeGreaterThan(centre.t90!)
    expect(await words(page.getByTestId('headline-t90'))).toBe(formatYears(centre.t90))
    expect(await page.getByTestId('headline-t90-undrained').textContent()).toContain(`Without drains: ${formatYears(centre.t90WithoutDrains)}`)
    // Without drains the estuarine clay takes decades to reach 90 %; the drains bring it within a few years.
    expect(centre.t90WithoutDrains!).toBeGreaterThan(10)
    expect(centre.t90!).toBeLessThan(5)
    const residual = await words(page.getByTestId('headline-residual'))
    expect(residual).toBe(`After removal at 9.0 months, ${formatSettlement(centre.residualAfterRemoval, 'SI')} of primary settlement remain under the permanent load (Centre).`)
    expect(centre.residualAfterRemoval!).toBeGreaterThan(0)
    expect(await page.getByTestId('headline-rebound').textContent()).toContain(formatSettlement(centre.rebound, 'SI'))
    await expect(page.getByTestId('run-caution').textContent()).resolves.toContain('licensed engineer')

    // The time curve: the load band above, the curves with and without drains, the removal marked.
    // It is built when it comes near the screen: the designer scrolls down to it.
    await page.getByTestId('time-curve-box').scrollIntoViewIfNeeded()
    const curve = page.getByTestId('time-curve')
    await curve.getByTestId('load-band').waitFor()
    const legend = await curve.getByTestId('time-legend').textContent()
    expect(legend).toContain('total, with drains')
    expect(legend).toContain('primary, without drains')
    expect(legend).toContain('load at the surface')
    expect(await curve.getByTestId('mark-0-off').count()).toBe(1)
    expect(await curve.getByTestId('time-removal').textContent()).toContain('Taken off at 9.0 months')

    // The run says how it was built and drained.
    expect(await words(page.getByTestId('run-schedule'))).toContain('Surcharge (embankment): 100 % over 1.0 months from 6.0 months; taken off at 9.0 months.')
    expect(await page.getByTestId('run-drain-strata').locator('tbody tr').count()).toBe(1)
    await screenshotLaptopAndPhone(page, 'settlement-treatment-run')

    // The spacing aid: U = 90 % at 6 months, from the run's own drained stratum.
    await type(page, 'aid-percent', '90')
    await type(page, 'aid-months', '6')
    const est = run.results!.drains!.strata[0]!
    const expected = drainSpacingFor({
      pattern: 'triangular', targetDegree: 0.9, years: 0.5, ch: est.ch, cv: est.cv, drainagePath: est.drainagePath,
      diameter: run.results!.drains!.diameter, smearRatio: run.options.drains!.smearRatio, permeabilityRatio: run.options.drains!.permeabilityRatio,
    })!
    expect(expected).toBeLessThan(1.5)
    const found = page.getByTestId('aid-triangular-spacing')
    await expect.poll(() => found.getAttribute('data-value')).toBe(String(expected))
    expect(await words(found)).toBe(`${expected.toFixed(2)} m`)
    await page.getByTestId('aid-triangular-use').click()

    // "Run again with changes" with that spacing: the editor has the run's inputs and the drains at the spacing found.
    await page.waitForURL(/\/settlement\/new\?from=.+drainSpacing=/)
    await page.locator('[data-testid="run-editor"][data-ready="yes"]').waitFor()
    await page.getByTestId('from-run-note').waitFor()
    await expect.poll(() => page.getByTestId('drain-spacing').inputValue()).toBe(String(expected))
    expect(await page.getByTestId('drains-on').isChecked()).toBe(true)
    expect(await page.getByTestId('drain-stratum-EST').isChecked()).toBe(true)
    expect(await page.getByTestId('load-0-stage-1-start').inputValue()).toBe('4')
    expect(await page.getByTestId('load-1-removeAt').inputValue()).toBe('9')
    expect(await page.getByTestId('aid-triangular').textContent()).toContain('in use')
    await page.close()
  })
})
