import { readFileSync } from 'node:fs'
import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { RESULT_CAUTION } from '../../shared/caution'
import { computeStressProfile } from '../../shared/geotech/stress'
import { toStressInput } from '../../shared/site-model/convert'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { ESTUARINE_POP } from '../../shared/demo/site'
import { createDemoCopy } from '../helpers/demo-project'
import { baseUrl, type Client, demoEmail, signIn } from '../helpers/http'
import { openWorkspace, screenshot, signInAs, useBrowser } from './helpers'

interface ModelRow { id: string, name: string, draft: SiteModelDefinition, version: number }

/** σ'v0 (kPa) at a depth of a definition, by the engine itself. */
function effectiveAt(def: SiteModelDefinition, depth: number): number {
  const p = computeStressProfile({ ...toStressInput(def), depths: [depth] }).points.find(q => Math.abs(q.depth - depth) < 1e-9)
  if (!p) throw new Error(`no stress at ${depth} m`)
  return p.effectiveStress
}

async function probeEffective(page: Page): Promise<number> {
  return Number(await page.getByTestId('probe-effective').getAttribute('data-value'))
}

/** Drags an element's centre vertically by `dy` px in small steps, as a hand does. */
async function dragBy(page: Page, testId: string, dy: number) {
  const box = await page.getByTestId(testId).boundingBox()
  if (!box) throw new Error(`${testId} is not on screen`)
  const x = box.x + box.width * 0.6
  const y = box.y + box.height / 2
  await page.mouse.move(x, y)
  await page.mouse.down()
  for (let i = 1; i <= 10; i++) await page.mouse.move(x, y + (dy * i) / 10)
  await page.mouse.up()
}

/**
 * A σ'p point on screen near `depth` in the EST band (band 2, `estThickness` thick):
 * sweeps the pointer across the stress track at that depth until the hover card
 * names a fitted CPT point.
 */
async function findPoint(page: Page, depth: number, estThickness: number): Promise<{ x: number, y: number, id: string }> {
  await page.getByTestId('stress-overlay').scrollIntoViewIfNeeded()
  const band = (await page.getByTestId('band-2').boundingBox())!
  const overlay = (await page.getByTestId('stress-overlay').boundingBox())!
  const estTop = Number(await page.getByTestId('break-1').getAttribute('data-depth'))
  const y = band.y + ((depth - estTop) / estThickness) * band.height
  for (let x = overlay.x + 4; x < overlay.x + overlay.width / 2; x += 2) {
    await page.mouse.move(x, y)
    const card = page.getByTestId('point-tooltip')
    if (await card.count()) {
      const id = (await card.getAttribute('data-point-id')) ?? ''
      if (id.startsWith('cpt:') && (await card.getAttribute('data-state')) === 'included') return { x, y, id }
    }
  }
  throw new Error(`no fitted CPT point found at ${depth} m`)
}

describe('the stress workspace in Chromium', () => {
  const browser = useBrowser()
  let engineer: Client
  let projectId = ''
  const name = `Saltmarsh Lane stress model ${Date.now().toString(36)}`

  // A copy of the demo site of this file's own; each test opens a model it made itself.
  beforeAll(async () => {
    engineer = await signIn(demoEmail('engineer'))
    projectId = await createDemoCopy('E2E-STR')
  })

  /** A new model of the project (its draft from the logs), made by the engineer through the API; its id. */
  async function newModel(suffix: string): Promise<string> {
    const created = await engineer.post<{ model: ModelRow }>(`/api/projects/${projectId}/models`, { name: `${name} (${suffix})` })
    expect(created.status).toBe(201)
    return created.body.model.id
  }

  it('the engineer builds a model: moves the water table, fits the estuarine clay with constant POP, saves a version and reopens it read-only', async () => {
    const page = await signInAs(browser.context, 'tomas.lindqvist@harrow-estuary.example')
    await page.goto(`${baseUrl()}/projects/${projectId}`)
    await page.getByTestId('project-nav').getByRole('link', { name: 'Stress model' }).click()
    await page.getByTestId('new-model').click()
    await page.getByLabel('Name').fill(name)
    await page.getByRole('button', { name: 'Create and open' }).click()
    await page.getByTestId('model-title').filter({ hasText: name }).waitFor()

    const models = (await engineer.get<{ models: { id: string, name: string }[] }>(`/api/projects/${projectId}/models`)).body.models
    const modelId = models.find(m => m.name === name)!.id
    const start = (await engineer.get<{ model: ModelRow }>(`/api/projects/${projectId}/models/${modelId}`)).body.model
    expect(start.draft.strata.map(s => s.code)).toEqual(['MG', 'CRUST', 'EST', 'GLAC', 'SAND'])

    // The profile of the draft from the logs, read at 10 m, is the engine's.
    await page.getByTestId('effective-stress-line').waitFor()
    await expect.poll(() => probeEffective(page), { timeout: 10_000 }).toBeGreaterThan(0)
    const before = await probeEffective(page)
    expect(before).toBeCloseTo(effectiveAt(start.draft, 10), 2)
    // σ'p points from all three sources and the dense CPT layer are on the canvas.
    await expect.poll(async () => Number(await page.getByTestId('dense-layer').getAttribute('data-count')), { timeout: 15_000 }).toBeGreaterThan(1000)
    expect(await page.getByTestId('point-legend').textContent()).toContain('Sample quality')
    expect(await page.getByTestId('workspace-caution').textContent()).toBe(RESULT_CAUTION)
    await screenshot(page, 'stress-model-new')

    // Drag the water table about 2 m down: σ'v0 at 10 m rises, exactly as the engine says for the new table.
    const tableBefore = Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))
    const pxPerMetre = await page.evaluate(thickness => document.querySelector('[data-testid="band-2"]')!.getBoundingClientRect().height / thickness, start.draft.strata[2]!.thickness)
    await dragBy(page, 'water-table-handle', 2 * pxPerMetre)
    await expect.poll(async () => Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))).toBeGreaterThan(tableBefore + 1.5)
    const tableAfter = Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))
    expect(tableAfter).toBeLessThan(tableBefore + 2.5)
    const expected = effectiveAt({ ...start.draft, groundwater: { ...start.draft.groundwater, waterTableDepth: tableAfter } }, 10)
    await expect.poll(() => probeEffective(page), { timeout: 10_000 }).toBeCloseTo(expected, 2)
    // A lower table takes about (γw − (γ − γsat))·Δzw off u at depth: some 18 kPa for 2 m here.
    expect(expected - before).toBeGreaterThan(12)
    expect(await page.getByTestId('session-bar').getAttribute('data-dirty')).toBe('true')
    await screenshot(page, 'stress-model-water-table-dragged')

    // Undo puts the table back and σ'v0 with it.
    await page.getByTestId('undo').click()
    await expect.poll(async () => Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))).toBe(tableBefore)
    await expect.poll(() => probeEffective(page), { timeout: 10_000 }).toBeCloseTo(before, 4)
    expect(await page.getByTestId('session-bar').getAttribute('data-dirty')).toBe('false')

    // Fit the estuarine clay with constant POP on the oedometer and CPT points. Vane σ'p is shown but
    // left out: su/0.22 depends on a Bjerrum μ from the plasticity index, and without one it reads high.
    const estIndex = start.draft.strata.findIndex(s => s.code === 'EST')
    await page.getByTestId('band-select').selectOption(String(estIndex))
    await page.getByTestId('fit-panel').and(page.locator('[data-code="EST"]')).waitFor()
    await page.getByTestId('fit-source-vane').uncheck()
    await expect.poll(async () => (await page.getByTestId('fit-panel').textContent()) ?? '').toMatch(/Field vane\s*0 of \d+/)
    await page.getByTestId('fit-model').selectOption('pop')
    await page.getByTestId('fit-run').click()
    const result = page.getByTestId('fit-result')
    await result.and(page.locator('[data-model="pop"]')).waitFor()
    const pop = Number(await result.getAttribute('data-pop'))
    const n = Number(await result.getAttribute('data-n'))
    // The scenario's truth is POP = 25 kPa. Two disturbed tubes read low and the CPT σ'p = 0.33·qnet
    // carries scatter and shell spikes; the demo data recover 22–26 kPa through the engine, so a fit
    // outside 15–35 kPa means the chain (σ'v0, points, band assignment or fit) is wrong.
    expect(ESTUARINE_POP).toBe(25)
    expect(pop).toBeGreaterThan(15)
    expect(pop).toBeLessThan(35)
    expect(n).toBeGreaterThan(100)
    await expect.poll(() => page.getByTestId(`trend-line-${estIndex}`).count()).toBe(1)
    await expect.poll(() => page.getByTestId(`pop-line-${estIndex}`).count()).toBe(1)
    const fitted = (await page.getByTestId('fit-param-pop').textContent()) ?? ''
    expect(fitted).toContain(pop.toFixed(1))
    await screenshot(page, 'stress-model-est-pop-fit')

    // Clicking a fitted point leaves it out and refits in the same step; Undo takes both back.
    const layer = page.getByTestId('point-layer')
    const excludedCount = async () => Number(await layer.getAttribute('data-excluded'))
    const excluded0 = await excludedCount()
    const hit = await findPoint(page, (start.draft.strata[0]!.thickness + start.draft.strata[1]!.thickness + 4.5), start.draft.strata[2]!.thickness)
    await page.mouse.click(hit.x, hit.y)
    await expect.poll(excludedCount).toBe(excluded0 + 1)
    await expect.poll(async () => Number(await result.getAttribute('data-n'))).toBe(n - 1)
    expect(Number(await result.getAttribute('data-pop'))).not.toBe(pop)
    await page.mouse.move(hit.x, hit.y + 1)
    await expect.poll(() => page.getByTestId('point-tooltip').getAttribute('data-state')).toBe('excluded')
    expect(await page.getByTestId('point-tooltip').getAttribute('data-point-id')).toBe(hit.id)
    await page.getByTestId('undo').click()
    await expect.poll(async () => Number(await result.getAttribute('data-n'))).toBe(n)
    expect(Number(await result.getAttribute('data-pop'))).toBe(pop)
    expect(await excludedCount()).toBe(excluded0)

    // A shift-drag lasso round part of the cloud leaves those points out, in one step.
    await page.mouse.move(hit.x - 30, hit.y - 25)
    await page.keyboard.down('Shift')
    await page.mouse.down()
    for (const [dx, dy] of [[30, -25], [30, 25], [-30, 25], [-30, -25]] as const) await page.mouse.move(hit.x + dx, hit.y + dy, { steps: 4 })
    await page.mouse.up()
    await page.keyboard.up('Shift')
    await expect.poll(excludedCount).toBeGreaterThan(excluded0 + 1)
    const lassoed = (await excludedCount()) - excluded0
    await expect.poll(async () => Number(await result.getAttribute('data-n'))).toBe(n - lassoed)
    await screenshot(page, 'stress-model-lasso')
    await page.getByTestId('undo').click()
    await expect.poll(async () => Number(await result.getAttribute('data-n'))).toBe(n)
    expect(await excludedCount()).toBe(excluded0)

    // The drawing exports as SVG (with the caution under it) and as PNG.
    const [svgDownload] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-svg').click()])
    const svgText = readFileSync((await svgDownload.path())!, 'utf8')
    expect(svgDownload.suggestedFilename()).toMatch(/\.svg$/)
    expect(svgText).toContain('<svg')
    expect(svgText).toContain('data:image/png;base64')
    expect(svgText).toContain('Results are estimates for engineers to check.')
    const [pngDownload] = await Promise.all([page.waitForEvent('download'), page.getByTestId('export-png').click()])
    const png = readFileSync((await pngDownload.path())!)
    expect([...png.subarray(0, 4)]).toEqual([0x89, 0x50, 0x4e, 0x47])
    expect(png.readUInt32BE(16)).toBeGreaterThan(1500) // 2 × the drawing's width

    // Save a version (the draft is saved first): it appears in the list.
    await page.getByTestId('version-message').fill('Water at the median standing level; EST fitted with constant POP (oedometer and CPT)')
    await page.getByTestId('save-version').click()
    await page.getByTestId('version-row-1').waitFor()
    expect(await page.getByTestId('session-bar').getAttribute('data-dirty')).toBe('false')
    const saved = (await engineer.get<{ version: { definition: SiteModelDefinition, message: string } }>(`/api/projects/${projectId}/models/${modelId}/versions/1`)).body.version
    const trend = saved.definition.strata[estIndex]!.trend!
    expect(trend.model).toBe('pop')
    expect(trend.parameters.pop).toBeCloseTo(pop, 6)
    expect(trend.includedPointIds).toHaveLength(n)
    expect(trend.excludedPointIds.some(id => id.startsWith('vane:'))).toBe(true)
    expect(trend.includedPointIds.some(id => id.startsWith('vane:'))).toBe(false)
    await screenshot(page, 'stress-model-version-saved')

    // Reopen it: read-only, with the same fit and no handles.
    await page.getByTestId('open-version-1').click()
    await page.getByTestId('version-title').filter({ hasText: 'version 1' }).waitFor()
    const ws = page.getByTestId('model-workspace')
    expect(await ws.getAttribute('data-read-only')).toBe('true')
    await page.getByTestId('effective-stress-line').waitFor()
    await page.getByTestId('band-select').selectOption(String(estIndex))
    expect(Number(await page.getByTestId('fit-result').getAttribute('data-pop'))).toBeCloseTo(pop, 6)
    expect(await page.getByTestId('water-table-handle').count()).toBe(0)
    expect(await page.getByTestId('fit-run').count()).toBe(0)
    expect(await page.getByTestId('save-version').count()).toBe(0)
    expect(await page.getByTestId('start-draft').count()).toBe(1)
    expect(await page.getByTestId('export-json').getAttribute('href')).toBe(`/api/projects/${projectId}/models/${modelId}/versions/1/export`)
    await expect.poll(() => probeEffective(page), { timeout: 10_000 }).toBeCloseTo(before, 4)
    // The dense CPT rows of the clay strata and the tests (378 on the demo copy: no σ'p from CPT or vane in made ground and sand).
    await expect.poll(async () => Number(await page.getByTestId('point-layer').getAttribute('data-drawn')), { timeout: 15_000 }).toBeGreaterThan(350)
    // Same points, same σ'v0: the saved fit is not stale once all its points are in (the last pages of points can
    // still be arriving when the first 350 are drawn, and the fit reads as stale until they are).
    await expect.poll(() => page.getByTestId('fit-stale').count(), { timeout: 10_000 }).toBe(0)
    await screenshot(page, 'stress-model-version-read-only')
    await page.close()
  })

  it('a fit asked while the σ\'p of a moved water table are still being worked out waits for them', async () => {
    const modelId = await newModel('fit waits')
    const start = (await engineer.get<{ model: ModelRow }>(`/api/projects/${projectId}/models/${modelId}`)).body.model
    const estIndex = start.draft.strata.findIndex(s => s.code === 'EST')
    const page = await signInAs(browser.context, demoEmail('engineer'))
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${modelId}`)
    await openWorkspace(page)
    await expect.poll(async () => Number(await page.getByTestId('dense-layer').getAttribute('data-count')), { timeout: 15_000 }).toBeGreaterThan(1000)
    await expect.poll(() => probeEffective(page), { timeout: 10_000 }).toBeGreaterThan(0)
    const before = await probeEffective(page)
    await page.getByTestId('band-select').selectOption(String(estIndex))
    await page.getByTestId('fit-model').selectOption('pop')

    // The points worked out for an edit arrive 2.5 s after they are asked for; σ'v0 comes at once.
    let held = 0
    await page.route('**/preconsolidation-points/evaluate', async (route) => {
      held++
      await new Promise(resolve => setTimeout(resolve, 2500))
      await route.continue()
    })
    const pxPerMetre = await page.evaluate(thickness => document.querySelector('[data-testid="band-2"]')!.getBoundingClientRect().height / thickness, start.draft.strata[2]!.thickness)
    await dragBy(page, 'water-table-handle', 2 * pxPerMetre)
    await expect.poll(() => probeEffective(page), { timeout: 10_000 }).toBeGreaterThan(before + 12)
    // Fit at once: the panel waits for the CPT σ'p of the new table (they follow the total stress) before fitting.
    await page.getByTestId('fit-run').click()
    expect(await page.getByTestId('fit-run').textContent()).toContain('Fitting')
    expect(await page.getByTestId('fit-waiting').textContent()).toContain('Waiting for σ\'v0 and σ\'p of the latest edit')
    const result = page.getByTestId('fit-result')
    await result.and(page.locator('[data-model="pop"]')).waitFor({ timeout: 15_000 })
    expect(held).toBeGreaterThan(0)
    const pop = Number(await result.getAttribute('data-pop'))
    expect(await page.getByTestId('fit-waiting').count()).toBe(0)
    await page.unroute('**/preconsolidation-points/evaluate')

    // With everything in, fitting again gives the same POP to the last digit: the first fit had the new table's σ'p.
    await expect.poll(() => page.getByTestId('fit-run').textContent()).toContain('Fit again')
    await page.getByTestId('fit-run').click()
    await expect.poll(() => page.getByTestId('fit-run').textContent()).toContain('Fit again')
    expect(Number(await result.getAttribute('data-pop'))).toBe(pop)
    await page.close()
  })

  it('unsaved edits survive a reload and are offered back', async () => {
    const page = await signInAs(browser.context, demoEmail('engineer'))
    const created = await engineer.post<{ model: ModelRow }>(`/api/projects/${projectId}/models`, { name: `${name} (reload)` })
    expect(created.status).toBe(201)
    const model = created.body.model
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${model.id}`)
    await openWorkspace(page)
    await page.getByTestId('water-table-input').waitFor()
    await page.getByTestId('water-table-input').fill('2.35')
    await page.getByTestId('water-table-input').press('Enter')
    await expect.poll(async () => Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))).toBe(2.35)
    await page.reload()
    await page.getByTestId('draft-recovery').waitFor()
    // The page opens with the saved draft's drawing while the question stands; the workspace opened meanwhile shows
    // the saved draft too, and editing waits for the answer.
    expect(await page.getByTestId('model-drawing-preview').count()).toBe(1)
    await openWorkspace(page)
    expect(await page.getByTestId('water-table-handle').count()).toBe(0)
    expect(Number(await page.getByTestId('water-table-input').inputValue())).toBe(model.draft.groundwater.waterTableDepth)
    await screenshot(page, 'stress-model-recovery')
    await page.getByTestId('recovery-restore').click()
    await expect.poll(async () => Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))).toBe(2.35)
    expect(await page.getByTestId('session-bar').getAttribute('data-dirty')).toBe('true')
    await page.getByTestId('save-draft').click()
    await expect.poll(async () => page.getByTestId('session-bar').getAttribute('data-dirty')).toBe('false')
    const after = (await engineer.get<{ model: ModelRow }>(`/api/projects/${projectId}/models/${model.id}`)).body.model
    expect(after.draft.groundwater.waterTableDepth).toBe(2.35)
    expect(after.version).toBe(model.version + 1)
    await page.close()
  })

  it('a stale draft save shows theirs against yours', async () => {
    const page = await signInAs(browser.context, demoEmail('engineer'))
    const created = await engineer.post<{ model: ModelRow }>(`/api/projects/${projectId}/models`, { name: `${name} (conflict)` })
    const model = created.body.model
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${model.id}`)
    await openWorkspace(page)
    await page.getByTestId('water-table-input').waitFor()
    // Someone else saves the draft first, with another surcharge.
    const theirs = await engineer.request('PUT', `/api/projects/${projectId}/models/${model.id}/draft`, { draft: { ...model.draft, surcharge: 12 }, version: model.version })
    expect(theirs.status).toBe(200)
    await page.getByTestId('water-table-input').fill('1.9')
    await page.getByTestId('water-table-input').press('Enter')
    await page.getByTestId('save-draft').click()
    const conflict = page.getByTestId('draft-conflict')
    await conflict.waitFor()
    const text = (await conflict.textContent()) ?? ''
    expect(text).toContain('groundwater.waterTableDepth')
    expect(text).toContain('surcharge')
    await screenshot(page, 'stress-model-conflict')
    await page.getByTestId('conflict-take-theirs').click()
    await expect.poll(async () => Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))).toBe(model.draft.groundwater.waterTableDepth)
    // Undo brings mine back on top of their revision.
    await page.getByTestId('undo').click()
    await expect.poll(async () => Number(await page.getByTestId('water-table-handle').getAttribute('data-depth'))).toBe(1.9)
    await page.close()
  })

  it('an impossible pore pressure is shown at its depth while the last good curve stays', async () => {
    const page = await signInAs(browser.context, demoEmail('engineer'))
    const created = await engineer.post<{ model: ModelRow }>(`/api/projects/${projectId}/models`, { name: `${name} (uplift)` })
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${created.body.model.id}`)
    await openWorkspace(page)
    await page.getByTestId('effective-stress-line').waitFor()
    const ws = page.getByTestId('model-workspace')
    await expect.poll(async () => Number(await ws.getAttribute('data-profile-sequence'))).toBeGreaterThan(0)
    const seq = Number(await ws.getAttribute('data-profile-sequence'))
    // A control point on the hydrostatic line, then 400 kPa there: the clay would lift (σ'v0 < 0).
    await page.getByTestId('add-piezometer').click()
    await page.getByTestId('piezometer-0').waitFor()
    await expect.poll(async () => Number(await ws.getAttribute('data-profile-sequence'))).toBeGreaterThan(seq)
    const curve = await page.getByTestId('effective-stress-line').getAttribute('d')
    const u = page.getByTestId('water-panel').getByLabel('u (kPa)', { exact: true })
    await u.fill('400')
    await u.press('Enter')
    const error = page.getByTestId('profile-error')
    await error.waitFor()
    expect(await error.textContent()).toContain('effective stress falls to zero')
    await page.getByTestId('profile-error-mark').waitFor()
    // The last good curve stays on screen beside the error.
    expect(await page.getByTestId('effective-stress-line').getAttribute('d')).toBe(curve)
    await screenshot(page, 'stress-model-uplift')
    await page.getByTestId('undo').click()
    await expect.poll(() => page.getByTestId('profile-error').count()).toBe(0)
    expect(await page.getByTestId('effective-stress-line').getAttribute('d')).toBe(curve)
    await page.close()
  })

  it('the reviewer excludes an oedometer test and the engineer sees its σ\'p flagged on the canvas, drawn but not fitted', async () => {
    const reviewer = await signIn(demoEmail('reviewer'))
    const tests = (await reviewer.get<{ tests: { id: string, stratumCode: string | null, adoption: { value: number } | null, label: string }[] }>(`/api/projects/${projectId}/tests/oedometer?limit=100`)).body.tests
    const target = tests.find(t => t.stratumCode === 'EST' && t.adoption)!
    expect(target).toBeDefined()
    const flag = await reviewer.post<{ flag: { id: string, version: number } }>(`/api/projects/${projectId}/flags`, { targetType: 'oedometer-test', targetId: target.id, verdict: 'exclude', comment: 'Rounded curve: treat as disturbed until the repeat test is in.' })
    expect(flag.status).toBe(201)
    try {
      const modelId = await newModel('flagged')
      const page = await signInAs(browser.context, 'tomas.lindqvist@harrow-estuary.example')
      await page.goto(`${baseUrl()}/projects/${projectId}/models/${modelId}`)
      await openWorkspace(page)
      await page.getByTestId('model-workspace').waitFor()
      const layer = page.getByTestId('point-layer')
      await expect.poll(async () => Number(await layer.getAttribute('data-flagged-out')), { timeout: 15_000 }).toBeGreaterThanOrEqual(1)
      await page.getByTestId('fit-panel').getByText(/excluded by reviewers: drawn, never fitted/).waitFor()
      await screenshot(page, 'stress-model-reviewer-flag')
      await page.close()
    }
    finally {
      // Resolved again, so no other test of this file meets the exclusion.
      await reviewer.patch(`/api/projects/${projectId}/flags/${flag.body.flag.id}`, { status: 'resolved', version: flag.body.flag.version })
    }
  })

  it('the engineer adopts the estuarine clay\'s compressibility as the mean of its oedometer tests', async () => {
    const modelId = await newModel('compressibility')
    const page = await signInAs(browser.context, 'tomas.lindqvist@harrow-estuary.example')
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${modelId}`)
    await openWorkspace(page)
    await page.getByTestId('model-workspace').waitFor()
    await page.getByTestId('band-select').selectOption('2')
    const compressible = page.getByTestId('band-compressible')
    if (!(await compressible.isChecked())) await compressible.check()
    await page.getByTestId('compressibility-from-tests').click()
    const source = page.getByTestId('compressibility-source')
    await source.waitFor()
    const n = Number((await source.textContent())!.match(/mean of (\d+)/)![1])
    // The demo has six EST tests, one of them very poor; a reviewer exclusion would lower n further.
    expect(n).toBeGreaterThanOrEqual(4)
    expect(n).toBeLessThanOrEqual(6)
    // Scenario truth for the estuarine clay: Cc 0.85, e0 2.10 (within the demo's generated scatter).
    const cc = Number(await page.getByLabel('Cc', { exact: true }).inputValue())
    expect(cc).toBeGreaterThan(0.75)
    expect(cc).toBeLessThan(0.95)
    expect(Number(await page.getByLabel('e0', { exact: true }).inputValue())).toBeCloseTo(2.1, 1)
    await screenshot(page, 'stress-model-compressibility-mean')
    await page.getByTestId('undo').click()
    await page.close()
  })

  it('a designer sees the model read-only', async () => {
    const modelId = await newModel('designer')
    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${modelId}`)
    await openWorkspace(page)
    await page.getByTestId('model-workspace').waitFor()
    expect(await page.getByTestId('model-workspace').getAttribute('data-read-only')).toBe('true')
    expect(await page.getByTestId('read-only-note').count()).toBe(1)
    expect(await page.getByTestId('save-draft').count()).toBe(0)
    expect(await page.getByTestId('water-table-handle').count()).toBe(0)
    await page.close()
  })
})
