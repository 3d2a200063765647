// The stress workspace's two canvas layers (the dense CPT σ'p rows and the σ'p symbols) in Chromium: painted by
// workers of their own where the browser can hand a canvas over, on the page itself where it cannot or where the
// worker fails to start — and in each case the pixels are on the screen, not only the counts in the attributes.
import { describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import { openWorkspace, screenshot, useProjectAs } from './helpers'

const LAYERS = ['dense-layer', 'point-layer'] as const

/**
 * How many of a layer's screen pixels it paints: the layer's box captured as shown and again with the layer
 * hidden, the two compared in the page (the screenshots decoded by the browser itself).
 */
async function paintedPixels(page: Page, testId: string): Promise<number> {
  const layer = page.getByTestId(testId)
  await layer.scrollIntoViewIfNeeded()
  const shown = await layer.screenshot()
  await layer.evaluate((e) => { (e as HTMLElement).style.opacity = '0' })
  const hidden = await layer.screenshot()
  await layer.evaluate((e) => { (e as HTMLElement).style.opacity = '' })
  return page.evaluate(async ([a, b]) => {
    async function pixels(base64: string): Promise<Uint8ClampedArray> {
      const img = new Image()
      img.src = `data:image/png;base64,${base64}`
      await img.decode()
      const c = document.createElement('canvas')
      c.width = img.width
      c.height = img.height
      const ctx = c.getContext('2d')!
      ctx.drawImage(img, 0, 0)
      return ctx.getImageData(0, 0, c.width, c.height).data
    }
    const [p, q] = [await pixels(a!), await pixels(b!)]
    let differ = 0
    for (let i = 0; i < p.length; i += 4) {
      if (Math.abs(p[i]! - q[i]!) + Math.abs(p[i + 1]! - q[i + 1]!) + Math.abs(p[i + 2]! - q[i + 2]!) > 24) differ++
    }
    return differ
  }, [shown.toString('base64'), hidden.toString('base64')])
}

describe('the stress workspace\'s canvas layers, in Chromium', () => {
  const project = useProjectAs('engineer', 'E2E-LAYERS')

  /** Signs the engineer in (through the form, in this describe's browser) and opens a new model of the project's copy. */
  async function openNewModel(suffix: string, prepare?: (page: Page) => Promise<void>): Promise<Page> {
    await (await project.open()).close()
    const created = await project.client.post<{ model: { id: string } }>(`/api/projects/${project.projectId}/models`, { name: `Layer checks ${suffix} ${Date.now().toString(36)}` })
    expect(created.status).toBe(201)
    const page = await project.browser.context.newPage()
    if (prepare) await prepare(page)
    await page.goto(project.url(`/models/${created.body.model.id}`))
    await openWorkspace(page)
    await page.getByTestId('model-workspace').waitFor()
    // The demo's soundings: thousands of CPT rows in the dense layer, hundreds of σ'p symbols.
    await expect.poll(async () => Number(await page.getByTestId('dense-layer').getAttribute('data-drawn')), { timeout: 20_000 }).toBeGreaterThan(1000)
    await expect.poll(async () => Number(await page.getByTestId('point-layer').getAttribute('data-drawn')), { timeout: 20_000 }).toBeGreaterThan(100)
    return page
  }

  it('paints both layers in workers: the rows and symbols are on the screen', async () => {
    const page = await openNewModel('worker')
    for (const id of LAYERS) expect(await page.getByTestId(id).getAttribute('data-painter')).toBe('worker')
    // The dense layer reports the rows it drew and its time (the benchmark reads it).
    expect(Number(await page.getByTestId('dense-layer').getAttribute('data-draw-ms'))).toBeGreaterThan(0)
    await expect.poll(() => paintedPixels(page, 'dense-layer'), { timeout: 10_000 }).toBeGreaterThan(500)
    await expect.poll(() => paintedPixels(page, 'point-layer'), { timeout: 10_000 }).toBeGreaterThan(2000)
    await screenshot(page, 'track-layers-worker')

    // Zooming sends a new view: the dense layer draws again, fewer rows at a closer depth range.
    const before = Number(await page.getByTestId('dense-layer').getAttribute('data-drawn'))
    const box = (await page.getByTestId('model-canvas').boundingBox())!
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 3)
    for (let i = 0; i < 6; i++) await page.mouse.wheel(0, -240)
    await expect.poll(async () => Number(await page.getByTestId('dense-layer').getAttribute('data-drawn')), { timeout: 10_000 }).toBeLessThan(before)
    await page.close()
  })

  it('paints on the page itself where a browser cannot hand a canvas to a worker', async () => {
    const page = await openNewModel('page', async (p) => {
      await p.addInitScript(() => {
        Reflect.deleteProperty(HTMLCanvasElement.prototype, 'transferControlToOffscreen')
      })
    })
    for (const id of LAYERS) expect(await page.getByTestId(id).getAttribute('data-painter')).toBe('page')
    await expect.poll(() => paintedPixels(page, 'dense-layer'), { timeout: 10_000 }).toBeGreaterThan(500)
    await expect.poll(() => paintedPixels(page, 'point-layer'), { timeout: 10_000 }).toBeGreaterThan(2000)
    await page.close()
  })

  it('takes over on the page, on a new canvas, when the worker cannot start', async () => {
    const page = await openNewModel('failed worker', async (p) => {
      await p.route('**/_nuxt/workers/**', route => route.fulfill({ status: 404, body: '' }))
    })
    for (const id of LAYERS) await expect.poll(() => page.getByTestId(id).getAttribute('data-painter'), { timeout: 10_000 }).toBe('page')
    await expect.poll(() => paintedPixels(page, 'dense-layer'), { timeout: 10_000 }).toBeGreaterThan(500)
    await expect.poll(() => paintedPixels(page, 'point-layer'), { timeout: 10_000 }).toBeGreaterThan(2000)
    await page.close()
  })
})
