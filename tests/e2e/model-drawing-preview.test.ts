// The stress-model page's first load in Chromium, on the seeded demo (read only): the server's drawing of the
// draft is in the page as sent, and nothing of the workspace (its code, its reads) is asked for until it is used;
// the pointer over the drawing fetches its code but moves nothing; a click on the drawing or the button (by
// keyboard too, the focus going on into the workspace) opens it; reached by an in-app link, the page opens the
// workspace at once. Laptop and phone widths.
import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import { screenshot, useProjectAs, waitForApp } from './helpers'

/** The requests a page makes from now on, by path. */
function requests(page: Page): string[] {
  const seen: string[] = []
  page.on('request', r => seen.push(new URL(r.url()).pathname))
  return seen
}

describe('the stress-model page opens with the server\'s drawing', () => {
  const demo = useProjectAs('engineer')
  const modelPath = async () => `/models/${(await demo.client.get<{ modelId: string }>(`/api/projects/${demo.projectId}/model-in-force`)).body.modelId}`

  it('sends the drawing with the page, asks for nothing of the workspace until the pointer comes over it, and opens it on a click (laptop)', async () => {
    const path = await modelPath()
    const page = await demo.open('', { viewport: { width: 1366, height: 900 } })
    // The page as the server sends it already holds the drawing.
    const html = await (await page.request.get(demo.url(path))).text()
    expect(html).toContain('data-testid="model-drawing-preview"')
    expect(html).toMatch(/<svg xmlns="http:\/\/www\.w3\.org\/2000\/svg" width="720" height="880"/)

    // Every write of an element's markup is noted: taking the page over keeps the drawing the server sent.
    await page.addInitScript(() => {
      const inner = Object.getOwnPropertyDescriptor(Element.prototype, 'innerHTML')!
      const written: string[] = []
      Object.assign(window, { markupWritten: written })
      Object.defineProperty(Element.prototype, 'innerHTML', { ...inner, set(this: Element, v: string) { written.push(this.className); inner.set!.call(this, v) } })
    })
    const asked = requests(page)
    await page.goto(demo.url(path))
    await waitForApp(page)
    await page.waitForLoadState('networkidle')
    const preview = page.getByTestId('model-drawing-preview')
    expect(await preview.locator('figure .model-drawing-preview > svg').count()).toBe(1)
    expect(await page.evaluate(() => (window as unknown as { markupWritten: string[] }).markupWritten.filter(c => c.includes('model-drawing-preview')))).toEqual([])
    expect(await preview.getByRole('img').getAttribute('aria-label')).toMatch(/\d+ σ'p points/)
    expect(await page.getByTestId('model-workspace').count()).toBe(0)
    // Neither the σ'p points, the logs' layers nor the drawing itself were asked for by the browser.
    expect(asked.filter(p => p.includes('/preconsolidation-points') || p.includes('/site-reference') || p.endsWith('/drawing'))).toEqual([])
    await screenshot(page, 'model-drawing-preview-laptop')
    // The session bar works before the workspace is opened: a version message makes "Save version" ready.
    await page.getByTestId('version-message').fill('Checked against the logs')
    await expect.poll(() => page.getByTestId('save-version').isEnabled()).toBe(true)
    await page.getByTestId('version-message').fill('')
    expect(await preview.count()).toBe(1)

    // The pointer over the drawing fetches the workspace's code; nothing on the page changes until a click.
    const scripts = asked.length
    await page.getByTestId('model-drawing-figure').hover()
    await expect.poll(() => asked.slice(scripts).some(p => p.endsWith('.js'))).toBe(true)
    await page.waitForTimeout(300)
    expect(await page.getByTestId('model-workspace').count()).toBe(0)
    expect(await preview.count()).toBe(1)
    await page.getByTestId('model-drawing-figure').click()
    await page.getByTestId('model-workspace').waitFor()
    await page.getByTestId('stress-track').waitFor()
    expect(await preview.count()).toBe(0)
    expect(asked.some(p => p.endsWith('/preconsolidation-points/evaluate'))).toBe(true)
    await page.close()
  })

  it('opens from the keyboard with its button, the focus going on into the workspace (phone)', async () => {
    const path = await modelPath()
    const page = await demo.open('', { viewport: { width: 390, height: 844 } })
    await page.goto(demo.url(path))
    await waitForApp(page)
    await page.getByTestId('open-workspace').waitFor()
    await screenshot(page, 'model-drawing-preview-phone')
    // Tab on through the header, the sections and the session bar to the button: reaching it opens nothing.
    const focused = () => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? document.activeElement?.getAttribute('data-testid') ?? '')
    for (let i = 0; i < 40 && await focused() !== 'open-workspace'; i++) await page.keyboard.press('Tab')
    expect(await focused()).toBe('open-workspace')
    await page.waitForTimeout(300)
    expect(await page.getByTestId('model-workspace').count()).toBe(0)
    // Enter opens it; the focus moves to the workspace's box, brought into view.
    await page.keyboard.press('Enter')
    await expect.poll(focused).toBe('Stress workspace')
    expect(await page.evaluate(() => document.activeElement!.getBoundingClientRect().top)).toBeGreaterThan(-1)
    await page.getByTestId('model-workspace').waitFor()
    await page.getByTestId('stress-track').waitFor()
    await page.keyboard.press('Tab')
    expect(await page.evaluate(() => !!document.activeElement?.closest('[data-testid="model-workspace"]'))).toBe(true)
    await page.close()
  })

  it('opens the workspace at once when reached by an in-app link', async () => {
    const page = await demo.open('/models', { viewport: { width: 1366, height: 900 } })
    const id = (await modelPath()).split('/').pop()!
    await page.locator(`a[href$="/models/${id}"]`).first().click()
    await page.waitForURL(new RegExp(`/models/${id}$`))
    await page.getByTestId('model-workspace').waitFor()
    expect(await page.getByTestId('model-drawing-preview').count()).toBe(0)
    await page.close()
  })
})
