import { join } from 'node:path'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DEMO_EMBANKMENT, SITE_PLAN } from '../../shared/demo/site'
import { formatSettlement } from '../../shared/plots/settlement-units'
import { exceedanceAt, formatCov, formatProbability } from '../../shared/settlement-run/spread'
import type { SettlementRun, SettlementRunList } from '../../shared/types/settlement-runs'
import { baseUrl, type Client, demoEmail, demoProjectId, signedInDemo } from '../helpers/http'
import { useDemoCopy } from '../helpers/demo-project'
import { must } from '../helpers/project'
import { insertRunningCopy } from '../helpers/run-worker'
import { createApprovedRunModel } from '../helpers/settlement-run'
import { SCREENSHOTS, screenshot, signInAs, useBrowser } from './helpers'

interface Created { run: { id: string, status: string } }

// The demo's yard embankment: the yard (120 m × 80 m) is its toe, 6 m of 20 kN/m³ fill at 2:1.
const yard = SITE_PLAN.yard
const centre = { x: (yard.minEasting + yard.maxEasting) / 2, y: (yard.minNorthing + yard.maxNorthing) / 2 }
const slope = DEMO_EMBANKMENT.height * 2
const EMBANKMENT = {
  type: 'embankment', label: 'Yard embankment', x: centre.x, y: centre.y,
  crestWidth: yard.maxEasting - yard.minEasting - 2 * slope, crestLength: yard.maxNorthing - yard.minNorthing - 2 * slope,
  height: DEMO_EMBANKMENT.height, sideSlope: 2, unitWeight: DEMO_EMBANKMENT.unitWeight, rotation: 0,
}

/** Reads a run until it has ended (finished, failed or stopped). */
async function ended(c: Client, url: string, ms = 240_000): Promise<SettlementRun> {
  const until = Date.now() + ms
  for (;;) {
    const { run } = await must('run', c.get<{ run: SettlementRun }>(url))
    if (run.status !== 'queued' && run.status !== 'running') return run
    if (Date.now() > until) throw new Error(`the run is still ${run.status} at ${Math.round(run.progress * 100)} %`)
    await new Promise(r => setTimeout(r, 1000))
  }
}

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 })
afterAll(() => pool.end())

const cell = (s: string | null) => (s ?? '').replace(/\s+/g, ' ').trim()

describe('probabilistic settlement in Chromium', () => {
  const browser = useBrowser()
  // A copy of the demo (its boreholes, samples and interpreted oedometer tests), so the COVs "from the data" are the demo's.
  const copy = useDemoCopy('E2E-PROB')
  const { designer, ...people } = signedInDemo('owner', 'engineer', 'reviewer', 'designer')
  let base = ''
  let firstRun = ''

  beforeAll(async () => {
    base = `/api/projects/${copy.id}`
    // The yard model (the demo's ground model, strata CRUST, EST, GLA compressible), version 1 approved.
    const model = await createApprovedRunModel(people, copy.id, 'For the yard embankment')
    // The designer's single-figure run of the embankment, the one they will run again "from the data".
    const created = await must('the yard run', designer.post<Created>(`${base}/settlement-runs`, {
      name: 'Yard embankment, 6 m',
      model: { modelId: model.modelId, version: 1 },
      loads: [EMBANKMENT],
      points: [{ label: 'Yard centre', x: centre.x, y: centre.y }, { label: 'South edge, middle', x: centre.x, y: yard.minNorthing }],
      grid: { spacing: 10, margin: 10 },
    }), 201)
    firstRun = created.run.id
    expect((await ended(designer, `${base}/settlement-runs/${firstRun}`)).status).toBe('finished')
  })

  it('the designer runs the embankment again "from the data" and reads P50 and P95 at the centre and what drives them', async () => {
    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.goto(`${baseUrl()}/projects/${copy.id}/settlement/${firstRun}`)
    await page.getByTestId('headline-cards').waitFor()
    // A run without a spread has no tabs.
    expect(await page.getByTestId('run-tabs').count()).toBe(0)
    await page.getByTestId('run-again').click()
    await page.locator('[data-testid="run-editor"][data-ready="yes"]').waitFor()

    // Probability on: each compressible stratum's COVs from the demo's tests, with n.
    await page.getByTestId('spread-on').check()
    const scatter = await must('scatter', designer.get<{ strata: { code: string, variables: { variable: string, cov: number, source: string, n: number, trend?: boolean }[] }[] }>(
      `${base}/settlement-runs/scatter?modelId=${(await must('run', designer.get<{ run: SettlementRun }>(`${base}/settlement-runs/${firstRun}`))).run.model.modelId}&version=1`,
    ))
    const estCc = scatter.strata.find(s => s.code === 'EST')?.variables.find(v => v.variable === 'cc')
    expect(estCc).toBeDefined()
    expect(estCc!.source).toBe('data')
    expect(estCc!.n).toBeGreaterThanOrEqual(3)
    await expect.poll(() => page.getByTestId('spread-data-EST-cc').textContent()).toContain(`${formatCov(estCc!.cov)} from ${estCc!.n} tests`)
    expect(await page.getByTestId('spread-from-data').isChecked()).toBe(true)
    // Fewer realisations than the default, and a limit of 500 mm.
    await page.getByTestId('spread-realizations').fill('2000')
    await page.getByTestId('spread-realizations').press('Enter')
    await page.getByTestId('spread-limit').fill('500')
    await page.getByTestId('spread-limit').press('Enter')
    await page.getByTestId('spread-setup').screenshot({ path: join(SCREENSHOTS, 'settlement-probabilistic-editor.png') })
    await page.getByTestId('run').click()

    // The run's page: a progress bar while it computes, then the tabs.
    await page.waitForURL(/\/settlement\/[0-9a-f-]{36}$/)
    const runId = page.url().split('/').pop()!
    const run = await ended(designer, `${base}/settlement-runs/${runId}`)
    expect(run.status).toBe('finished')
    expect(run.options.probabilistic).toMatchObject({ realizations: 2000, fromData: true, limit: 0.5, ccE0Correlation: 0.5, seed: 1 })
    const results = run.results!
    const centrePoint = results.points.find(p => p.label === 'Yard centre')!
    const spread = centrePoint.probabilistic!
    expect(spread.realizations).toBe(2000)
    // The spread brackets the single figure and is ordered.
    expect(spread.quantiles.p05).toBeLessThan(spread.quantiles.p50)
    expect(spread.quantiles.p50).toBeLessThan(spread.quantiles.p95)
    expect(spread.deterministic).toBeCloseTo(centrePoint.settlement, 9)
    expect(spread.quantiles.p50).toBeGreaterThan(0.7 * spread.deterministic)
    expect(spread.quantiles.p50).toBeLessThan(1.3 * spread.deterministic)

    await page.getByTestId('run-tabs').waitFor({ timeout: 30_000 })
    await page.getByTestId('run-tab-probability').click()
    await page.waitForURL(/\?tab=probability$/)
    const row = page.getByTestId('spread-row-Yard centre')
    await row.waitFor()
    const mm = (v: number) => formatSettlement(v, 'SI', false)
    expect(cell(await row.locator('[data-q="p50"]').textContent())).toBe(mm(spread.quantiles.p50))
    expect(cell(await row.locator('[data-q="p95"]').textContent())).toBe(mm(spread.quantiles.p95))
    expect(cell(await row.locator('[data-q="deterministic"]').textContent())).toBe(mm(centrePoint.settlement))
    expect(cell(await row.locator('[data-q="exceedance"]').textContent())).toBe(formatProbability(spread.exceedance!.probability))
    // t90's spread too (every compressible stratum has cv).
    const t90 = page.getByTestId('spread-point-t90')
    await t90.waitFor()

    // The tornado: the variables ranked as the run ranked them, the strongest first, by name.
    const tornado = page.getByTestId('spread-tornado')
    await tornado.waitFor()
    const top = spread.sensitivity[0]!
    const bars = tornado.locator('[data-testid^="tornado-row-"]')
    expect(await bars.count()).toBe(Math.min(12, spread.sensitivity.length))
    const first = bars.first()
    expect(await first.getAttribute('data-testid')).toBe(`tornado-row-${top.stratum}:${top.variable}`)
    expect(await first.getAttribute('data-value')).toBe(top.rankCorrelation.toFixed(3))
    const names = Object.fromEntries(results.probabilistic!.strata.map(s => [s.code, s.name]))
    expect(await first.textContent()).toContain(names[top.stratum])
    expect(await tornado.getByRole('img').getAttribute('aria-label')).toContain('ranked by their rank correlation with settlement at Yard centre')

    // A limit typed on the page: the chance read off the curve the run stored.
    const limitInput = page.getByTestId('spread-limit-input')
    expect(await limitInput.inputValue()).toBe('500')
    const p95mm = Math.round(spread.quantiles.p95 * 1000)
    await limitInput.fill(String(p95mm))
    await limitInput.press('Enter')
    const read = exceedanceAt(spread.exceedanceCurve, p95mm / 1000)!
    expect(read.bound).toBeNull()
    await expect.poll(() => page.getByTestId('spread-limit-probability').textContent()).toBe(formatProbability(read.probability))
    // Near P95, about one in twenty.
    expect(read.probability).toBeGreaterThan(0.02)
    expect(read.probability).toBeLessThan(0.08)

    // The scatter used, the Estuarine clay's Cc from the tests; the spread's caution and the result caution once.
    const used = page.getByTestId('spread-used-EST-cc').locator('td')
    expect(cell(await used.nth(1).textContent())).toBe(formatCov(estCc!.cov))
    expect(cell(await used.nth(2).textContent())).toBe('from the tests')
    expect(cell(await used.nth(3).textContent())).toBe(String(estCc!.n))
    expect(await page.getByTestId('spread-caution').textContent()).toContain('not every uncertainty')
    expect(await page.getByTestId('run-caution').count()).toBe(1)
    // P50 and P95 over the grid.
    const map = page.getByTestId('spread-map')
    await map.waitFor()
    await map.getByTestId('contour-band').first().waitFor()
    expect(await map.getByTestId('contour-legend').textContent()).toContain('P95 settlement')
    await page.getByTestId('spread-map-p50').check()
    await expect.poll(() => map.getByTestId('contour-legend').textContent()).toContain('P50 settlement')

    await screenshot(page, 'settlement-probabilistic-laptop')
    await page.setViewportSize({ width: 390, height: 844 })
    await page.getByTestId('spread-tornado').scrollIntoViewIfNeeded()
    await screenshot(page, 'settlement-probabilistic-phone')

    // "Run again with changes" brings the probability inputs back as they were sent.
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.getByTestId('run-again').click()
    await page.locator('[data-testid="run-editor"][data-ready="yes"]').waitFor()
    expect(await page.getByTestId('spread-on').isChecked()).toBe(true)
    expect(await page.getByTestId('spread-from-data').isChecked()).toBe(true)
    expect(await page.getByTestId('spread-realizations').inputValue()).toBe('2000')
    expect(await page.getByTestId('spread-seed').inputValue()).toBe('1')
    expect(await page.getByTestId('spread-cc-e0').inputValue()).toBe('0.5')
    expect(await page.getByTestId('spread-limit').inputValue()).toBe('500')
    await page.close()
  })

  it('a running run shows its progress and, to its creator only, a stop button; stopped, it says so', async () => {
    // A copy of the yard run as a worker would leave it part-way (the page cannot tell), made by the designer.
    const copyRun = await insertRunningCopy(pool, firstRun, 'Yard, how sure (computing)', 0.4)
    const path = `/projects/${copy.id}/settlement/${copyRun}`
    // The engineer (neither its creator nor an owner) sees the progress but no stop button.
    const other = await signInAs(browser.context, demoEmail('engineer'))
    await other.goto(`${baseUrl()}${path}`)
    const otherBar = other.getByRole('progressbar', { name: 'Run progress' })
    await otherBar.waitFor()
    expect(await otherBar.getAttribute('aria-valuenow')).toBe('40')
    expect(await other.getByTestId('run-cancel').count()).toBe(0)
    await other.close()

    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.goto(`${baseUrl()}${path}`)
    await page.getByRole('progressbar', { name: 'Run progress' }).waitFor()
    const stop = page.getByTestId('run-cancel')
    expect(await stop.textContent()).toBe('Stop this run')
    await screenshot(page, 'settlement-probabilistic-running-laptop')
    await stop.click()
    const stopped = page.getByTestId('run-stopped')
    await stopped.waitFor()
    expect(await stopped.textContent()).toContain('Stopped before it finished')
    expect(await page.getByTestId('run-progress').count()).toBe(0)
    expect(await stopped.getByRole('link').getAttribute('href')).toBe(`/projects/${copy.id}/settlement/new?from=${copyRun}`)
    const { rows: [row] } = await pool.query<{ status: string }>('select status from settlement_runs where id = $1', [copyRun])
    expect(row!.status).toBe('cancelled')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'settlement-probabilistic-stopped-phone')
    await page.close()
  })

  it('the demo\'s seeded yard run opens on its Probability tab from a link, with the figures it stored (read only)', async () => {
    const demoId = await demoProjectId(designer)
    const { runs } = await must('runs', designer.get<SettlementRunList>(`/api/projects/${demoId}/settlement-runs?limit=200`))
    const listed = runs.find(r => r.name === 'Yard embankment, 6 m on version 1')
    expect(listed).toBeDefined()
    const { run } = await must('run', designer.get<{ run: SettlementRun }>(`/api/projects/${demoId}/settlement-runs/${listed!.id}`))
    const centrePoint = run.results!.points.find(p => p.label === 'Yard centre')!
    const spread = centrePoint.probabilistic!
    expect(run.results!.probabilistic!.fromData).toBe(true)

    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.goto(`${baseUrl()}/projects/${demoId}/settlement/${listed!.id}?tab=probability`)
    const row = page.getByTestId('spread-row-Yard centre')
    await row.waitFor()
    expect(await page.getByTestId('run-tab-probability').getAttribute('aria-selected')).toBe('true')
    const mm = (v: number) => formatSettlement(v, 'SI', false)
    expect(cell(await row.locator('[data-q="p50"]').textContent())).toBe(mm(spread.quantiles.p50))
    expect(cell(await row.locator('[data-q="p95"]').textContent())).toBe(mm(spread.quantiles.p95))
    expect(cell(await page.getByTestId('spread-used-realizations').textContent())).toBe(run.results!.probabilistic!.realizations.toLocaleString('en-GB'))
    await page.getByTestId('spread-tornado').waitFor()
    // Back to the single figure: the other tab, by the keyboard.
    await page.getByTestId('run-tab-probability').focus()
    await page.keyboard.press('ArrowLeft')
    await page.waitForURL(url => !url.search.includes('tab='))
    expect(await page.getByTestId('run-tab-adopted').getAttribute('aria-selected')).toBe('true')
    await page.getByTestId('contour-band').first().waitFor()
    await page.close()
  })
})
