import { describe, expect, it } from 'vitest'
import { renderPdf, renderReport } from '~~/server/services/reports/render'
import { RESULT_CAUTION } from '#shared/caution'
import { NOT_APPROVED_BAND, reportDocument, type ReportHeader } from '#shared/reports/sheet'
import { pdfInfo, pdfPagesText, pdfPageToPng } from '../../helpers/pdf'

const header: ReportHeader = {
  project: { name: 'Trent Wharf yard', jobNumber: 'TRN-0417', client: 'Harbour Board' },
  title: 'Settlement run',
  subject: 'Yard embankment',
  revision: 'B',
  prepared: { name: 'Demo Designer', date: '3 Dec 2026' },
  checked: null,
  approved: { name: 'Demo Reviewer', date: '4 Dec 2026' },
  units: 'SI',
  approvedRecord: true,
}
const lines = (n: number) => Array.from({ length: n }, (_, i) => ({ text: `Row ${i + 1}` }))

describe('report sheet', () => {
  it('repeats the header strip and sign-off footer with page x of y on every A4 page', async () => {
    const pdf = await renderPdf(reportDocument(header, [{ text: 'Inputs', style: 'section' }, ...lines(90)]))
    const info = pdfInfo(pdf)
    expect(info.pages).toBe(2)
    // A4 is 595.28 × 841.89 pt (ISO 216).
    expect(info.width).toBeCloseTo(595.28, 1)
    expect(info.height).toBeCloseTo(841.89, 1)
    const pages = pdfPagesText(pdf)
    pages.forEach((text, i) => {
      expect(text).toContain('TRN-0417')
      expect(text).toContain('Yard embankment')
      expect(text).toContain(`page ${i + 1} of 2`)
      expect(text).toContain('Issued, revision B')
      expect(text).toContain('Demo Reviewer')
      expect(text.replace(/\s+/g, ' ')).toContain(RESULT_CAUTION.slice(0, 60))
      expect(text).not.toContain('NOT APPROVED')
    })
    expect(pages[1]).toContain('Row 90')
    pdfPageToPng(pdf, 'report-sheet-page-1')
  })

  it('bands every page of a report of something not approved, and says a preview is not issued', async () => {
    const pdf = await renderPdf(reportDocument({ ...header, revision: null, approvedRecord: false }, lines(90)))
    const pages = pdfPagesText(pdf, 'raw')
    expect(pages).toHaveLength(2)
    for (const text of pages) {
      expect(text.replace(/\s+/g, ' ')).toContain(NOT_APPROVED_BAND)
      expect(text).toContain('Preview, not issued')
    }
  })

  it('draws the Greek letters of the trade in the embedded font, body and SVG alike', async () => {
    const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="200" height="40"><text x="4" y="20" font-family="SourceSans3" font-size="10">σ′p γ Δσ</text></svg>'
    const pdf = await renderPdf(reportDocument(header, [{ text: 'σ\'v0 ≈ 120 kPa, γ 18 kN/m³' }, { svg }]))
    const text = pdfPagesText(pdf)[0]!
    expect(text).toContain('σ\'v0 ≈ 120 kPa, γ 18 kN/m³')
    expect(text).toContain('σ′p γ Δσ')
  })
})

describe('renderReport', () => {
  it('counts the pages it drew', async () => {
    const { pdf, pages } = await renderReport(reportDocument(header, lines(140)))
    expect(pages).toBe(pdfInfo(pdf).pages)
    expect(pages).toBe(3)
  })
})
