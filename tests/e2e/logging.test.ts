import { beforeEach, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { RESULT_CAUTION } from '../../shared/caution'
import { baseUrl, createUser, demoEmail, signIn, signedInDemo, TEST_PASSWORD } from '../helpers/http'
import { pdfInfo } from '../helpers/pdf'
import { createProject, createStrata } from '../helpers/project'
import { openProjectAs, screenshot, signInAs, useBrowser } from './helpers'

interface Interval { id: string, top: number, bottom: number, description: string, uscs: string | null, stratumId: string | null, moisture: string | null, consistency: string | null, version: number }

/** Rows as a spreadsheet copies them: tab between cells, a line break after each row. */
const PASTED = [
  ['0', '1.2', 'Brown sandy angular GRAVEL with brick (fill)', 'GW', 'MG', 'moist', 'medium dense'],
  ['1.2', '3.4', 'Stiff fissured brown silty CLAY', 'cl', 'CR', 'moist', 'stiff'],
  ['3.4', '12', 'Soft grey CLAY with shell fragments', 'CH', 'Estuarine clay', 'wet', 'soft'],
  ['12', '18.5', 'Soft to firm grey slightly organic CLAY', 'CH', 'EC', 'wet', 'soft to firm'],
].map(r => r.join('\t')).join('\r\n') + '\r\n'

/** Dispatches a paste of `text` on the focused element, as a browser does for Ctrl+V. */
async function pasteInto(page: Page, label: string, text: string) {
  const cell = page.getByLabel(label, { exact: true })
  await cell.focus()
  await cell.evaluate((el, t) => {
    const data = new DataTransfer()
    data.setData('text/plain', t)
    el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }))
  }, text)
}

function intervalRects(page: Page) {
  return page.locator('[data-testid="graphic-log"] rect.interval')
}

describe('the field geologist\'s workspace in Chromium', () => {
  const browser = useBrowser()
  const { owner: admin, geologist } = signedInDemo('owner', 'geologist')
  let projectId = ''
  let boreholeId = ''
  let cptId = ''
  let pitId = ''
  const strata: Record<string, string> = {}

  const pointPath = (id: string) => `/projects/${projectId}/points/${id}`
  const log = async (id: string) => (await geologist.get<{ intervals: Interval[] }>(`/api/projects/${projectId}/points/${id}`)).body.intervals


  /** The borehole's page for one account, once its graphic log is drawn. */
  async function openBorehole(email: string, password?: string) {
    const page = await signInAs(browser.context, email, password)
    await page.goto(baseUrl() + pointPath(boreholeId))
    await page.getByTestId('graphic-log').waitFor()
    return page
  }

  /** The log PASTED describes, saved on BH-T1 through the API (for the tests that start from a saved log). */
  async function seedLog() {
    const rows = PASTED.trim().split('\r\n').map(r => r.split('\t'))
    const codes: Record<string, string> = { 'MG': 'MG', 'CR': 'CR', 'EC': 'EC', 'Estuarine clay': 'EC' }
    const intervals = rows.map(([top, bottom, description, uscs, stratum, moisture, consistency]) => ({
      top: Number(top), bottom: Number(bottom), description, uscs: uscs!.toUpperCase(), stratumId: strata[codes[stratum!]!]!, moisture, consistency,
    }))
    const r = await geologist.request('PUT', `/api/projects/${projectId}/points/${boreholeId}/intervals`, { intervals })
    expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(200)
    expect((await log(boreholeId)).length).toBe(4)
  }

  // Every test works in a project of its own: three strata, a borehole (with a tube, its index test and a
  // standing level), a CPT with a dense sounding and a test pit; BH-T1's log is empty until a test seeds it.
  beforeEach(async () => {
    projectId = (await createProject(admin, 'TRN-LOG', 'Saltmarsh Lane logging trial', ['geologist', 'engineer', 'designer'], { client: 'Harrow Estuary Logistics' })).id
    const P = `/api/projects/${projectId}`
    Object.assign(strata, await createStrata(geologist, projectId, [
      { code: 'MG', name: 'Made ground', colour: 'fill-ochre', pattern: 'made-ground', unitWeight: 19, unitWeightSaturated: 20 },
      { code: 'CR', name: 'Desiccated crust', colour: 'crust-tan', pattern: 'clay', unitWeight: 18, unitWeightSaturated: 18.5 },
      { code: 'EC', name: 'Estuarine clay', colour: 'estuary-slate', pattern: 'organic-clay', unitWeight: 16, unitWeightSaturated: 16 },
    ]))
    const point = async (body: Record<string, unknown>) => {
      const r = await geologist.post<{ point: { id: string } }>(`${P}/points`, { groundElevation: 3.1, startedOn: '2026-03-05', endedOn: '2026-03-06', method: 'Cable percussion', loggedBy: 'A. Ferreira', ...body })
      expect(r.status).toBe(201)
      return r.body.point.id
    }
    boreholeId = await point({ identifier: 'BH-T1', kind: 'borehole', easting: 12, northing: 18, finalDepth: 20 })
    cptId = await point({ identifier: 'CPT-T1', kind: 'cpt', easting: 64, northing: 40, finalDepth: 30 })
    pitId = await point({ identifier: 'TP-T1', kind: 'test-pit', easting: 104, northing: 66, finalDepth: 3 })
    // A dense sounding: 3 000 readings at 0.01 m.
    const depth = Array.from({ length: 3000 }, (_, i) => Math.round((i + 1) * 10) / 1000)
    const cpt = await geologist.request('PUT', `${P}/points/${cptId}/cpt`, {
      areaRatio: 0.8,
      depth,
      qc: depth.map(z => (z < 1.2 ? 6000 : z < 21.5 ? 300 + 28 * z : 18000) + 40 * Math.sin(z * 7)),
      fs: depth.map(z => (z < 21.5 ? 12 + z : 150)),
      u2: depth.map(z => Math.max(0, 9.81 * (z - 1.6) * (z < 21.5 ? 1.6 : 1))),
    })
    expect(cpt.status).toBe(200)
    const sample = await geologist.post<{ sample: { id: string } }>(`${P}/points/${boreholeId}/samples`, { identifier: 'U-3', top: 6, bottom: 6.45, type: 'thin-walled-tube' })
    expect(sample.status).toBe(201)
    // LL 44, PL 22 plots as CL on the chart; the log will say CH at that depth.
    expect((await geologist.request('PUT', `${P}/points/${boreholeId}/samples/${sample.body.sample.id}/index-test`, { waterContent: 52, liquidLimit: 44, plasticLimit: 22, bulkUnitWeight: 16.2 })).status).toBe(200)
    expect((await geologist.post(`${P}/points/${boreholeId}/groundwater`, { kind: 'standing', observedAt: '2026-03-06T08:00:00Z', depth: 1.6 })).status).toBe(201)
  })

  it('the geologist pastes rows from a spreadsheet, the graphic log follows, and the saved log survives a reload', async () => {
    const page = await openBorehole(demoEmail('geologist'))
    expect(await intervalRects(page).count()).toBe(0)

    await pasteInto(page, 'Top (m), row 1', PASTED)
    await expect.poll(() => intervalRects(page).count()).toBe(4)
    expect(await page.getByTestId('log-row').count()).toBe(4)
    expect(await page.getByLabel('Description, row 3', { exact: true }).inputValue()).toBe('Soft grey CLAY with shell fragments')
    expect(await page.getByLabel('USCS group symbol, row 2', { exact: true }).inputValue()).toBe('CL')
    expect(await page.getByLabel('Stratum, row 3', { exact: true }).inputValue()).toBe(strata.EC)
    expect(await page.getByTestId('log-gaps').textContent()).toContain('18.50–20.00 m')
    // The tube at 6 m is logged CH but plots as CL.
    expect(await page.getByTestId('uscs-mismatch').textContent()).toContain('logged CH')
    await screenshot(page, 'log-pasted')

    await page.getByTestId('log-save').click()
    await page.getByTestId('log-notice').filter({ hasText: 'Saved the log of BH-T1: 4 intervals' }).waitFor()
    const saved = await log(boreholeId)
    expect(saved.map(iv => [iv.top, iv.bottom, iv.uscs])).toEqual([[0, 1.2, 'GW'], [1.2, 3.4, 'CL'], [3.4, 12, 'CH'], [12, 18.5, 'CH']])
    expect(saved[2]!.stratumId).toBe(strata.EC)
    expect(saved[3]!.consistency).toBe('soft to firm')

    await page.reload()
    await page.getByTestId('graphic-log').waitFor()
    await expect.poll(() => intervalRects(page).count()).toBe(4)
    expect(await page.getByTestId('log-row').count()).toBe(4)
    expect(await page.getByLabel('Bottom (m), row 4', { exact: true }).inputValue()).toBe('18.5')
    expect(await page.getByLabel('Description, row 1', { exact: true }).inputValue()).toBe('Brown sandy angular GRAVEL with brick (fill)')
    expect(await page.getByTestId('log-unsaved').count()).toBe(0)
    await screenshot(page, 'log-saved')
    await page.close()
  })

  it('marks an overlap in its cell as it is typed, refuses to save it, and undoes the edit', async () => {
    await seedLog()
    const page = await openBorehole(demoEmail('geologist'))
    const top4 = page.getByLabel('Top (m), row 4', { exact: true })
    await top4.fill('11')
    expect(await page.locator('.cell-error').first().textContent()).toContain('Overlaps the interval 3.4–12 m (row 3)')
    expect(await top4.getAttribute('aria-invalid')).toBe('true')
    expect(await page.locator('[data-testid="graphic-log"] rect.interval.flagged').count()).toBe(1)
    await page.getByTestId('log-save').click()
    expect(await page.getByTestId('log-error').textContent()).toContain('Fix the 1 problem marked in the table before saving.')
    expect((await log(boreholeId))[3]!.top).toBe(12)
    await screenshot(page, 'log-overlap')
    await page.getByRole('button', { name: 'Undo' }).click()
    expect(await top4.inputValue()).toBe('12')
    expect(await page.locator('.cell-error').count()).toBe(0)
    // Enter on the last row adds one that starts where it ended.
    await page.getByLabel('Bottom (m), row 4', { exact: true }).press('Enter')
    expect(await page.getByTestId('log-row').count()).toBe(5)
    expect(await page.getByLabel('Top (m), row 5', { exact: true }).inputValue()).toBe('18.5')
    await page.keyboard.type('20')
    expect(await page.getByLabel('Bottom (m), row 5', { exact: true }).inputValue()).toBe('20')
    await page.keyboard.press('ArrowUp')
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-label'))).toBe('Bottom (m), row 4')
    // Leaving with unsaved edits asks first.
    const dialogs: string[] = []
    page.on('dialog', (d) => {
      dialogs.push(d.message())
      void d.accept()
    })
    await page.getByRole('link', { name: 'Strata' }).click()
    await page.getByTestId('strata-table').waitFor()
    expect(dialogs).toEqual(['The log has unsaved edits. Leave and lose them?'])
    await page.close()
  })

  it('a save that meets a newer log shows both logs, and "keep mine" saves over it', async () => {
    await seedLog()
    const page = await openBorehole(demoEmail('geologist'))
    await page.getByLabel('Description, row 2', { exact: true }).fill('Stiff fissured brown silty CLAY with rootlets')

    // Someone else saves first.
    const engineer = await signIn(demoEmail('engineer'))
    const theirs = (await log(boreholeId)).map(({ id, version, top, bottom, description, uscs, stratumId, moisture, consistency }) => ({ id, version, top, bottom, description, uscs, stratumId, moisture, consistency }))
    theirs[0]!.description = 'Brown gravelly FILL (their wording)'
    expect((await engineer.request('PUT', `/api/projects/${projectId}/points/${boreholeId}/intervals`, { intervals: theirs })).status).toBe(200)

    await page.getByTestId('log-save').click()
    const panel = page.getByTestId('log-conflict')
    await panel.waitFor()
    expect(await page.getByTestId('conflict-theirs').textContent()).toContain('Brown gravelly FILL (their wording)')
    expect(await page.getByTestId('conflict-mine').textContent()).toContain('Stiff fissured brown silty CLAY with rootlets')
    await screenshot(page, 'log-conflict')
    await page.getByTestId('conflict-keep-mine').click()
    await page.getByTestId('log-notice').filter({ hasText: 'Saved the log' }).waitFor()
    const now = await log(boreholeId)
    expect(now[0]!.description).toBe('Brown sandy angular GRAVEL with brick (fill)')
    expect(now[1]!.description).toBe('Stiff fissured brown silty CLAY with rootlets')
    expect(await page.getByTestId('log-conflict').count()).toBe(0)
    await page.close()
  })

  it('an engineer can edit and save the log', async () => {
    await seedLog()
    const page = await openBorehole(demoEmail('engineer'))
    await page.getByLabel('Consistency / density, row 3', { exact: true }).fill('very soft')
    expect(await page.getByTestId('log-unsaved').count()).toBe(1)
    await page.getByTestId('log-save').click()
    await page.getByTestId('log-notice').filter({ hasText: 'Saved the log of BH-T1' }).waitFor()
    expect((await log(boreholeId))[2]!.consistency).toBe('very soft')
    await page.close()
  })

  it('a designer and a viewer read the log without any edit controls', async () => {
    await seedLog()
    const viewer = await createUser(admin, 'viewer')
    expect((await admin.post(`/api/projects/${projectId}/members`, { email: viewer.email, role: 'viewer' })).status).toBe(201)
    for (const [email, password, name] of [[demoEmail('designer'), undefined, 'designer'], [viewer.email, TEST_PASSWORD, 'viewer']] as const) {
      const page = await openBorehole(email, password)
      expect(await page.getByTestId('log-row').count()).toBe(4)
      expect(await page.getByTestId('log-rows').textContent()).toContain('Soft grey CLAY with shell fragments')
      expect(await page.locator('[data-testid="log-rows"] input, [data-testid="log-rows"] select, [data-testid="log-rows"] textarea').count()).toBe(0)
      expect(await page.getByTestId('log-save').count()).toBe(0)
      expect(await page.getByTestId('log-add-row').count()).toBe(0)
      expect(await page.getByTestId('sample-add-toggle').count()).toBe(0)
      expect(await page.getByRole('button', { name: 'Index tests' }).count()).toBe(0)
      await page.getByRole('tab', { name: /Groundwater/ }).click()
      expect(await page.getByRole('button', { name: 'Add observation' }).count()).toBe(0)
      expect(await intervalRects(page).count()).toBe(4)
      await screenshot(page, `log-${name}`)
      await page.goto(`${baseUrl()}/projects/${projectId}/strata`)
      await page.getByTestId('strata-table').waitFor()
      expect(await page.getByTestId('stratum-row').count()).toBe(3)
      expect(await page.getByTestId('stratum-add').count()).toBe(0)
      expect(await page.getByRole('button', { name: /^Edit / }).count()).toBe(0)
      await page.close()
    }
  })

  it('the site plan shows every point by kind, follows the list, and opens a point', async () => {
    const page = await openProjectAs(browser.context, 'geologist', projectId, '/plan')
    await page.getByTestId('plan-point').first().waitFor()
    const kinds = await page.getByTestId('plan-point').evaluateAll(els => els.map(e => e.getAttribute('data-kind')).sort())
    expect(kinds).toEqual(['borehole', 'cpt', 'test-pit'])
    expect(await page.locator('[data-testid="point-list"] li').count()).toBe(3)

    await page.getByLabel('Kind').selectOption('cpt')
    expect(await page.locator('[data-testid="point-list"] li').count()).toBe(1)
    expect(await page.locator('[data-testid="plan-point"].faint').count()).toBe(2)
    await page.getByLabel('Kind').selectOption('')
    await page.getByLabel('Find by identifier').fill('tp')
    expect(await page.locator('[data-testid="point-list"] li').textContent()).toContain('TP-T1')
    await page.getByLabel('Find by identifier').fill('')

    await page.locator('[data-testid="point-list"] a', { hasText: 'CPT-T1' }).hover()
    expect(await page.locator(`[data-testid="plan-point"][data-id="${cptId}"]`).getAttribute('class')).toContain('lit')
    await screenshot(page, 'site-plan')

    await page.locator(`[data-testid="plan-point"][data-id="${boreholeId}"]`).click()
    await page.waitForURL(`**${pointPath(boreholeId)}`)
    expect(await page.getByTestId('point-identifier').textContent()).toContain('BH-T1')
    expect(await page.getByTestId('project-nav').getByRole('link', { name: 'Site plan' }).getAttribute('aria-current')).toBe('page')
    await page.close()
  })

  it('a CPT point draws its profile from the whole sounding', async () => {
    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.goto(baseUrl() + pointPath(cptId))
    const plot = page.locator('[data-testid="cpt-plot"][data-draw-ms]')
    await plot.waitFor()
    const ms = Number(await plot.getAttribute('data-draw-ms'))
    expect(Number.isFinite(ms) && ms >= 0).toBe(true)
    expect(await plot.getAttribute('data-count')).toBe('3000')
    expect(await plot.locator('canvas').count()).toBe(1)
    expect(await page.getByTestId('log-folded').count()).toBe(1)
    expect(await plot.locator('svg text.title').allTextContents()).toEqual(['qc (MPa)', 'fs (kPa)', 'u2 (kPa)', 'Rf (%)'])
    console.info(`CPT draw, 3 000 readings: ${ms} ms`)
    await screenshot(page, 'cpt-profile')
    await page.close()
  })

  it('the printable sheet is the stress-history log: one A4 sheet per depth range, the key and the caution, without the app shell', async () => {
    await seedLog()
    const page = await signInAs(browser.context, demoEmail('designer'))
    await page.setViewportSize({ width: 1366, height: 800 })
    await page.goto(`${baseUrl()}${pointPath(boreholeId)}/sheet`)
    await page.getByTestId('log-sheet').waitFor()
    await page.getByTestId('log-drawing').first().waitFor()
    expect(await page.getByTestId('project-nav').count()).toBe(0)
    expect(await page.getByTestId('user-menu').count()).toBe(0)
    // The 20 m hole at 1:100 fills one sheet (20 m a sheet); the key takes a sheet of its own.
    expect(await page.getByTestId('log-sheet-page').count()).toBe(2)
    expect(await page.getByTestId('log-drawing').count()).toBe(1)
    const drawing = await page.getByTestId('log-drawing').first().innerHTML()
    expect(drawing).toContain('Soft grey CLAY with shell')
    expect(drawing).toContain("σ'v0")
    expect(await page.getByTestId('sheet-legend').textContent()).toContain('EC Estuarine clay')
    expect(await page.getByTestId('sheet-caution').first().textContent()).toBe(RESULT_CAUTION)
    expect(await page.getByTestId('sheet-pdf').getAttribute('href')).toMatch(/\/report\.pdf\?scale=100$/)
    // Nothing runs past an A4 sheet: each footer sits inside its sheet.
    const fits = await page.getByTestId('log-sheet-page').evaluateAll(els => els.map(el => el.scrollHeight <= el.clientHeight + 1))
    expect(fits).toEqual([true, true])
    await screenshot(page, 'log-sheet')
    // At 1:50 the hole takes two sheets of drawing (10 m each) and the key a third, each with its header and footer.
    await page.getByTestId('sheet-scale').selectOption('50')
    await expect.poll(() => page.getByTestId('log-drawing').count()).toBe(2)
    expect(await page.getByTestId('log-sheet-page').count()).toBe(3)
    expect(await page.getByTestId('sheet-caution').count()).toBe(3)
    await screenshot(page, 'log-sheet-1-50')
    expect(await page.getByTestId('sheet-pdf').getAttribute('href')).toMatch(/scale=50$/)
    expect(await page.getByTestId('print-sheet').isVisible()).toBe(true)
    await page.emulateMedia({ media: 'print' })
    expect(await page.getByTestId('print-sheet').isVisible()).toBe(false)
    // Printed on A4, each sheet is one page: nothing spills onto an extra page.
    const printed = await page.pdf({ format: 'A4', preferCSSPageSize: true, printBackground: true })
    expect(pdfInfo(printed).pages).toBe(3)
    await page.emulateMedia({ media: 'screen' })
    await page.close()
  })

  it('a test pit opens with an empty log ready to type into', async () => {
    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.goto(baseUrl() + pointPath(pitId))
    await page.getByTestId('graphic-log').waitFor()
    expect(await page.getByTestId('log-row').count()).toBe(1)
    expect(await page.getByTestId('log-save').isDisabled()).toBe(true)
    await page.getByLabel('Top (m), row 1', { exact: true }).fill('0')
    await page.getByLabel('Bottom (m), row 1', { exact: true }).fill('3.5')
    expect(await page.locator('.cell-error').first().textContent()).toContain('below the hole\'s final depth (3 m)')
    await page.close()
  })

  it('a problem only the server can see (the hole was shortened meanwhile) comes back on the cell', async () => {
    await seedLog()
    const page = await openBorehole(demoEmail('geologist'))
    const { point } = (await geologist.get<{ point: { version: number } }>(`/api/projects/${projectId}/points/${boreholeId}`)).body
    expect((await geologist.patch(`/api/projects/${projectId}/points/${boreholeId}`, { finalDepth: 19, version: point.version })).status).toBe(200)

    await page.getByTestId('log-add-row').click()
    expect(await page.getByLabel('Top (m), row 5', { exact: true }).inputValue()).toBe('18.5')
    await page.getByLabel('Bottom (m), row 5', { exact: true }).fill('20')
    await page.getByTestId('log-save').click()
    await page.getByTestId('log-error').waitFor()
    expect(await page.getByTestId('log-error').textContent()).toContain('Row 5: Bottom (20 m) is below the hole\'s final depth (19 m).')
    expect(await page.getByLabel('Bottom (m), row 5', { exact: true }).getAttribute('aria-invalid')).toBe('true')
    expect(await page.locator('.cell-error').textContent()).toBe('Bottom (20 m) is below the hole\'s final depth (19 m).')
    expect((await log(boreholeId)).length).toBe(4)
    await screenshot(page, 'log-server-issue')
    await page.close()
  })

  it('the strata editor adds a stratum with its look, reorders, and shows a newer save before overwriting it', async () => {
    const P = `/api/projects/${projectId}/strata`
    const list = async () => (await geologist.get<{ strata: { id: string, code: string, name: string, colour: string, pattern: string, unitWeight: number, displayOrder: number, version: number }[] }>(P)).body.strata
    const page = await openProjectAs(browser.context, 'geologist', projectId, '/strata')
    await page.getByTestId('stratum-add').click()
    await page.getByLabel('Code').fill('GC')
    await page.getByLabel('Name').fill('Glacial clay')
    await page.getByLabel('Unit weight above water (kN/m³)').fill('20.5')
    await page.getByLabel('Unit weight below water (kN/m³)').fill('20,5')
    await page.getByText('Glacial umber', { exact: true }).click()
    await page.getByText('Gravelly clay (till)', { exact: true }).click()
    await screenshot(page, 'strata-new')
    await page.getByTestId('stratum-save').click()
    await page.getByRole('status').filter({ hasText: 'Stratum GC added.' }).waitFor()
    const added = (await list()).find(s => s.code === 'GC')!
    expect([added.colour, added.pattern, added.unitWeight, added.displayOrder]).toEqual(['glacial-umber', 'gravelly-clay', 20.5, 40])

    await page.getByRole('button', { name: 'Move GC up' }).click()
    await page.getByRole('status').filter({ hasText: 'GC moved up.' }).waitFor()
    expect((await list()).map(s => s.code)).toEqual(['MG', 'CR', 'GC', 'EC'])
    expect(await page.getByTestId('stratum-row').nth(2).textContent()).toContain('Glacial clay')

    // Someone renames MG while it is open here; saving a new unit weight shows their version first.
    await page.getByRole('button', { name: 'Edit MG' }).click()
    const mg = (await list()).find(s => s.code === 'MG')!
    const engineer = await signIn(demoEmail('engineer'))
    expect((await engineer.patch(`${P}/${mg.id}`, { name: 'Made ground (reclamation fill)', version: mg.version })).status).toBe(200)
    await page.getByLabel('Unit weight above water (kN/m³)').fill('18.5')
    await page.getByTestId('stratum-save').click()
    const conflict = page.getByTestId('stratum-conflict')
    await conflict.waitFor()
    expect(await conflict.textContent()).toContain('Made ground (reclamation fill)')
    expect(await conflict.textContent()).toContain('Unit weight above water → 18.5')
    await screenshot(page, 'strata-conflict')
    await page.getByRole('button', { name: 'Save mine over theirs' }).click()
    await page.getByRole('status').filter({ hasText: 'Stratum MG saved.' }).waitFor()
    const after = (await list()).find(s => s.code === 'MG')!
    expect([after.name, after.unitWeight]).toEqual(['Made ground (reclamation fill)', 18.5])
    await page.close()
  })
})
