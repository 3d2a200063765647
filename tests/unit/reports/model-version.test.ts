import { describe, expect, it } from 'vitest'
import { RESULT_CAUTION } from '#shared/caution'
import { modelVersionDocument, reportDate, trendParameterText } from '#shared/reports/model-version'
import { NOT_APPROVED_BAND } from '#shared/reports/sheet'
import { renderReport } from '~~/server/services/reports/render'
import { pdfInfo, pdfPagesText, pdfPageToPng } from '../../helpers/pdf'
import { reportData } from './model-version-fixture'

const flat = (s: string) => s.replace(/\s+/g, ' ')

describe('site-model version report', () => {
  it('puts the approval record, content hash, strata, groundwater, one drawing per stratum and the tables in an A4 PDF', async () => {
    const data = reportData()
    const { pdf, pages } = await renderReport(modelVersionDocument(data))
    const info = pdfInfo(pdf)
    // Cover, the ground (strata, γ, u), the whole depth, one page per stratum (5 in the demo ground model), then the tables.
    expect(pages).toBe(9)
    expect(info.pages).toBe(9)
    const text = pdfPagesText(pdf)
    const cover = flat(text[0]!)
    expect(cover).toContain('TRN-0417')
    expect(cover).toContain('Yard model, version 2')
    expect(cover).toContain('Approved by Demo Reviewer, 21 Nov 2026')
    expect(cover).toContain(data.approval!.hash)
    expect(cover).toContain('Estuarine clay')
    // The demo water table and the piezometer at 12 m (u = 9.81 × 10.4 = 102.0 kPa).
    expect(cover).toContain('Water table at 1.60 m')
    expect(cover).toMatch(/12\.00 102\.0/)
    const ground = flat(text[1]!)
    expect(ground).toContain('Strata, unit weights and pore pressure')
    for (const label of ['γ and γsat', 'Pore pressure u', 'water table 1.60 m', 'hydrostatic', 'piezometric control point', 'Desiccated crust']) expect(ground).toContain(label)
    expect(flat(text[2]!)).toContain('Stress history, whole depth')
    expect(flat(text[4]!)).toContain('CRUST — Desiccated crust')
    expect(flat(text[4]!)).toContain('10 fitted, 1 left out by the engineer, 1 excluded by reviewer flags')
    const tables = flat(text[8]!)
    const est = data.definition.strata[2]!.trend!
    expect(tables).toContain(`POP ${est.parameters.pop!.toFixed(1)} kPa`)
    expect(tables).toContain(`${est.r2!.toFixed(3)}`)
    expect(tables).toContain(`${est.aicc!.toFixed(1)}`)
    expect(tables).toContain('Exclude from fits')
    expect(tables).toContain('Cone drift after the rod change')
    expect(tables).toContain('strata[1].thickness')
    for (const page of text) {
      expect(flat(page)).toContain(RESULT_CAUTION.slice(0, 60))
      expect(page).not.toContain('NOT APPROVED')
    }
    pdfPageToPng(pdf, 'report-model-version-p1', 1)
    pdfPageToPng(pdf, 'report-model-version-p2', 2)
    pdfPageToPng(pdf, 'report-model-version-p3', 3)
    pdfPageToPng(pdf, 'report-model-version-p5', 5)
    pdfPageToPng(pdf, 'report-model-version-p9', 9)
  }, 60_000)

  it('bands every page of a version not approved and says where it stands', async () => {
    const { pdf } = await renderReport(modelVersionDocument(reportData({ version: { ...reportData().version, status: 'submitted' }, approval: null, previousApproved: null, flags: [] })))
    const raw = pdfPagesText(pdf, 'raw')
    for (const page of raw) expect(flat(page)).toContain(NOT_APPROVED_BAND)
    const cover = flat(pdfPagesText(pdf)[0]!)
    expect(cover).toContain('Not approved. This version is submitted (sent for review by Demo Designer, 20 Nov 2026)')
    const last = flat(raw[raw.length - 1]!)
    expect(last).toContain('No earlier version of this model was approved.')
    expect(last).toContain('None.')
  }, 60_000)

  it('writes US customary values converted at the edge', async () => {
    const data = reportData({ project: { ...reportData().project, units: 'US' } })
    const { pdf } = await renderReport(modelVersionDocument(data))
    const cover = flat(pdfPagesText(pdf)[0]!)
    // 1.6 m = 5.25 ft (1 ft = 0.3048 m exactly, NIST SP 811).
    expect(cover).toContain('Water table at 5.25 ft')
    expect(cover).toContain('US customary units')
  }, 60_000)

  it('words trend parameters in the project units', () => {
    // 25 kPa = 522.1 psf (1 psf = 0.04788026 kPa, NIST SP 811).
    expect(trendParameterText('pop', 25, 'US')).toBe('522.1 psf')
    // 25 kPa = 0.26 tsf (1 tsf = 2000 psf = 95.76052 kPa).
    expect(trendParameterText('pop', 25, 'US', { usStress: 'tsf' })).toBe('0.26 tsf')
    expect(trendParameterText('gradient', -52.27, 'SI')).toBe('-52.27 kPa/m')
    expect(trendParameterText('ocr', 1.5, 'SI')).toBe('1.500')
    expect(reportDate('2026-11-21T23:30:00.000Z')).toBe('21 Nov 2026')
  })
})
