// The units walk in Chromium: on a copy of the demo site, the owner switches the project to US
// customary units on the settings page, then every page converted so far is read for SI unit
// labels left in its main content, and a known value is checked (BH-01's final depth, 30.0 m in
// the demo scenario, reads 98.43 ft: 30 / 0.3048, NIST SP 811, 2008, App. B.8). Screenshots at
// 1366 px and 390 px of each page.
import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { useDemoCopy } from '../helpers/demo-project'
import { baseUrl, demoEmail, signIn } from '../helpers/http'
import { pdfPagesText } from '../helpers/pdf'
import { must } from '../helpers/project'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { openWorkspace, screenshot, signInAs, useBrowser } from './helpers'

/** SI unit labels as they would read on a page: a number then the unit, or the unit in a heading's brackets. */
const SI_LABELS: { what: string, re: RegExp }[] = [
  { what: 'kPa', re: /kPa/ },
  { what: 'kN/m³', re: /kN\/m³/ },
  { what: 'm²/yr', re: /m²\/yr/ },
  { what: 'a length in m', re: /\d\s?m(?![\p{L}\d²³/])/u },
  { what: '(m) in a heading', re: /\(m[),]/ },
]

/**
 * The page's main content as read: the visible text and every SVG text (axis labels, read-outs).
 * Text people wrote themselves (remarks, the site description, marked `data-user-text`) is left out:
 * its units are theirs.
 */
async function mainText(page: Page): Promise<string> {
  await page.locator('main [data-user-text]').evaluateAll((els) => {
    for (const e of els) (e as HTMLElement).style.display = 'none'
  })
  const visible = await page.locator('main').innerText()
  const svg = await page.locator('main svg text').evaluateAll(els => els.map(e => e.textContent ?? '').join('\n'))
  const aria = await page.locator('main [aria-label], main [aria-valuetext]').evaluateAll(els => els.map(e => `${e.getAttribute('aria-label') ?? ''}\n${e.getAttribute('aria-valuetext') ?? ''}`).join('\n'))
  return `${visible}\n${svg}\n${aria}`
}

/** The SI labels found in the text, each with a little context. */
function siLeft(text: string): string[] {
  const out: string[] = []
  for (const { what, re } of SI_LABELS) {
    const m = new RegExp(re.source, re.flags.includes('g') ? re.flags : `${re.flags}g`).exec(text)
    if (m) out.push(`${what}: "…${text.slice(Math.max(0, m.index - 30), m.index + 20).replace(/\s+/g, ' ')}…"`)
  }
  return out
}

async function shoot(page: Page, name: string): Promise<void> {
  await page.setViewportSize({ width: 1366, height: 850 })
  await screenshot(page, `${name}-1366`)
  await page.setViewportSize({ width: 390, height: 844 })
  await screenshot(page, `${name}-390`)
  await page.setViewportSize({ width: 1366, height: 850 })
}

describe('US units on every converted page', () => {
  const browser = useBrowser()
  const copy = useDemoCopy('E2E-UNITS')

  it('the owner switches the project to US (psf) in the settings, and the converted pages show no SI label', async () => {
    const projectId = copy.id
    const api = await signIn(demoEmail('owner'))
    const tests = (await api.get<{ tests: { id: string, label: string }[] }>(`/api/projects/${projectId}/tests/oedometer`)).body.tests
    expect(tests.length).toBeGreaterThan(0)
    // A reviewer's flag on a test, so the review list describes a record with its depth and σ'p.
    const reviewer = await signIn(demoEmail('reviewer'))
    const flagged = await reviewer.post(`/api/projects/${projectId}/flags`, { targetType: 'oedometer-test', targetId: tests[0]!.id, verdict: 'questionable', comment: 'Check the unload–reload loop.' })
    expect(flagged.status).toBe(201)

    const page = await signInAs(browser.context, demoEmail('owner'))
    const base = `${baseUrl()}/projects/${projectId}`
    await page.setViewportSize({ width: 1366, height: 850 })
    await page.goto(base)
    // The owner finds the settings in the project's navigation.
    await page.getByTestId('project-nav').getByRole('link', { name: 'Settings' }).click()
    await page.getByTestId('project-settings').waitFor()
    await page.getByTestId('units-US').check()
    await page.getByTestId('stress-psf').check()
    await shoot(page, 'units-settings')
    await page.getByTestId('settings-save').click()
    await expect.poll(() => page.getByTestId('settings-notice').textContent()).toContain('Settings saved')
    const stored = (await api.get<{ project: { unitSystem: string, usStressUnit: string } }>(`/api/projects/${projectId}`)).body.project
    expect(stored).toMatchObject({ unitSystem: 'US', usStressUnit: 'psf' })

    const pages: { name: string, path: string, ready: (p: Page) => Promise<unknown> }[] = [
      { name: 'overview', path: '', ready: p => p.getByTestId('project-units').waitFor() },
      { name: 'plan', path: '/plan', ready: p => p.locator('[data-testid="plan-point"]').first().waitFor() },
      { name: 'tests', path: '/tests', ready: p => p.getByTestId('tests-table').waitFor() },
      { name: 'oedometer', path: `/tests/oedometer/${tests[0]!.id}`, ready: p => p.locator('[data-construction]').first().waitFor() },
      { name: 'review', path: '/review', ready: p => p.locator('main').getByText(/Oedometer test .* ft/).filter({ visible: true }).first().waitFor() },
      { name: 'reports', path: '/reports', ready: p => p.getByRole('heading', { name: 'Reports' }).waitFor() },
      { name: 'settlement', path: '/settlement', ready: p => p.getByRole('heading', { name: 'Settlement', exact: false }).first().waitFor() },
    ]
    const left: string[] = []
    for (const p of pages) {
      await page.goto(`${base}${p.path}`)
      await p.ready(page)
      for (const found of siLeft(await mainText(page))) left.push(`${p.name}: ${found}`)
      await shoot(page, `units-us-${p.name}`)
    }
    expect(left).toEqual([])

    // One known value: BH-01's final depth, 30.0 m in the demo, on the site plan's list.
    await page.goto(`${base}/plan`)
    const bh01 = page.getByTestId('point-list').getByRole('link', { name: /BH-01/ })
    await expect.poll(() => bh01.textContent()).toContain('98.43 ft')
    // The tests list heads its columns in US units.
    await page.goto(`${base}/tests`)
    const head = await page.locator('[data-testid="tests-table"] thead').innerText()
    expect(head).toContain('Depth (ft)')
    expect(head).toContain('(psf)')
  }, 300_000)

})

// Its own copy: the walk above switches its project in the settings and must find it in SI, whichever test runs first.
describe('US units on the point, strata, σ\'p, stress-model and compare pages', () => {
  const browser = useBrowser()
  const copy = useDemoCopy('E2E-UNITS-PAGES')

  it('the point page, its log sheet, strata, σ\'p data, the stress model, its compare and the run compare read in US units too', async () => {
    const projectId = copy.id
    const api = await signIn(demoEmail('owner'))
    const engineer = await signIn(demoEmail('engineer'))
    const designer = await signIn(demoEmail('designer'))
    const base = `/api/projects/${projectId}`
    await must('switching to US', api.patch(base, { unitSystem: 'US', usStressUnit: 'psf' }))
    const points = (await must('points', api.get<{ points: { id: string, identifier: string }[] }>(`${base}/points`))).points
    const bh01 = points.find(p => p.identifier === 'BH-01')!
    const cpt = points.find(p => p.identifier.startsWith('CPT'))!
    // A model with two versions (the water table moved), and two runs on version 1, for the compare pages.
    const model = await createRunModel(engineer, projectId, undefined, 'Units model')
    const { model: m } = await must('model', engineer.get<{ model: { version: number, draft: SiteModelDefinition } }>(model.url))
    const draft = { ...m.draft, groundwater: { ...m.draft.groundwater, waterTableDepth: m.draft.groundwater.waterTableDepth + 0.3 } }
    const put = await must('draft', engineer.request<{ model: { version: number } }>('PUT', `${model.url}/draft`, { draft, version: m.version }))
    await must('version 2', engineer.post(`${model.url}/versions`, { message: 'Water table lower', version: put.model.version }), 201)
    const runA = (await must('run A', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(model, { name: 'Slab A' })), 201)).run.id
    const runB = (await must('run B', designer.post<{ run: { id: string } }>(`${base}/settlement-runs`, smallRunBody(model, { name: 'Slab B', loads: [{ type: 'rectangle', label: 'Slab', x: 0, y: 0, width: 40, length: 30, pressure: 120 }] })), 201)).run.id

    const page = await signInAs(browser.context, demoEmail('owner'))
    const web = `${baseUrl()}/projects/${projectId}`
    await page.setViewportSize({ width: 1366, height: 850 })
    const left: string[] = []
    const read = async (name: string) => {
      for (const found of siLeft(await mainText(page))) left.push(`${name}: ${found}`)
    }

    // The point page: header figures, the log table and graphic log, then each tab of tests and observations.
    await page.goto(`${web}/points/${bh01.id}`)
    await page.getByTestId('point-facts').waitFor()
    await page.getByTestId('graphic-log').waitFor()
    await expect.poll(() => page.getByTestId('point-facts').innerText()).toContain('98.43 ft')
    await read('point')
    await shoot(page, 'units-us-point')
    for (const tab of ['SPT', 'Groundwater', 'Vane']) {
      await page.getByRole('tab', { name: new RegExp(`^${tab}`) }).click()
      await read(`point ${tab}`)
    }
    await page.getByRole('tab', { name: /^SPT/ }).click()
    expect(await page.getByTestId('spt-table').locator('thead').innerText()).toContain('Depth (ft)')
    await shoot(page, 'units-us-point-spt')
    // The log table heads its depths in feet.
    expect(await page.getByTestId('log-table').locator('thead').innerText()).toContain('Top (ft)')

    // A sounding: the cone plot's axes and the Ic track.
    await page.goto(`${web}/points/${cpt.id}`)
    await page.getByTestId('cpt-plot').waitFor()
    await expect.poll(() => page.getByTestId('cpt-plot').locator('svg text').allTextContents().then(t => t.join(' '))).toContain('Depth (ft)')
    await read('cpt point')
    await shoot(page, 'units-us-cpt')

    const pages: { name: string, path: string, ready: (p: Page) => Promise<unknown> }[] = [
      { name: 'log-sheet', path: `/points/${bh01.id}/sheet`, ready: p => p.getByTestId('log-drawing').first().waitFor() },
      { name: 'strata', path: '/strata', ready: p => p.getByTestId('stratum-row').first().waitFor() },
      { name: 'preconsolidation', path: '/preconsolidation', ready: p => p.locator('[data-testid="points-table"] tbody tr').first().waitFor() },
      // The page opens with the server's drawing of the draft, then the workspace on first use.
      { name: 'stress-model-drawing', path: `/models/${model.modelId}`, ready: p => p.getByTestId('model-drawing-preview').waitFor() },
      { name: 'stress-model', path: `/models/${model.modelId}`, ready: p => openWorkspace(p).then(() => p.getByTestId('stress-track').waitFor()) },
      { name: 'model-compare', path: `/models/${model.modelId}/compare?a=1&b=2`, ready: p => p.getByTestId('compare-summary').waitFor() },
      { name: 'run-compare', path: `/settlement/compare?a=${runA}&b=${runB}`, ready: p => p.getByTestId('compare-inputs').waitFor() },
    ]
    for (const p of pages) {
      await page.goto(`${web}${p.path}`)
      await p.ready(page)
      await read(p.name)
      await shoot(page, `units-us-${p.name}`)
    }
    expect(left).toEqual([])

    // Known values: BH-01's 30.0 m on the sheet, the water table moved 0.3 m = 0.98 ft in the compare's words,
    // and the run compare's load in psf (100 kPa = 2089 psf, 120 kPa = 2506 psf; 1 psf = 0.047880 kPa).
    await page.goto(`${web}/points/${bh01.id}/sheet`)
    await expect.poll(() => page.getByTestId('sheet-facts').first().innerText()).toContain('98.43 ft')
    await page.goto(`${web}/models/${model.modelId}`)
    await openWorkspace(page)
    // The drawing's depth axis names its unit on a line of its own under "Depth".
    await expect.poll(() => page.getByTestId('depth-axis-unit').textContent()).toBe('(ft)')
    await page.goto(`${web}/models/${model.modelId}/compare?a=1&b=2`)
    expect(await page.getByTestId('compare-summary').innerText()).toMatch(/water table [\d.]+ → [\d.]+ ft/)
    await page.goto(`${web}/settlement/compare?a=${runA}&b=${runB}`)
    const inputs = await page.getByTestId('compare-inputs').innerText()
    expect(inputs).toContain('2089 psf')
    expect(inputs).toContain('2506 psf')

    // In tsf the σ'p table and the point log PDF follow (a tsf is 2000 psf).
    await must('switching to tsf', api.patch(base, { usStressUnit: 'tsf' }))
    await page.goto(`${web}/preconsolidation`)
    await expect.poll(() => page.locator('[data-testid="points-table"] thead').innerText()).toContain('σ\'p (tsf)')
    await shoot(page, 'units-us-tsf-preconsolidation')
    const res = await fetch(`${api.base}${base}/points/${bh01.id}/report.pdf`, { headers: { cookie: api.cookie } })
    expect(res.status).toBe(200)
    const text = pdfPagesText(new Uint8Array(await res.arrayBuffer())).join('\n')
    expect(text).toContain('US customary units (ft, tsf, pcf)')
    expect(text).toContain('98.43 ft')
    expect(text).toMatch(/\btsf\b/)
    expect(text).not.toMatch(/\bkPa\b/)
  }, 400_000)
})

describe('range messages in US units', () => {
  const browser = useBrowser()
  // A copy of its own: the other tests here switch their copy's units through the settings page.
  const copy = useDemoCopy('E2E-UNITS-B')

  it('a range message on a form quotes its bound in the units typed (pcf, not kN/m³)', async () => {
    await must('switching to US', (await signIn(demoEmail('owner'))).patch(`/api/projects/${copy.id}`, { unitSystem: 'US', usStressUnit: 'psf' }))
    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.goto(`${baseUrl()}/projects/${copy.id}/strata`)
    await page.getByTestId('stratum-add').click()
    const form = page.getByTestId('stratum-form')
    await form.locator('#st-code').fill('DRY')
    await form.locator('#st-name').fill('Dry crust')
    await form.locator('#st-gamma').fill('500')
    await form.locator('#st-gamma-sat').fill('120')
    await page.getByTestId('stratum-save').click()
    // 30 kN/m³, the schema's bound, is 190.96 pcf (1 pcf = 0.157087 kN/m³): quoted rounded down, so the number is allowed.
    await form.getByText('Unit weight above water must be at most 190.9 pcf').waitFor()
    expect(await form.innerText()).not.toContain('kN/m³')
    await shoot(page, 'units-us-bound-message')
    await page.close()
  })
})
