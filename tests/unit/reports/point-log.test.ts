import { describe, expect, it } from 'vitest'
import { renderReport } from '~~/server/services/reports/render'
import { RESULT_CAUTION } from '#shared/caution'
import { pointLogPageSvg, sptLabel, stressAxes } from '#shared/plots/point-log'
import { keysDrawn, LOG_DRAW_HEIGHT, pointLogDocument, pointLogKey, pointLogPages } from '#shared/reports/point-log'
import { LOG_SCALES } from '#shared/reports/point-log-layout'
import { pdfInfo, pdfPagesText, pdfPageToPng } from '../../helpers/pdf'
import { demoLogData } from '../../helpers/point-log-data'

describe('point log document', () => {
  it('writes a refusal as blows over the penetration, a full drive as N', () => {
    expect(sptLabel({ depth: 19, blows: [12, 50, 0], n: 50, penetration: 100 })).toBe('50/100 mm')
    expect(sptLabel({ depth: 16, blows: [6, 14, 17], n: 31, penetration: null })).toBe('N 31')
  })

  it('has one key entry for every mark any page draws, at each scale', () => {
    const data = demoLogData()
    const key = new Set(pointLogKey(data).map(e => e.key))
    for (const scale of LOG_SCALES) {
      const axes = stressAxes(data)
      const drawn = new Set<string>()
      for (const p of pointLogPages(data.point.finalDepth, scale)) {
        for (const k of keysDrawn(pointLogPageSvg(data, { scale, from: p.from, to: p.to, axes }).svg)) drawn.add(k)
      }
      // Every glyph family of the fixture is drawn somewhere.
      expect([...drawn].sort()).toEqual(expect.arrayContaining(['gap', 'line:sv0', 'line:trend', 'sample:bulk', 'sample:core', 'sample:piston', 'sample:spt-split-spoon', 'sample:thin-walled-tube', 'sigmap:oedometer-good', 'sigmap:oedometer-other', 'sigmap:vane', 'spt:full', 'spt:refusal', 'stratum:C1', 'stratum:F', 'stratum:G', 'stratum:S', 'uscs:PT', 'water:standing', 'water:strike']))
      for (const k of drawn) expect(key, `key lacks ${k} at 1:${scale}`).toContain(k)
    }
  })

  it('labels a US project in feet and psf, the drawing still at the metric depth scale', () => {
    const data = demoLogData({ units: 'US' })
    const { svg } = pointLogPageSvg(data, { scale: 100, from: 0, to: 20 })
    expect(svg).toContain('>ft<')
    expect(svg).toContain('>psf<')
    // The end of the 24 m hole is on the second page: 24 m = 78.74 ft (1 ft = 0.3048 m, exact).
    expect(pointLogPageSvg(data, { scale: 100, from: 20, to: 24 }).svg).toContain('End 78.74 ft')
  })

  it('labels the stress strip in tsf when the US project chose tsf, and the sheet says so', () => {
    const data = demoLogData({ units: 'US', usStress: 'tsf' })
    const { svg } = pointLogPageSvg(data, { scale: 100, from: 0, to: 20 })
    expect(svg).toContain('>tsf<')
    expect(svg).not.toContain('>psf<')
    const { doc } = pointLogDocument(data, { scale: 100, revision: null })
    const footer = doc.footer as (page: number, pages: number, size: { width: number, height: number }) => unknown
    expect(JSON.stringify(footer(1, 1, { width: 595.28, height: 841.89 }))).toContain('US customary units (ft, tsf, pcf)')
  })

  it('keeps the key to what is drawn: no σ\'p or line entries without a stress model', () => {
    const data = demoLogData({ stress: { available: false, model: 'No saved version of the design model.', profile: [], trend: [], points: [] } })
    const keys = pointLogKey(data).map(e => e.key)
    expect(keys.some(k => k.startsWith('sigmap:') || k.startsWith('line:'))).toBe(false)
    const svg = pointLogPageSvg(data, { scale: 100, from: 0, to: 20 }).svg
    expect(svg).toContain("σ'v0 unavailable")
  })

  it('renders 3, 2 and 1 A4 pages of drawing for a 24 m hole at 1:50, 1:100 and 1:200, nothing cut', async () => {
    const data = demoLogData()
    const expected: Record<number, number> = { 50: 3, 100: 2, 200: 1 }
    for (const scale of LOG_SCALES) {
      const pages = pointLogPages(24, scale)
      expect(pages.length).toBe(expected[scale])
      const { doc } = pointLogDocument(data, { scale, revision: null })
      const { pdf, pages: count } = await renderReport(doc)
      const info = pdfInfo(pdf)
      expect(info.pages).toBe(count)
      // The key and remarks follow the last drawing; on the short last page they fit beside it.
      expect(count).toBeLessThanOrEqual(pages.length + 1)
      const text = pdfPagesText(pdf)
      text.forEach(t => expect(t).toContain('TRN-0417'))
      const all = text.join('\n')
      // SPT blows, sample references, the dates and a remark.
      for (const shown of ['50/100 mm', 'U1', 'C7', '2026-03-10', '2026-03-11', 'Casing to 14 m']) expect(all).toContain(shown)
      expect(all.replace(/\s+/g, ' ')).toContain(RESULT_CAUTION.slice(0, 50))
      pdfPageToPng(pdf, `report-point-log-unit-1-${scale}-p1`, 1, 100)
    }
    expect(LOG_DRAW_HEIGHT).toBeGreaterThan(560)
  }, 60_000)
})
