// The site plan in Chromium on the seeded demo (read only): the nest of three piezometers, 2 m apart,
// is drawn as one mark at the plan's first view; it opens a list of its points, which opens a point;
// zoomed in, the three are drawn apart; names are written where they cover no other. Laptop and phone widths.
import { describe, expect, it } from 'vitest'
import { screenshot, useProjectAs } from './helpers'

describe('site plan: points drawn at the same place', () => {
  const demo = useProjectAs('geologist')

  it('draws the piezometer nest as one mark that opens a list of its points, by keyboard and by click (laptop)', async () => {
    const page = await demo.open('/plan', { viewport: { width: 1366, height: 800 } })
    const nest = page.locator('[data-testid="plan-point"][data-cluster-size="3"]')
    await nest.waitFor()
    expect(await nest.locator('text.label').textContent()).toBe('P-1 +2')
    expect(await nest.getAttribute('aria-label')).toContain('with 2 more points near here')
    // The other two are not drawn (nor reachable by Tab) while the nest is one mark.
    for (const hidden of ['P-2', 'P-3']) {
      const mark = page.locator(`[data-testid="plan-point"][aria-label^="${hidden},"]`)
      expect(await mark.getAttribute('class')).toContain('clustered')
      expect(await mark.getAttribute('tabindex')).toBe('-1')
    }

    await nest.focus()
    await page.keyboard.press('Enter')
    const list = page.getByTestId('plan-cluster')
    await list.waitFor()
    expect((await list.locator('p').first().textContent())?.trim()).toBe('3 points near here')
    expect(await list.getByTestId('plan-cluster-point').allTextContents()).toEqual([
      expect.stringContaining('P-1'), expect.stringContaining('P-2'), expect.stringContaining('P-3'),
    ])
    // The list takes the focus, so the keyboard goes on from there; Escape closes it.
    expect(await page.evaluate(() => document.activeElement?.textContent ?? '')).toContain('P-1')
    await screenshot(page, 'site-plan-cluster-laptop')
    await page.keyboard.press('Escape')
    expect(await list.count()).toBe(0)

    await nest.click()
    await list.getByTestId('plan-cluster-point').filter({ hasText: 'P-2' }).click()
    await page.waitForURL(/\/points\/[0-9a-f-]{36}$/)
    expect(await page.getByTestId('point-identifier').textContent()).toContain('P-2')
    await page.close()
  })

  it('on a phone, the nest is in a mark whose list holds all three', async () => {
    const page = await demo.open('/plan', { viewport: { width: 390, height: 844 } })
    await page.locator('[data-testid="plan-point"][data-cluster-size]').first().waitFor()
    for (const hidden of ['P-2', 'P-3']) {
      expect(await page.locator(`[data-testid="plan-point"][aria-label^="${hidden},"]`).getAttribute('class')).toContain('clustered')
    }
    // At this width more marks may meet; open each group mark until the one holding the nest.
    const list = page.getByTestId('plan-cluster')
    let names: string[] = []
    for (const mark of await page.locator('[data-testid="plan-point"][data-cluster-size]').all()) {
      await mark.dispatchEvent('click')
      await list.waitFor()
      names = await list.getByTestId('plan-cluster-point').evaluateAll(els => els.map(e => e.getAttribute('data-identifier') ?? ''))
      if (names.includes('P-2')) break
      await list.getByRole('button', { name: 'Close' }).click()
      await list.waitFor({ state: 'detached' })
    }
    expect(names).toEqual(expect.arrayContaining(['P-1', 'P-2', 'P-3']))
    await screenshot(page, 'site-plan-cluster-phone')
    await page.close()
  })

  it('writes each mark\'s name where it covers no other name or mark, on a phone and on a laptop', async () => {
    for (const viewport of [{ width: 390, height: 844 }, { width: 1366, height: 800 }]) {
      const page = await demo.open('/plan', { viewport })
      await page.locator('[data-testid="plan-point"][data-cluster-size]').first().waitFor()
      const drawn = await page.locator('[data-testid="plan-point"]:not(.clustered):not(.faint)').evaluateAll(els => els.map((g) => {
        const box = (e: Element) => {
          const r = e.getBoundingClientRect()
          return { x0: r.left, y0: r.top, x1: r.right, y1: r.bottom }
        }
        const label = g.querySelector('text.label')!
        const shown = getComputedStyle(label).display !== 'none'
        return { name: g.getAttribute('aria-label')!.split(',')[0]!, group: g.hasAttribute('data-cluster-size'), text: label.textContent ?? '', side: label.getAttribute('data-side'), mark: box(g.querySelector('g.glyph')!), label: shown ? box(label) : null }
      }))
      expect(drawn.length).toBeGreaterThan(10)
      const meet = (a: { x0: number, y0: number, x1: number, y1: number }, b: typeof a) => a.x0 < b.x1 - 0.5 && b.x0 < a.x1 - 0.5 && a.y0 < b.y1 - 0.5 && b.y0 < a.y1 - 0.5
      const clashes: string[] = []
      for (const a of drawn) {
        if (!a.label) continue
        for (const b of drawn) {
          if (b === a) continue
          if (meet(a.label, b.mark)) clashes.push(`${a.name}'s name covers ${b.name}'s mark`)
          if (b.label && meet(a.label, b.label) && a.name < b.name) clashes.push(`${a.name}'s name covers ${b.name}'s`)
        }
      }
      expect(clashes).toEqual([])
      const unnamed = drawn.filter(d => !d.label).map(d => d.name)
      if (viewport.width > 1000) {
        // On a laptop every name has room, to the right of its mark as drawn by default.
        expect(unnamed).toEqual([])
        expect(drawn.every(d => d.side === 'right' && d.text === d.name)).toBe(true)
      }
      else {
        // On a phone the marks crowd: names move to other sides, and most find a place; a group shows its count at least.
        expect(drawn.some(d => d.side !== 'right' && d.label)).toBe(true)
        expect(unnamed.length).toBeLessThanOrEqual(drawn.length / 3)
        for (const g of drawn.filter(d => d.group)) {
          expect(g.label, g.name).not.toBeNull()
          expect([g.name, `+${g.name.split(' +')[1]}`]).toContain(g.text)
        }
      }
      await page.close()
    }
  })

  it('holds the plan\'s room from the server\'s page until its drawing comes, so the list under it does not move', async () => {
    const page = await demo.open('', { viewport: { width: 768, height: 1000 } })
    // The plan's drawing code (the chunk that draws the "site-plan" SVG) arrives 1.5 s late.
    let held = 0
    await page.route('**/_nuxt/*.js', async (route) => {
      const res = await route.fetch()
      const body = await res.text()
      if (body.includes('"data-testid":"site-plan"')) {
        held++
        await new Promise(resolve => setTimeout(resolve, 1500))
      }
      await route.fulfill({ response: res, body })
    })
    await page.goto(page.url().replace(/\/?$/, '/plan'))
    const list = page.locator('section[aria-labelledby="point-list-heading"]')
    await list.waitFor()
    const top0 = (await list.boundingBox())!.y
    // The page has come alive and asked for the drawing, which has not come: the placeholder holds the room.
    await expect.poll(() => held).toBe(1)
    expect(await page.getByTestId('plan-placeholder').count()).toBe(1)
    expect((await list.boundingBox())!.y).toBeCloseTo(top0, 0)
    await page.getByTestId('site-plan').waitFor()
    expect(await page.getByTestId('plan-placeholder').count()).toBe(0)
    // The legend under the plan takes one line at this width, as the placeholder allowed.
    expect(Math.abs((await list.boundingBox())!.y - top0)).toBeLessThan(2)
    await page.close()
  })

  it('draws the three apart once zoomed in', async () => {
    const page = await demo.open('/plan', { viewport: { width: 1366, height: 800 } })
    await page.locator('[data-testid="plan-point"][data-cluster-size="3"]').waitFor()
    const zoomIn = page.getByRole('button', { name: 'Zoom in' })
    const nested = page.locator('[data-testid="plan-point"].clustered[aria-label^="P-"]')
    // Each step zooms 1.6×; the nest is 2 m apart and parts at 32 px across, so a handful of steps is enough.
    for (let i = 0; i < 12 && (await nested.count()) > 0; i++) {
      await zoomIn.click()
      await page.waitForTimeout(300)
    }
    expect(await nested.count()).toBe(0)
    expect(await page.locator('[data-testid="plan-point"][data-cluster-size][aria-label^="P-"]').count()).toBe(0)
    await page.close()
  })
})
