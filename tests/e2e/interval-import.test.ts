// A CSV of log intervals that replaces a hole's whole log, in Chromium: the preview says whose log
// it replaces and with how many intervals, and asks before anything is written; "Not now" leaves
// the log as it was, "Yes, import" replaces it.
import { describe, expect, it } from 'vitest'
import type { IntervalRow, StratumRow } from '../../shared/types/investigation'
import { screenshot, useProjectAs } from './helpers'

/** A CSV field, quoted when it holds a comma, quote or line break. */
function field(v: string | number | null): string {
  const s = v === null ? '' : String(v)
  return /[",\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s
}

describe('interval import that replaces a log, in Chromium', () => {
  const site = useProjectAs('geologist', 'E2E-IVR')

  it('says "replaces BH-01\'s n intervals with n − 1", and writes only when confirmed', async () => {
    const { client, projectId } = site
    const points = (await client.get<{ points: { id: string, identifier: string }[] }>(`/api/projects/${projectId}/points?q=BH-01`)).body.points
    const bh01 = points.find(p => p.identifier === 'BH-01')!.id
    const logOf = async () => (await client.get<{ intervals: IntervalRow[] }>(`/api/projects/${projectId}/points/${bh01}`)).body.intervals
    const strata = (await client.get<{ strata: StratumRow[] }>(`/api/projects/${projectId}/strata`)).body.strata
    const code = (id: string | null) => strata.find(s => s.id === id)?.code ?? ''

    const before = await logOf()
    expect(before.length).toBeGreaterThan(3)
    // The re-logged hole: the last two intervals logged as one.
    const last = before[before.length - 1]!
    const merged = { ...before[before.length - 2]!, bottom: last.bottom, description: 'Dense to very dense grey silty fine to medium SAND, wet, with thin shell bands (SAND)' }
    const relogged = [...before.slice(0, -2), merged]
    const csv = ['point,top,bottom,description,uscs,stratum', ...relogged.map(iv => ['BH-01', iv.top, iv.bottom, iv.description, iv.uscs, code(iv.stratumId)].map(field).join(','))].join('\n')

    const page = await site.open('/import')
    await page.getByTestId('import-file').setInputFiles({ name: 'bh-01-relogged.csv', mimeType: 'text/csv', buffer: Buffer.from(`${csv}\n`) })
    await page.getByTestId('import-mapping').waitFor()
    expect(await page.getByTestId('import-target').inputValue()).toBe('intervals')
    expect(await page.locator('#map-stratum').inputValue()).toBe('stratum')
    expect(await page.getByTestId('import-commit').textContent()).toContain('Check and import')
    await page.getByTestId('import-commit').click()

    // The preview says what is replaced and asks; nothing is written yet.
    const replaces = page.getByTestId('import-replaces')
    await replaces.waitFor()
    expect((await replaces.textContent())?.trim()).toBe(`This import replaces BH-01's ${before.length} intervals with ${before.length - 1}.`)
    await page.getByTestId('import-confirm-box').waitFor()
    expect(await page.getByTestId('import-confirm-box').textContent()).toContain('Nothing is written yet.')
    expect(await logOf()).toEqual(before)
    await screenshot(page, 'import-intervals-replaces')

    // "Not now": the question goes away and the log is as it was.
    await page.getByTestId('import-cancel').click()
    await page.getByTestId('import-confirm-box').waitFor({ state: 'detached' })
    expect(await page.getByTestId('import-done').textContent()).not.toContain('Imported')
    expect(await logOf()).toEqual(before)

    // Asked again and confirmed: the log is the file's.
    await page.getByTestId('import-commit').click()
    await page.getByTestId('import-confirm').click()
    await page.getByTestId('import-done').filter({ hasText: 'Imported' }).waitFor()
    expect(await page.getByTestId('import-done').textContent()).toContain(`Imported ${before.length - 1} rows into`)
    const after = await logOf()
    expect(after.map(iv => [iv.top, iv.bottom, iv.description, iv.uscs, iv.stratumId])).toEqual(relogged.map(iv => [iv.top, iv.bottom, iv.description, iv.uscs, iv.stratumId]))
    await screenshot(page, 'import-intervals-replaced')
    await page.close()
  })
})
