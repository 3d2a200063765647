// Pastload on a phone (390 px) and a tablet with touch (768 px), in Chromium. The point page, the
// stress-model page and the σ'p data page never scroll sideways (tables scroll inside their card,
// the canvas tracks as one block); the log is a list of intervals with a form, edited and saved by
// tap; at 768 px every control tapped is at least 44 px tall. The other project pages are checked too.
import type { Page } from 'playwright-core'
import { beforeAll, describe, expect, it } from 'vitest'
import type { IntervalRow } from '../../shared/types/investigation'
import { demoEmail, signIn, type Client } from '../helpers/http'
import { createProject } from '../helpers/project'
import { openWorkspace, screenshot, useProjectAs, waitForApp } from './helpers'

const PHONE = { width: 390, height: 844 }
const TABLET = { width: 768, height: 1024 }

interface SideOverflow {
  viewport: number
  scrollWidth: number
  /** What sticks out past the right edge, outside any box that scrolls or clips sideways (for the failure message). */
  culprits: string[]
}

/** The document's width against the screen's, and the elements that stick out. */
async function sideOverflow(page: Page): Promise<SideOverflow> {
  return page.evaluate(() => {
    const viewport = document.documentElement.clientWidth
    const scrollWidth = document.documentElement.scrollWidth
    const culprits: string[] = []
    const sticksOut = (el: Element) => el.getBoundingClientRect().right > viewport + 0.5
    if (scrollWidth > viewport) {
      // The outermost element past the edge whose box holds it neither in nor in a scroll of its own.
      for (const el of document.body.querySelectorAll('*')) {
        const r = el.getBoundingClientRect()
        const parent = el.parentElement
        // An absolutely placed element (a screen-reader text, a tip) escapes a scrolling box that is not its containing block.
        const placed = getComputedStyle(el).position === 'absolute' && el instanceof HTMLElement && el.offsetParent && !sticksOut(el.offsetParent)
        if (sticksOut(el) && parent && ((r.width > 0 && !sticksOut(parent) && getComputedStyle(parent).overflowX === 'visible') || placed)) {
          culprits.push(`${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''}.${String(el.getAttribute('class') ?? '').split(/\s+/).slice(0, 4).join('.')} right=${Math.round(r.right)}`)
          if (culprits.length >= 10) break
        }
      }
    }
    return { viewport, scrollWidth, culprits }
  })
}

async function expectNoSideScroll(page: Page, what: string, shot?: string) {
  if (shot) await screenshot(page, shot)
  const o = await sideOverflow(page)
  expect.soft(o.scrollWidth, `${what} is ${o.scrollWidth} px wide on a ${o.viewport} px screen: ${o.culprits.join('; ')}`).toBeLessThanOrEqual(o.viewport)
}

/** The element is on screen, not hidden and not off to the side. */
async function expectShown(page: Page, testId: string) {
  const el = page.getByTestId(testId).first()
  await el.waitFor()
  const box = await el.boundingBox()
  expect(box, `${testId} has no box`).not.toBeNull()
  expect(box!.width).toBeGreaterThan(0)
  expect(box!.x).toBeGreaterThanOrEqual(0)
  expect(box!.x + box!.width).toBeLessThanOrEqual(page.viewportSize()!.width + 0.5)
}

async function pointIdOf(client: Client, projectId: string, identifier: string): Promise<string> {
  const r = await client.get<{ points: { id: string, identifier: string }[] }>(`/api/projects/${projectId}/points?q=${identifier}`)
  const p = r.body.points.find(x => x.identifier === identifier)
  if (!p) throw new Error(`no point ${identifier}`)
  return p.id
}

async function intervalsOf(client: Client, projectId: string, pointId: string): Promise<IntervalRow[]> {
  return (await client.get<{ intervals: IntervalRow[] }>(`/api/projects/${projectId}/points/${pointId}`)).body.intervals
}

/** Every tap target at least 44 px tall and wide (a fingertip). */
async function expectFingerSized(page: Page, testId: string) {
  const box = await page.getByTestId(testId).first().boundingBox()
  expect(box, `${testId} has no box`).not.toBeNull()
  expect(box!.height, `${testId} is ${box!.height} px tall`).toBeGreaterThanOrEqual(44)
  expect(box!.width, `${testId} is ${box!.width} px wide`).toBeGreaterThanOrEqual(44)
}

describe('the demo on a 390 px phone', () => {
  const demo = useProjectAs('geologist')
  // A project with a long name in the geologist's list, whatever other files made: the header's project choice is
  // as wide as its longest name, so without one this check would depend on the order the files ran in.
  beforeAll(async () => {
    await createProject(await signIn(demoEmail('owner')), 'E2E-NAR-L', 'Harrow Estuary terminal yard, stage two extension and access road', ['geologist'])
  })

  it('the point page, the stress-model page and the σ\'p data page fit the screen, with their key content shown', async () => {
    const bh01 = await pointIdOf(demo.client, demo.projectId, 'BH-01')
    const page = await demo.open(`/points/${bh01}`, { viewport: PHONE })
    await page.getByTestId('log-item').first().waitFor()
    await expectShown(page, 'point-identifier')
    await expectShown(page, 'point-facts')
    await expectShown(page, 'log-item-depths')
    // The grid is not drawn; the list says each interval in words.
    expect(await page.getByTestId('log-grid').isVisible()).toBe(false)
    const saved = await intervalsOf(demo.client, demo.projectId, bh01)
    expect(await page.getByTestId('log-item').count()).toBe(saved.length)
    expect(await page.getByTestId('log-item-description').first().textContent()).toContain(saved[0]!.description.trim().slice(0, 20))
    await expectNoSideScroll(page, 'The point page', 'narrow-point-phone')

    const inForce = (await demo.client.get<{ modelId: string | null }>(`/api/projects/${demo.projectId}/model-in-force`)).body
    expect(inForce.modelId).toBeTruthy()
    await page.goto(demo.url(`/models/${inForce.modelId}`))
    await openWorkspace(page)
    await page.getByTestId('model-workspace').waitFor()
    await page.getByTestId('track-scroller').waitFor()
    await expectShown(page, 'model-title')
    await expectShown(page, 'workspace-caution')
    // The tracks scroll sideways as one block inside their box.
    const tracks = await page.getByTestId('track-scroller').evaluate(el => ({ client: el.clientWidth, scroll: el.scrollWidth, overflow: getComputedStyle(el).overflowX }))
    expect(tracks.overflow).toBe('auto')
    expect(tracks.client).toBeLessThanOrEqual(PHONE.width)
    // Under the drawing, the panels are built when scrolled to: not while the page opens.
    const panels = page.getByTestId('panel-box')
    expect(await panels.getAttribute('data-shown')).toBe('false')
    expect(await page.getByTestId('fit-panel').count()).toBe(0)
    // Reached with the keyboard first, they open at once and the focus goes on into them (nothing is skipped).
    await page.evaluate(() => {
      const column = document.querySelector('[data-testid="model-workspace"] > div')!
      const controls = [...column.querySelectorAll<HTMLElement>('a[href], button:not([disabled]), input:not([disabled]), select:not([disabled]), [tabindex]:not([tabindex="-1"])')]
      controls.at(-1)!.focus()
    })
    await page.keyboard.press('Tab')
    await page.getByTestId('fit-panel').waitFor()
    expect(await panels.getAttribute('data-shown')).toBe('true')
    await expect.poll(() => page.evaluate(() => !!document.activeElement?.closest('[data-testid="panel-box"]'))).toBe(true)
    await expectNoSideScroll(page, 'The stress-model page', 'narrow-model-phone')

    await page.goto(demo.url('/preconsolidation'))
    await page.getByTestId('points-table').locator('tbody tr').first().waitFor()
    await expectShown(page, 'shown-count')
    const table = await page.getByTestId('points-table').evaluate(el => ({ box: el.parentElement!.clientWidth, table: el.scrollWidth, overflow: getComputedStyle(el.parentElement!).overflowX }))
    expect(table.overflow).toBe('auto')
    expect(table.box).toBeLessThan(table.table)
    await expectNoSideScroll(page, 'The σ\'p data page', 'narrow-preconsolidation-phone')
    await page.close()
  })

  it('the model compare page shows what changed and both profiles within the screen', async () => {
    const inForce = (await demo.client.get<{ modelId: string }>(`/api/projects/${demo.projectId}/model-in-force`)).body
    // Without a and b in the address the page compares the two latest versions.
    const page = await demo.open(`/models/${inForce.modelId}/compare`, { viewport: PHONE })
    await page.getByTestId('compare-page').waitFor()
    await page.getByRole('heading', { name: /^What changed/ }).waitFor({ timeout: 15_000 })
    await expectShown(page, 'compare-changes-card')
    await expectShown(page, 'compare-profiles')
    await page.getByTestId('compare-profiles').locator('svg').first().waitFor()
    for (const id of ['compare-changes-card', 'compare-profiles']) {
      const box = await page.getByTestId(id).evaluate(el => ({ right: el.getBoundingClientRect().right, scroll: el.scrollWidth, client: el.clientWidth, overflow: getComputedStyle(el).overflowX }))
      expect(box.right, `${id} reaches ${box.right} px`).toBeLessThanOrEqual(PHONE.width + 0.5)
      // Content wider than its card scrolls inside it, never out of it.
      if (box.scroll > box.client) expect(box.overflow, `${id} is ${box.scroll} px of content in ${box.client} px`).toMatch(/auto|scroll/)
    }
    await expectNoSideScroll(page, 'The model compare page', 'narrow-model-compare-phone')
    await page.close()
  })

  it('the other project pages fit the screen too', async () => {
    const page = await demo.open('', { viewport: PHONE })
    const id = demo.projectId
    const bh01 = await pointIdOf(demo.client, id, 'BH-01')
    const inForce = (await demo.client.get<{ modelId: string }>(`/api/projects/${id}/model-in-force`)).body
    const tests = (await demo.client.get<{ tests: { id: string }[] }>(`/api/projects/${id}/tests/oedometer`)).body.tests
    const runs = (await demo.client.get<{ runs: { id: string }[] }>(`/api/projects/${id}/settlement-runs`)).body.runs
    const pages = [
      '', '/plan', '/strata', '/tests', `/tests/oedometer/${tests[0]!.id}`, '/import', '/review', '/reports',
      '/models', `/models/${inForce.modelId}/versions/1`, `/models/${inForce.modelId}/compare`, '/settlement', '/settlement/new',
      `/settlement/${runs[0]!.id}`, `/settlement/compare?a=${runs[0]!.id}&b=${runs[runs.length - 1]!.id}`, `/points/${bh01}/sheet`, '/settings',
    ]
    const wide: string[] = []
    for (const path of pages) {
      await page.goto(demo.url(path))
      await page.waitForLoadState('networkidle')
      await page.locator('#__nuxt h1, #__nuxt h2').first().waitFor()
      const o = await sideOverflow(page)
      if (o.scrollWidth > o.viewport) wide.push(`${path || '/'} ${o.scrollWidth} px: ${o.culprits.join('; ')}`)
      await screenshot(page, `narrow-other${path.replace(/\?.*$/, '').replace(/\/[0-9a-f-]{36}/g, '-id').replace(/\//g, '-') || '-overview'}-phone`)
    }
    expect(wide).toEqual([])
    await page.close()
  })
})

describe('the faces of the web font a first screen uses', () => {
  const demo = useProjectAs('engineer')

  it('are the two the page asks for with its HTML (regular, semibold), on the overview, the stress-model page and the run page', async () => {
    const id = demo.projectId
    const inForce = (await demo.client.get<{ modelId: string }>(`/api/projects/${id}/model-in-force`)).body
    const runs = (await demo.client.get<{ runs: { id: string }[] }>(`/api/projects/${id}/settlement-runs`)).body.runs
    const page = await demo.open('', { viewport: PHONE })
    for (const path of ['', `/models/${inForce.modelId}`, `/settlement/${runs[0]!.id}`]) {
      await page.goto(demo.url(path))
      await page.waitForLoadState('networkidle')
      const faces = await page.evaluate(() => {
        const preloaded = [...document.querySelectorAll<HTMLLinkElement>('link[rel="preload"][as="font"]')].map(l => /latin-(\d+)-normal/.exec(l.href)?.[1] ?? l.href)
        // Text in the page's HTML (drawings, built after the first paint, may use other weights).
        const heavier = [...document.querySelectorAll<HTMLElement>('body *')]
          .filter(e => !(e instanceof SVGElement) && [...e.childNodes].some(n => n.nodeType === Node.TEXT_NODE && n.textContent?.trim()))
          .filter(e => !['400', '600'].includes(getComputedStyle(e).fontWeight))
          .map(e => `${e.tagName.toLowerCase()} "${e.textContent?.trim().slice(0, 30)}" ${getComputedStyle(e).fontWeight}`)
        return { preloaded: preloaded.sort(), heavier }
      })
      // A weight the text uses but the page does not ask for with its HTML arrives late: that text is drawn twice.
      expect(faces.preloaded, path || '/').toEqual(['400', '600'])
      expect(faces.heavier, path || '/').toEqual([])
    }
    await page.close()
  })

  it('draw the text once: no face is swapped in after the first paint, and the header and the project sections keep one row on a phone', async () => {
    const inForce = (await demo.client.get<{ modelId: string }>(`/api/projects/${demo.projectId}/model-in-force`)).body
    const page = await demo.open(`/models/${inForce.modelId}`, { viewport: PHONE })
    await page.waitForLoadState('networkidle')
    const shell = await page.evaluate(() => {
      // Items of one row share their middle (they are centred or of one height).
      const rows = (el: Element) => new Set([...el.children].map((k) => { const r = k.getBoundingClientRect(); return Math.round(r.top + r.height / 2) })).size
      const nav = document.querySelector('[data-testid="project-nav"] ul')!
      const box = nav.getBoundingClientRect()
      const current = nav.querySelector('[aria-current="page"]')!.getBoundingClientRect()
      return {
        displays: [...new Set([...document.fonts].map(f => f.display))],
        headerRows: rows(document.querySelector('header > div')!),
        navRows: rows(nav),
        navScrolls: nav.scrollWidth > nav.clientWidth,
        currentInView: current.left >= box.left - 0.5 && current.right <= box.right + 0.5,
      }
    })
    // A face that arrived late and was swapped in set the lines again, and everything under them moved.
    expect(shell.displays).toEqual(['optional'])
    // Rows that wrap depend on how wide the words come out, in whichever face is there.
    expect(shell.headerRows).toBe(1)
    expect(shell.navRows).toBe(1)
    // The sections do not fit 390 px: the row scrolls sideways, with the page's own section in view.
    expect(shell.navScrolls).toBe(true)
    expect(shell.currentInView).toBe(true)
    await page.close()
  })

  it('a first page whose faces come late stays in the device\'s face without moving; the next page is set in the web font', async () => {
    const signedIn = await demo.open('', { viewport: PHONE })
    const page = await signedIn.context().newPage()
    await signedIn.close()
    await page.setViewportSize(PHONE)
    // The faces take a second to come (a slow first visit); routing also keeps the browser's cache out of it.
    await page.route('**/*.woff2', async (route) => { await new Promise(r => setTimeout(r, 1000)); await route.continue() })
    await page.addInitScript(() => {
      (window as unknown as { shifts: number }).shifts = 0
      new PerformanceObserver((list) => {
        for (const e of list.getEntries() as (PerformanceEntry & { value: number, hadRecentInput: boolean })[]) {
          if (!e.hadRecentInput) (window as unknown as { shifts: number }).shifts += e.value
        }
      }).observe({ type: 'layout-shift', buffered: true })
    })
    await page.goto(demo.url(''))
    await waitForApp(page)
    await page.waitForTimeout(1500)
    const cdp = await page.context().newCDPSession(page)
    await cdp.send('DOM.enable')
    await cdp.send('CSS.enable')
    const fontsOf = async (selector: string) => {
      const { root } = await cdp.send('DOM.getDocument')
      const { nodeId } = await cdp.send('DOM.querySelector', { nodeId: root.nodeId, selector })
      return (await cdp.send('CSS.getPlatformFontsForNode', { nodeId })).fonts.map(f => f.familyName).join(' + ')
    }
    // The faces were late: the first page is drawn in the device's face, and stays so (nothing moves).
    expect(await fontsOf('main h1')).not.toContain('Source Sans 3')
    expect(await page.evaluate(() => (window as unknown as { shifts: number }).shifts)).toBe(0)
    // The first navigation brings the web font in (its files are in by now).
    await page.getByTestId('project-nav').getByRole('link', { name: 'Strata' }).click()
    await page.waitForURL(/\/strata$/)
    await page.locator('main h1').waitFor()
    await expect.poll(() => fontsOf('main h1'), { timeout: 5000 }).toContain('Source Sans 3')
    await page.close()
  })
})

describe('editing a log on a 390 px phone', () => {
  const site = useProjectAs('geologist', 'E2E-NAR')

  it('opens an interval from the list, edits it in its form and saves the log', async () => {
    const bh01 = await pointIdOf(site.client, site.projectId, 'BH-01')
    const before = await intervalsOf(site.client, site.projectId, bh01)
    const page = await site.open(`/points/${bh01}`, { viewport: PHONE })
    const second = page.getByTestId('log-item').nth(1)
    await second.getByTestId('log-item-open').click()
    const form = page.getByTestId('log-form')
    await form.waitFor()
    expect(await form.getByLabel('Description').inputValue()).toBe(before[1]!.description)
    const text = 'Soft grey silty CLAY with shell fragments, logged on a phone'
    await form.getByLabel('Description').fill(text)
    await form.getByLabel('Consistency / density').fill('soft')
    await expectNoSideScroll(page, 'The point page with a form open', 'narrow-log-form-phone')
    await form.getByTestId('log-form-done').click()
    await form.waitFor({ state: 'detached' })
    expect(await second.getByTestId('log-item-description').textContent()).toBe(text)
    await page.getByTestId('log-unsaved').waitFor()

    await page.getByTestId('log-save').click()
    await page.getByTestId('log-notice').waitFor()
    expect(await page.getByTestId('log-notice').textContent()).toContain(`Saved the log of BH-01: ${before.length} intervals.`)
    const after = await intervalsOf(site.client, site.projectId, bh01)
    expect(after.length).toBe(before.length)
    expect(after[1]!.description).toBe(text)
    expect(after[1]!.consistency).toBe('soft')
    expect(after[0]!.description).toBe(before[0]!.description)
    await screenshot(page, 'narrow-log-saved-phone')
    await page.close()
  })
})

describe('the point page on a 768 px tablet with touch', () => {
  const site = useProjectAs('geologist', 'E2E-NAR-T', { viewport: TABLET, hasTouch: true, isMobile: true })

  it('takes taps: an interval changed through its form and saved, every target finger-sized', async () => {
    const bh01 = await pointIdOf(site.client, site.projectId, 'BH-01')
    const before = await intervalsOf(site.client, site.projectId, bh01)
    const page = await site.open(`/points/${bh01}`)
    expect(await page.evaluate(() => matchMedia('(pointer: coarse)').matches)).toBe(true)
    await page.getByTestId('log-item').first().waitFor()
    await expectNoSideScroll(page, 'The point page at 768 px')
    await expectFingerSized(page, 'log-item-open')
    await expectFingerSized(page, 'log-add-item')
    await expectFingerSized(page, 'log-save')
    for (const tab of ['Samples', 'SPT', 'Groundwater']) {
      const box = await page.getByRole('tab', { name: new RegExp(`^${tab}`) }).boundingBox()
      expect(box!.height, `the ${tab} tab is ${box!.height} px tall`).toBeGreaterThanOrEqual(44)
    }

    // The last interval: its consistency changed by tapping into the form.
    const last = before.length - 1
    await page.getByTestId('log-item').nth(last).getByTestId('log-item-open').tap()
    const form = page.getByTestId('log-form')
    await form.waitFor()
    await expectFingerSized(page, 'log-form-done')
    await expectFingerSized(page, 'log-form-delete')
    const field = form.getByLabel('Consistency / density')
    expect((await field.boundingBox())!.height).toBeGreaterThanOrEqual(44)
    await field.tap()
    await field.fill('very stiff')
    await screenshot(page, 'narrow-log-form-tablet')
    await form.getByTestId('log-form-done').tap()
    await form.waitFor({ state: 'detached' })

    await page.getByTestId('log-save').tap()
    await page.getByTestId('log-notice').waitFor()
    const after = await intervalsOf(site.client, site.projectId, bh01)
    expect(after.map(iv => iv.consistency)).toEqual([...before.slice(0, last).map(iv => iv.consistency), 'very stiff'])
    await screenshot(page, 'narrow-point-tablet')
    await page.close()
  })
})
