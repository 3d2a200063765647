import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { beforeAll, describe, expect, it } from 'vitest'
import { depthTrendCandidates, eligibleTests, type TestCompressibility } from '../../shared/site-model/compressibility'
import { depthTrendAt, stratumBounds, type SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { baseUrl, type Client, demoEmail, signIn } from '../helpers/http'
import { openWorkspace, screenshot, SCREENSHOTS, signInAs, useBrowser } from './helpers'

interface ModelRow { id: string, name: string, draft: SiteModelDefinition, version: number }
interface ListedTest {
  id: string
  stratumCode: string | null
  depth: number
  e0: number
  point: { identifier: string }
  sample: { identifier: string }
  reading: { qualityClass: string | null, cc: number | null, cr: number | null, cv: number | null, calpha: number | null }
  adoption: { id: string } | null
}

const asCompressibility = (t: ListedTest): TestCompressibility => ({ id: t.id, stratumCode: t.stratumCode, depth: t.depth, qualityClass: t.reading.qualityClass, cc: t.reading.cc, cr: t.reading.cr, e0: t.e0, cv: t.reading.cv, calpha: t.reading.calpha })

const pop = { model: 'pop' as const, logSpace: false, parameters: { pop: 25 }, n: 6, r2: 0.8, rmse: 6, aic: 20, aicc: 24, includedPointIds: [], excludedPointIds: [] }

describe('compressibility with depth and flagged tests on the stress canvas, in Chromium', () => {
  const browser = useBrowser()
  let engineer: Client
  let projectId = ''
  let tests: ListedTest[] = []
  const estIndex = 2
  let seq = 0

  /** A new model of the project: the estuarine clay compressible, with the scenario's POP and the mean compressibility as constants. */
  async function newModel(): Promise<ModelRow> {
    seq += 1
    const created = await engineer.post<{ model: ModelRow }>(`/api/projects/${projectId}/models`, { name: `Saltmarsh Lane, Cc with depth ${Date.now().toString(36)}-${seq}` })
    expect(created.status).toBe(201)
    const draft: SiteModelDefinition = {
      ...created.body.model.draft,
      strata: created.body.model.draft.strata.map((s, i) => (i === estIndex ? { ...s, compressible: true, trend: pop, compressibility: { cc: 0.85, cr: 0.09, e0: 2.1, cv: 1.2, drainage: 'double', source: 'mean', n: 5 } } : s)),
    }
    const put = await engineer.request<{ model: ModelRow }>('PUT', `/api/projects/${projectId}/models/${created.body.model.id}/draft`, { draft, version: created.body.model.version })
    expect(put.status).toBe(200)
    return put.body.model
  }

  // A copy of the demo site of this file's own; each test makes its own model of it.
  beforeAll(async () => {
    mkdirSync(SCREENSHOTS, { recursive: true })
    engineer = await signIn(demoEmail('engineer'))
    projectId = await createDemoCopy('E2E-CCT')
    tests = (await engineer.get<{ tests: ListedTest[] }>(`/api/projects/${projectId}/tests/oedometer?limit=100`)).body.tests
  })

  it('the engineer sets Cc of the estuarine clay to a depth trend, sees n and R², saves a version; the export\'s Cc varies with depth', async () => {
    const model = await newModel()
    expect(model.draft.strata[estIndex]!.code).toBe('EST')
    const page = await signInAs(browser.context, demoEmail('engineer'))
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${model.id}`)
    await openWorkspace(page)
    await page.getByTestId('model-workspace').waitFor()
    await page.getByTestId('band-select').selectOption(String(estIndex))
    // The fit on offer, from the clay's eligible tests, before it is chosen.
    const stats = page.getByTestId('trend-stats-cc')
    await stats.waitFor({ timeout: 15_000 })
    const offeredN = Number(await stats.getAttribute('data-n'))
    const offeredR2 = Number(await stats.getAttribute('data-r2'))
    // The clay's tests better than very poor, less any a reviewer excluded (the same tests as the mean).
    const excluded = (await engineer.get<{ flags: { targetId: string }[] }>(`/api/projects/${projectId}/flags?status=open&targetType=oedometer-test&verdict=exclude&limit=500`)).body.flags.map(f => f.targetId)
    const eligible = eligibleTests(tests.map(asCompressibility), 'EST', new Set(excluded))
    expect(eligible.length).toBeGreaterThanOrEqual(4)
    expect(offeredN).toBe(eligible.length)
    expect(offeredR2).toBeGreaterThanOrEqual(0)
    expect(offeredR2).toBeLessThanOrEqual(1)
    expect(await stats.textContent()).toContain(`n ${offeredN} · R² ${offeredR2.toFixed(2)}`)
    expect(await page.getByTestId('trend-row-cc').getAttribute('data-chosen')).toBe('false')

    await page.getByTestId('trend-choice-cc').selectOption('trend')
    await expect.poll(() => page.getByTestId('trend-row-cc').getAttribute('data-chosen')).toBe('true')
    expect(await page.getByLabel('Cc', { exact: true }).isDisabled()).toBe(true)
    expect(await page.getByTestId('session-bar').getAttribute('data-dirty')).toBe('true')
    await page.getByTestId('compressibility-trends').scrollIntoViewIfNeeded()
    await screenshot(page, 'compressibility-cc-depth-trend')
    await page.getByTestId('stratum-panel').screenshot({ path: join(SCREENSHOTS, 'compressibility-cc-depth-trend-panel.png') })
    // Undo takes the choice back; redo brings it again.
    await page.getByTestId('undo').click()
    await expect.poll(() => page.getByTestId('trend-row-cc').getAttribute('data-chosen')).toBe('false')
    await page.getByTestId('redo').click()
    await expect.poll(() => page.getByTestId('trend-row-cc').getAttribute('data-chosen')).toBe('true')

    await page.getByTestId('version-message').fill('EST Cc follows depth (least squares on its tests)')
    await page.getByTestId('save-version').click()
    await page.getByTestId('version-row-1').waitFor()
    await page.close()

    const saved = (await engineer.get<{ version: { definition: SiteModelDefinition } }>(`/api/projects/${projectId}/models/${model.id}/versions/1`)).body.version.definition
    expect(saved.schemaVersion).toBe(2)
    const trend = saved.strata[estIndex]!.compressibility!.trends!.cc!
    expect(trend.n).toBe(offeredN)
    // The same least squares on the tests as the API lists them, with the fitted tests as the eligible ones.
    expect(trend.testIds).toEqual(eligible.map(t => t.id))
    const oracle = depthTrendCandidates(eligible, 'EST').cc
    if (!oracle.ok) throw new Error(oracle.reason)
    expect(trend).toEqual(oracle.trend)

    const exp = await engineer.get<{ layers: { name: string, thickness: number, cc?: number }[] }>(`/api/projects/${projectId}/models/${model.id}/versions/1/export`)
    expect(exp.status).toBe(200)
    const { top, bottom } = stratumBounds(saved)[estIndex]!
    const slices = exp.body.layers.filter(l => l.name.startsWith(saved.strata[estIndex]!.name))
    expect(slices.length).toBe(Math.ceil((bottom - top) / 0.25 - 1e-9))
    let z = top
    for (const l of slices) {
      expect(l.cc).toBeCloseTo(depthTrendAt(trend, z + l.thickness / 2), 9)
      z += l.thickness
    }
    // Cc differs from the top of the clay to its base, by the trend's gradient.
    expect(new Set(slices.map(l => l.cc!.toFixed(6))).size).toBe(slices.length)
    expect(slices[slices.length - 1]!.cc! - slices[0]!.cc!).toBeCloseTo(trend.gradient * (z - top - 0.5 * (slices[0]!.thickness + slices[slices.length - 1]!.thickness)), 9)
  })

  it('a disturbed test the reviewer flagged, with no σ\'p adopted, shows its mark on the stress track with the flag on hover', async () => {
    const model = await newModel()
    const disturbed = tests.find(t => t.stratumCode === 'EST' && !t.adoption && t.reading.qualityClass === 'very-poor')!
    expect(disturbed).toBeDefined()
    // What the point layer draws before the flag: the flag must not change it (no σ'p point, no fit).
    const before = await signInAs(browser.context, demoEmail('engineer'))
    await before.goto(`${baseUrl()}/projects/${projectId}/models/${model.id}`)
    await openWorkspace(before)
    const layer0 = before.getByTestId('point-layer')
    await expect.poll(async () => Number(await layer0.getAttribute('data-drawn')), { timeout: 15_000 }).toBeGreaterThan(100)
    const drawn = await layer0.getAttribute('data-drawn')
    const flaggedOut = await layer0.getAttribute('data-flagged-out')
    // Marked before only if another reviewer's flag on it is still open (the review tests flag the disturbed tests too).
    const openBefore = (await engineer.get<{ flags: { targetId: string }[] }>(`/api/projects/${projectId}/flags?status=open&targetType=oedometer-test&limit=500`)).body.flags.filter(f => f.targetId === disturbed.id).length
    expect(await before.getByTestId(`flagged-test-${disturbed.id}`).count()).toBe(openBefore ? 1 : 0)
    await before.close()

    const reviewer = await signIn(demoEmail('reviewer'))
    const comment = 'Rounded curve and low σ\'p: a disturbed tube, repeat before any use.'
    const flag = await reviewer.post<{ flag: { id: string, version: number } }>(`/api/projects/${projectId}/flags`, { targetType: 'oedometer-test', targetId: disturbed.id, verdict: 'exclude', comment })
    expect(flag.status).toBe(201)
    try {
      const page = await signInAs(browser.context, demoEmail('engineer'))
      await page.goto(`${baseUrl()}/projects/${projectId}/models/${model.id}`)
      await openWorkspace(page)
      await page.getByTestId('model-workspace').waitFor()
      const mark = page.getByTestId(`flagged-test-${disturbed.id}`)
      await mark.waitFor({ timeout: 15_000 })
      expect(await mark.getAttribute('data-verdict')).toBe('exclude')
      expect(Number(await mark.getAttribute('data-depth'))).toBeCloseTo(disturbed.depth, 9)
      // It sits at the sample's depth: level with the depth of the EST band it falls in.
      const band = (await page.getByTestId(`band-${estIndex}`).boundingBox())!
      const box = (await mark.boundingBox())!
      const { top, bottom } = stratumBounds(model.draft)[estIndex]!
      const expectedY = band.y + ((disturbed.depth - top) / (bottom - top)) * band.height
      expect(box.y + box.height / 2).toBeCloseTo(expectedY, -1)
      // The point layer is as it was: the test is no σ'p point, so no fit sees it.
      const layer = page.getByTestId('point-layer')
      await expect.poll(() => layer.getAttribute('data-drawn'), { timeout: 15_000 }).toBe(drawn)
      expect(await layer.getAttribute('data-flagged-out')).toBe(flaggedOut)
      expect(await page.getByTestId('point-legend').textContent()).toContain('Flagged test, no σ\'p')

      await mark.hover()
      const card = page.getByTestId('flagged-test-tooltip')
      await card.waitFor()
      const text = (await card.textContent()) ?? ''
      expect(await card.getAttribute('data-test-id')).toBe(disturbed.id)
      expect(text).toContain(disturbed.point.identifier)
      expect(text).toContain(disturbed.sample.identifier)
      expect(text).toContain(`${disturbed.depth.toFixed(2)} m`)
      expect(text).toContain('Exclude from fits')
      expect(text).toContain(comment)
      await screenshot(page, 'stress-model-flagged-test-mark')
      // The card as it shows under the pointer: a full-page capture moves the pointer off the mark, a clip of the viewport does not.
      // Page scroll (not the wheel, which zooms the depth) brings the mark near the top of the viewport.
      await page.evaluate(dy => window.scrollBy(0, dy), (await mark.boundingBox())!.y - 150)
      await mark.hover()
      await card.waitFor()
      const m = (await mark.boundingBox())!
      await page.screenshot({ path: join(SCREENSHOTS, 'stress-model-flagged-test-card.png'), clip: { x: Math.max(0, m.x - 200), y: Math.max(0, m.y - 150), width: 640, height: 440 } })
      await page.close()
    }
    finally {
      // Resolved again, so no other test of this file meets the exclusion.
      await reviewer.patch(`/api/projects/${projectId}/flags/${flag.body.flag.id}`, { status: 'resolved', version: flag.body.flag.version })
    }
  })
})
