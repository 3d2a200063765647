import { describe, expect, it } from 'vitest'
import { baseUrl, demoEmail, signedInDemo } from '../helpers/http'
import { createProject, createSavedModel, must } from '../helpers/project'
import { signInAs, useBrowser } from './helpers'

/** The instant as the version page shows it ('dateTime'), in `timeZone`: the test's own Intl, not the app's helper. */
const shownIn = (iso: string, timeZone: string) =>
  new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit', timeZone }).format(new Date(iso))

describe('dates in the viewer\'s time zone, written by the server and kept by the browser, in Chromium', () => {
  // Tokyo is nine hours ahead of UTC all year: the server's own zone (UTC here) would show other hours.
  const browser = useBrowser({ timezoneId: 'Asia/Tokyo', viewport: { width: 390, height: 844 } })
  const { owner, engineer } = signedInDemo('owner', 'engineer')

  it('signing in keeps the zone; a version page comes from the server with its time in Tokyo and hydrates without a mismatch', async () => {
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
})
