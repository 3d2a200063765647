// The CPT behaviour index Ic (Robertson 2009) as a track beside the CPT profile and as a faint guide
// beside the strata on the stress-model canvas, in Pastload's Ic colours; and the per-stratum switch
// "derive σ'p from CPT and vane" on the Strata page, whose default follows the logged USCS symbols.
import { describe, expect, it } from 'vitest'
import { join } from 'node:path'
import { SCREENSHOTS, screenshot, useProjectAs } from './helpers'

interface Points { points: { source: string, stratumCode: string | null, pointIdentifier: string, depth: number }[] }

describe('Ic on the CPT plot and the stress canvas (the seeded demo, read only)', () => {
  const demo = useProjectAs('reviewer')

  it('CPT-01\'s page draws an Ic track with clay-like and sand-like runs and the key of ranges', async () => {
    const list = await demo.client.get<{ points: { id: string, identifier: string }[] }>(`/api/projects/${demo.projectId}/points?limit=500`)
    const cpt = list.body.points.find(p => p.identifier === 'CPT-01')!
    const page = await demo.open(`/points/${cpt.id}`)
    const track = page.getByTestId('cpt-ic-track')
    await track.waitFor({ timeout: 20_000 })
    expect(Number(await track.getAttribute('data-runs'))).toBeGreaterThan(2)
    // The demo's made ground and sand read sand-like, its clays clay-like: both kinds are drawn.
    const label = (await track.getAttribute('aria-label')) ?? ''
    const share = Number(/clay-like over (\d+) %/.exec(label)?.[1])
    expect(share).toBeGreaterThan(40)
    expect(share).toBeLessThan(100)
    const colours = new Set(await page.getByTestId('cpt-ic-strip').locator('rect').evaluateAll(rs => rs.map(r => r.getAttribute('fill'))))
    expect(colours.has('#317d8c') || colours.has('#acd8de')).toBe(true) // clay-like bands
    expect(colours.has('#dc9c38') || colours.has('#ab621c') || colours.has('#efd394')).toBe(true) // sand-like bands
    const key = page.getByTestId('cpt-ic-key').first()
    for (const range of ['< 1.31', '1.31–2.05', '2.05–2.60', '2.60–2.95', '2.95–3.60', '> 3.60']) expect(await key.textContent()).toContain(range)
    await page.getByTestId('cpt-plot').scrollIntoViewIfNeeded()
    await screenshot(page, 'cpt-ic-track')
    await track.screenshot({ path: join(SCREENSHOTS, 'cpt-ic-track-detail.png') })
    await page.close()
  })

  it('the design model\'s canvas shows one faint Ic column per CPT beside the strata', async () => {
    const project = await demo.client.get<{ project: { designModelId: string } }>(`/api/projects/${demo.projectId}`)
    const page = await demo.open(`/models/${project.body.project.designModelId}`)
    const guide = page.getByTestId('behaviour-guide')
    await expect.poll(async () => Number(await guide.getAttribute('data-soundings')), { timeout: 20_000 }).toBe(4)
    expect(await guide.locator('rect').count()).toBeGreaterThan(8)
    expect(await page.getByTestId('behaviour-guide-key').textContent()).toContain('2.95–3.60')
    await page.getByTestId('model-canvas').scrollIntoViewIfNeeded()
    await screenshot(page, 'stress-canvas-ic-guide')
    // The strata, the guide and the first tracks at full size, to look at the guide itself.
    await page.getByTestId('model-canvas').screenshot({ path: join(SCREENSHOTS, 'stress-canvas-ic-guide-detail.png') })
    await page.close()
  })
})

describe('the switch "derive σ\'p from CPT and vane" on the Strata page', () => {
  const copy = useProjectAs('engineer', 'E2E-ICS')

  it('shows each stratum\'s default from its logged symbols, and switching made ground on brings its CPT σ\'p back', async () => {
    const page = await copy.open('/strata')
    const mg = page.getByLabel('Derive σ\'p from CPT and vane in MG')
    await mg.waitFor({ timeout: 20_000 })
    expect(await mg.inputValue()).toBe('default')
    expect(await mg.locator('option:checked').textContent()).toContain('As logged (off)')
    expect(await page.getByLabel('Derive σ\'p from CPT and vane in EST').locator('option:checked').textContent()).toContain('As logged (on)')
    const cells = await page.getByTestId('stratum-cpt-derivation').allTextContents()
    expect(cells.some(t => /logged (GW|SW)/.test(t))).toBe(true)

    const before = (await copy.client.get<Points>(`/api/projects/${copy.projectId}/preconsolidation-points`)).body
    expect(before.points.filter(p => p.source === 'cpt' && p.stratumCode === 'MG')).toEqual([])
    await mg.selectOption('on')
    await expect.poll(async () => (await page.getByRole('status').allTextContents()).join(' '), { timeout: 10_000 }).toContain('MG: σ\'p derived from CPT and vane.')
    const after = (await copy.client.get<Points>(`/api/projects/${copy.projectId}/preconsolidation-points`)).body
    expect(after.points.filter(p => p.source === 'cpt' && p.stratumCode === 'MG').length).toBeGreaterThan(0)
    await screenshot(page, 'strata-cpt-switch')

    await page.goto(copy.url('/preconsolidation'))
    await expect.poll(async () => (await page.getByTestId('not-derived-note').textContent()) ?? '', { timeout: 15_000 }).toContain('Not derived from CPT and vane in SAND')
    await page.close()
  })
})
