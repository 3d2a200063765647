// Field vane readings from a CSV through the import page, on a project of the
// test's own: a broken file is reported with its file row numbers and writes
// nothing; the corrected file adds the readings, and the point's vane tab lists
// them with their sensitivity St = peak / remoulded (common practice).
import { mkdtempSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { baseUrl, demoEmail, signIn } from '../helpers/http'
import { createPoint, createProject } from '../helpers/project'
import { screenshot, signInAs, useBrowser } from './helpers'

describe('field vane import in Chromium', () => {
  const browser = useBrowser()

  it('the geologist imports vane readings: errors at their rows first, then the readings on the point page', async () => {
    const owner = await signIn(demoEmail('owner'))
    const { id: projectId } = await createProject(owner, 'VANE', 'Saltmarsh Lane vane trial', ['geologist'])
    const pointId = await createPoint(owner, projectId, { identifier: 'VT-01', easting: 40, northing: 60, groundElevation: 2.6, finalDepth: 12 })

    const dir = mkdtempSync(join(tmpdir(), 'pastload-vane-'))
    const header = 'Point,Depth (m),Peak su (kPa),Remoulded su (kPa)'
    const broken = join(dir, 'vane-broken.csv')
    writeFileSync(broken, `${header}\nVT-01,4.0,18.5,4.1\nVT-09,5.0,20.0,4.6\nVT-01,14.0,30.0,6.0\n`)
    const good = join(dir, 'vane.csv')
    writeFileSync(good, `${header}\nVT-01,4.0,18.5,4.1\nVT-01,5.0,20.0,4.6\nVT-01,6.5,23.5,5.0\n`)

    const page = await signInAs(browser.context, demoEmail('geologist'))
    await page.goto(`${baseUrl()}/projects/${projectId}/import`)
    await page.getByTestId('import-file').setInputFiles(broken)
    await page.getByTestId('import-target').selectOption('vane')
    await page.getByTestId('import-mapping').waitFor()
    // The mapping for the chosen target is suggested once the page has read the file for it.
    await expect.poll(() => page.locator('#map-peak').inputValue()).toBe('Peak su (kPa)')
    await page.getByTestId('import-check').click()
    const report = page.getByTestId('import-report')
    await report.waitFor()
    const rows = await report.locator('tbody tr').allTextContents()
    // Row 1 is the header: the unknown point is file row 3, the reading below the hole row 4.
    expect(rows.some(r => r.startsWith('3') && r.includes('VT-09'))).toBe(true)
    expect(rows.some(r => r.startsWith('4') && /12/.test(r))).toBe(true)
    await screenshot(page, 'vane-import-report')
    expect((await owner.get<{ vane: unknown[] }>(`/api/projects/${projectId}/points/${pointId}`)).body.vane).toHaveLength(0)

    await page.getByTestId('import-file').setInputFiles(good)
    await page.getByRole('heading', { name: /^vane\.csv/ }).waitFor()
    await page.getByTestId('import-target').selectOption('vane')
    await page.getByTestId('import-mapping').waitFor()
    await expect.poll(() => page.locator('#map-peak').inputValue()).toBe('Peak su (kPa)')
    await page.getByTestId('import-commit').click()
    await page.getByTestId('import-done').filter({ hasText: '3' }).waitFor()

    await page.goto(`${baseUrl()}/projects/${projectId}/points/${pointId}`)
    await page.getByRole('tab', { name: /Vane/ }).click()
    const table = page.getByTestId('vane-table')
    await table.waitFor()
    const cells = await table.locator('tbody tr').allTextContents()
    expect(cells).toHaveLength(3)
    expect(cells[2]).toContain('6.50')
    expect(cells[2]).toContain('23.5')
    // St = 23.5 / 5.0
    expect(cells[2]).toContain('4.7')
    await screenshot(page, 'vane-import-point')
    const stored = (await owner.get<{ vane: { depth: number, peak: number, remoulded: number | null }[] }>(`/api/projects/${projectId}/points/${pointId}`)).body.vane
    expect(stored.map(v => [v.depth, v.peak, v.remoulded])).toEqual([[4, 18.5, 4.1], [5, 20, 4.6], [6.5, 23.5, 5]])
    await page.close()
  })
})
