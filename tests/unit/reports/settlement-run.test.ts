// The settlement-run report's document: built from a run computed on the demo ground model, read back as a PDF.
import { describe, expect, it } from 'vitest'
import type { Content } from 'pdfmake/interfaces'
import { RESULT_CAUTION } from '../../../shared/caution'
import { runModelLine, settlementRunReport, type SettlementRunReportInput } from '../../../shared/reports/settlement-run'
import { NOT_APPROVED_BAND } from '../../../shared/reports/sheet'
import type { RunOptions } from '../../../shared/schemas/settlement-runs'
import { computeRun } from '../../../shared/settlement-run/compute'
import type { ServerSettlementRun } from '../../../shared/types/settlement-runs'
import { renderReport } from '../../../server/services/reports/render'
import { pdfPagesText, pdfPageToPng } from '../../helpers/pdf'
import { scenarioDefinition } from '../../helpers/scenario-definition'

const OPTIONS: RunOptions = { maxSublayerThickness: 0.5, years: [1, 5, 50], designLife: 50, angularDistortionLimit: 1 / 500 }
const loads: ServerSettlementRun['loads'] = [{ type: 'embankment', label: 'Stockpile', x: 0, y: 0, crestWidth: 20, crestLength: 28, height: 3, sideSlope: 2, unitWeight: 20, rotation: 0 }]
const points = [{ label: 'Crest', x: 0, y: 0 }, { label: 'Toe', x: 16, y: 0 }, { label: 'Gate', x: 30, y: 10 }]
const computed = computeRun({ definition: scenarioDefinition(), loads, points, grid: { spacing: 4, margin: 8 }, options: OPTIONS })

function input(over: Partial<ServerSettlementRun['model']> = {}, units: 'SI' | 'US' = 'SI', usStressUnit: 'psf' | 'tsf' = 'psf'): SettlementRunReportInput {
  return {
    project: { name: 'Trent Wharf yard', jobNumber: 'TRN-0417', client: 'Harbour Board', unitSystem: units, usStressUnit },
    run: {
      id: '00000000-0000-4000-8000-000000000001',
      name: 'Stockpile on the yard',
      status: 'finished',
      progress: 1,
      error: null,
      model: { modelId: '00000000-0000-4000-8000-000000000002', modelName: 'Yard model', version: 1, status: 'approved', approvedBy: 'Demo Reviewer', approvedAt: new Date('2026-11-20T10:00:00Z'), ...over },
      loads,
      points,
      grid: { spacing: 4, margin: 8 },
      options: OPTIONS,
      createdBy: { id: 'u', name: 'Demo Designer' },
      createdAt: new Date('2026-12-01T09:00:00Z'),
      startedAt: new Date('2026-12-01T09:00:00Z'),
      finishedAt: new Date('2026-12-01T09:00:02Z'),
      results: computed.results,
    },
    details: computed.details,
    issue: null,
  }
}

/** Every text leaf of a content tree. */
function texts(c: unknown): string[] {
  if (typeof c === 'string') return [c]
  if (Array.isArray(c)) return c.flatMap(texts)
  if (c && typeof c === 'object') return Object.entries(c).filter(([k]) => k !== 'svg').flatMap(([, v]) => texts(v))
  return []
}
const svgs = (c: unknown): string[] => {
  if (Array.isArray(c)) return c.flatMap(svgs)
  if (c && typeof c === 'object') {
    const o = c as Record<string, unknown>
    return [...(typeof o.svg === 'string' ? [o.svg] : []), ...Object.values(o).flatMap(svgs)]
  }
  return []
}

describe('settlement-run report document', () => {
  it('gives every named point its sublayer table with a row per sublayer, and its two plots', () => {
    const doc = settlementRunReport(input())
    const all = texts(doc.content)
    for (const p of points) {
      expect(all).toContain(`Named point ${p.label}`)
      expect(all).toContain(`Sublayers at ${p.label}`)
    }
    // 1 plan + 2 plots per point.
    expect(svgs(doc.content)).toHaveLength(1 + 2 * points.length)
    const tables = (doc.content as Content[]).filter((c): c is Content & { table: { body: unknown[][] } } => typeof c === 'object' && c !== null && 'table' in c)
    const sublayerTables = tables.filter(t => texts(t.table.body[0]).includes('Case'))
    expect(sublayerTables.map(t => t.table.body.length - 2)).toEqual(computed.details.map(d => d.sublayers.length))
  })

  it('is not banded for a run on an approved version and says who approved it', () => {
    const doc = settlementRunReport(input())
    expect(doc.watermark).toBeUndefined()
    expect(runModelLine(input().run)).toBe('Yard model, version 1 — approved by Demo Reviewer on 2026-11-20')
  })

  it('carries the not-approved band when the run\'s version was not approved', () => {
    const doc = settlementRunReport(input({ status: 'submitted', approvedBy: null, approvedAt: null }))
    expect(doc.watermark).toMatchObject({ text: NOT_APPROVED_BAND })
    expect(texts(doc.content).join(' ')).toContain('Yard model, version 1 — submitted, not approved')
  })

  it('shows US customary units in a US project (ft, psf, in)', () => {
    const all = texts(settlementRunReport(input({}, 'US')).content).join(' ')
    expect(all).toContain('E (ft)')
    expect(all).toContain('Settlement (in)')
    expect(all).toContain('σ\'v0 (psf)')
    expect(all).not.toContain('(kPa)')
    expect(all).not.toContain('(mm)')
  })

  it('shows stresses in tsf when the US project chose tsf', () => {
    const doc = settlementRunReport(input({}, 'US', 'tsf'))
    const all = texts(doc.content).join(' ')
    expect(all).toContain('σ\'v0 (tsf)')
    expect(all).not.toContain('(psf)')
    expect(all).not.toContain('(kPa)')
    // The stresses-with-depth drawing is labelled in tsf too.
    expect(JSON.stringify(doc.content)).toContain('Stress (tsf)')
  })

  it('renders: job number, the version and its approval, the settlement of each point, the caution; page 1 as PNG', { timeout: 60_000 }, async () => {
    const { pdf, pages } = await renderReport(settlementRunReport(input()))
    expect(pages).toBeGreaterThanOrEqual(2 + points.length)
    const text = pdfPagesText(pdf).join('\n')
    const flat = text.replace(/\s+/g, ' ')
    expect(text).toContain('TRN-0417')
    expect(flat).toContain('Yard model, version 1 — approved by Demo Reviewer on 2026-11-20')
    for (const p of computed.results.points) expect(flat).toContain(`${p.label} `)
    const crest = computed.results.points[0]!
    expect(flat).toContain((crest.settlement * 1000).toFixed(1))
    expect(flat).toContain(RESULT_CAUTION.slice(0, 60))
    pdfPageToPng(pdf, 'report-settlement-run-unit-p1')
    pdfPageToPng(pdf, 'report-settlement-run-unit-p3', 3)
  })

  it('keeps a long job number on one line in the header', { timeout: 60_000 }, async () => {
    const inp = input()
    const { pdf } = await renderReport(settlementRunReport({ ...inp, project: { ...inp.project, jobNumber: 'RPR-mx731l1w1-LONG' } }))
    for (const page of pdfPagesText(pdf)) expect(page).toContain('RPR-mx731l1w1-LONG')
  })
})

describe('settlement-run report of a treated run', () => {
  it('shows the construction schedule, the drain design and each point\'s t90 without drains, rebound and what is still to come', () => {
    const treatedLoads: ServerSettlementRun['loads'] = [
      { ...loads[0]!, stages: [{ start: 0, duration: 0.1, fraction: 0.5 }, { start: 0.25, duration: 0.1, fraction: 0.5 }] },
      { type: 'embankment', label: 'Surcharge', x: 0, y: 0, crestWidth: 20, crestLength: 28, height: 1.5, sideSlope: 2, unitWeight: 20, rotation: 0, stages: [{ start: 0.35, duration: 0, fraction: 1 }], removeAt: 0.75 },
    ]
    const options: RunOptions = { ...OPTIONS, drains: { strata: ['EST'], pattern: 'triangular', spacing: 1.5, diameter: 0.052, smearRatio: 3, permeabilityRatio: 3, chRatio: 1 } }
    const out = computeRun({ definition: scenarioDefinition(), loads: treatedLoads, points: points.slice(0, 1), grid: null, options })
    const base = input()
    const doc = settlementRunReport({ ...base, run: { ...base.run, loads: treatedLoads, points: points.slice(0, 1), grid: null, options, results: out.results }, details: out.details })
    const all = texts(doc.content)
    expect(all).toContain('Construction schedule')
    expect(all).toContain('Vertical drains')
    expect(all).toContain('Surcharge')
    expect(all).toContain('t90 without drains')
    expect(all.some(t => t.startsWith('triangular, 1.50 m; influence diameter 1.58 m'))).toBe(true)
    const tables = (doc.content as Content[]).filter((c): c is Content & { table: { body: unknown[][] } } => typeof c === 'object' && c !== null && 'table' in c)
    const schedule = tables.find(t => texts(t.table.body[0]).includes('Share of the load'))!
    // Two stages of the embankment and the surcharge's one.
    expect(schedule.table.body).toHaveLength(1 + 3)
  })
})
