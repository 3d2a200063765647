// The units walk in Chromium: on a copy of the demo site, the owner switches the project to US
// customary units on the settings page, then every page converted so far is read for SI unit
// labels left in its main content, and a known value is checked (BH-01's final depth, 30.0 m in
// the demo scenario, reads 98.43 ft: 30 / 0.3048, NIST SP 811, 2008, App. B.8). Screenshots at
// 1366 px and 390 px of each page.
import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { useDemoCopy } from '../helpers/demo-project'
import { baseUrl, demoEmail, signIn } from '../helpers/http'
import { screenshot, signInAs, useBrowser } from './helpers'

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
