import { describe, expect, it } from 'vitest'
import { baseUrl, demoEmail, signedInDemo } from '../helpers/http'
import { createProject, createSavedModel, must } from '../helpers/project'
import { approveFirstVersion } from '../helpers/settlement-run'
import { openWorkspace, signInAs, useBrowser } from './helpers'

/** The instant as the version page shows it ('dateTime'), in `timeZone`: the test's own Intl, not the app's helper. */
const shownIn = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone }).format(new Date(iso))

describe('dates in the viewer\'s time zone, written by the server and kept by the browser, in Chromium', () => {
  // Tokyo is nine hours ahead of UTC all year: the server's own zone (UTC here) would show other hours.
  const browser = useBrowser({ timezoneId: 'Asia/Tokyo', viewport: { width: 390, height: 844 } })
  const { owner, engineer, reviewer } = signedInDemo('owner', 'engineer', 'reviewer')

  it('the first page after signing in keeps the zone; a version page comes from the server with its time in Tokyo and hydrates without a mismatch', async () => {
    const project = await createProject(owner, 'E2E-TZ', 'Dates by zone (browser)', ['engineer'])
    const model = await createSavedModel(engineer, project.id, 'Yard model')
    const version = await must('version 1', engineer.get<{ version: { createdAt: string } }>(`${model.url}/versions/1`))
    const tokyo = shownIn(version.version.createdAt, 'Asia/Tokyo')
    expect(tokyo).not.toBe(shownIn(version.version.createdAt, 'UTC'))

    const page = await signInAs(browser.context, demoEmail('engineer'))
    const zone = (await browser.context.cookies()).find(c => c.name === 'pastload_tz')
    expect(decodeURIComponent(zone?.value ?? '')).toBe('Asia/Tokyo')

    const url = `${baseUrl()}/projects/${project.id}/models/${model.id}/versions/1`
    // As the server sends it, before any script runs.
    const html = await (await page.request.get(url)).text()
    expect(html).toContain(tokyo)

    const warnings: string[] = []
    page.on('console', (m) => { if (/hydration/i.test(m.text())) warnings.push(m.text()) })
    await page.goto(url)
    const timeline = page.getByTestId('version-timeline')
    await timeline.waitFor()
    await page.waitForLoadState('networkidle')
    expect(await timeline.textContent()).toContain(tokyo)
    expect(warnings).toEqual([])
  })

  it('the stress-model page opens without creating an Intl formatter (the first one loads the locale\'s data), its dates still in Tokyo time', async () => {
    const project = await createProject(owner, 'E2E-TZ2', 'Dates without Intl (browser)', ['engineer', 'reviewer'])
    const model = await createSavedModel(engineer, project.id, 'Yard model')
    // Approved: the canvas's model-in-force line (built in the browser) says when.
    await approveFirstVersion({ owner, engineer, reviewer }, `/api/projects/${project.id}`, model.url, 'For the yard')
    const inForce = await must('model in force', engineer.get<{ approvedAt: string | null }>(`/api/projects/${project.id}/model-in-force`))
    const page = await signInAs(browser.context, demoEmail('engineer'))
    // Counts every formatter and locale-aware call the page makes from here on.
    await page.addInitScript(() => {
      const used: string[] = []
      ;(window as unknown as { intlUsed: string[] }).intlUsed = used
      for (const k of ['DateTimeFormat', 'NumberFormat', 'Collator', 'PluralRules', 'RelativeTimeFormat', 'ListFormat'] as const) {
        const Orig = Intl[k] as unknown as new (...a: unknown[]) => object
        const Counted = function (...a: unknown[]) {
          used.push(k)
          return new Orig(...a)
        }
        Counted.prototype = Orig.prototype
        ;(Intl as unknown as Record<string, unknown>)[k] = Counted
      }
      for (const [proto, key] of [[Number.prototype, 'toLocaleString'], [Date.prototype, 'toLocaleString'], [String.prototype, 'localeCompare']] as const) {
        const orig = (proto as unknown as Record<string, (...a: unknown[]) => unknown>)[key]!
        ;(proto as unknown as Record<string, unknown>)[key] = function (this: unknown, ...a: unknown[]) {
          used.push(key)
          return orig.apply(this, a)
        }
      }
    })
    await page.goto(`${baseUrl()}/projects/${project.id}/models/${model.id}`)
    await openWorkspace(page)
    await page.getByTestId('model-workspace').waitFor()
    await page.getByTestId('effective-stress-line').waitFor()
    await page.waitForLoadState('networkidle')
    const line = page.getByTestId('model-in-force')
    await line.waitFor()
    expect(await page.evaluate(() => (window as unknown as { intlUsed: string[] }).intlUsed)).toEqual([])
    // Written in the browser from the date's fields: the day in Tokyo, as Intl would write it there.
    const day = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', timeZone: 'Asia/Tokyo' }).format(new Date(inForce.approvedAt!))
    expect(await line.textContent()).toContain(`on ${day}.`)

    // The saved version's time on the page is Tokyo's.
    const version = await must('version 1', engineer.get<{ version: { createdAt: string } }>(`${model.url}/versions/1`))
    await page.getByTestId('version-list').scrollIntoViewIfNeeded()
    await expect.poll(() => page.getByTestId('version-list').textContent()).toContain(shownIn(version.version.createdAt, 'Asia/Tokyo'))
  })
})
