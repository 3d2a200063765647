import * as d3 from 'd3'
import { describe, expect, it } from 'vitest'
import { modelDrawing } from '#shared/plots/model-drawing'
import { frameScene, ocrAxis, pointMarksSvg, popAxis, ratioTrackScene, stressAxis, stressTrackScene } from '#shared/plots/model-tracks'
import { sampleTrend } from '#shared/plots/stress-history'
import { reportData } from '../reports/model-version-fixture'

const profile = [
  { depth: 0, layer: 'A', totalStress: 0, porePressure: 0, effectiveStress: 0 },
  { depth: 10, layer: 'A', totalStress: 180, porePressure: 80, effectiveStress: 100 },
]
const y = d3.scaleLinear().domain([0, 10]).range([44, 604])

describe('stress-history track geometry', () => {
  it('scales σ\'p: a point at 120 kPa lands where the stress axis puts it', () => {
    // σv at the base 180 kPa × 1.1 = 198 → nice(5) gives 0–200 kPa over 400 px: 2 px per kPa.
    const scale = stressAxis({ profile, preconsolidation: [{ depth: 5, preconsolidation: 120 }], base: 10, width: 400 })
    expect(scale.domain()).toEqual([0, 200])
    expect(scale(120)).toBe(240)
    const svg = pointMarksSvg([{ x: scale(120), y: y(5), source: 'oedometer', qualityClass: null, state: 'included', verdict: null }], 100)
    // Track at x = 100, depth 5 m at 44 + 280 = 324 px: the 8 px square about (340, 324).
    expect(svg).toContain('d="M336,320H344V328H336Z"')
  })

  it('lets the bulk of the σ\'p points widen the stress axis, or a chosen maximum set it', () => {
    const pts = [100, 200, 300, 400, 500].map((p, i) => ({ depth: i + 1, preconsolidation: p }))
    // 80 % quantile of 100…500 = 420 kPa; × 1.15 = 483 → nice(5) 500.
    expect(stressAxis({ profile, preconsolidation: pts, base: 10, width: 400 }).domain()).toEqual([0, 500])
    expect(stressAxis({ profile, preconsolidation: pts, base: 10, width: 400, max: 1000 }).domain()).toEqual([0, 1000])
  })

  it('draws σv, u and σ\'v0 through the profile and a trend with its band within its stratum', () => {
    const scale = d3.scaleLinear().domain([0, 200]).range([0, 400])
    const scene = stressTrackScene({
      width: 400, band: { top: 44, bottom: 604 }, y, scale, profile, bounds: [{ top: 0, bottom: 10 }],
      trends: [{ band: 0, samples: [{ depth: 2, effectiveStress: 20, preconsolidation: 50, ocr: 2.5, pop: 30 }, { depth: 8, effectiveStress: 80, preconsolidation: 110, ocr: 1.375, pop: 30 }], fitBand: [{ depth: 2, fitted: 50, lower: 40, upper: 60 }, { depth: 12, fitted: 120, lower: 100, upper: 140 }], bounds: { top: 0, bottom: 10 }, manual: false }],
    })
    // σ'v0: 0 kPa at 0 m → (0,44); 100 kPa at 10 m → (200,604).
    expect(scene.effective).toBe('M0,44L200,604')
    expect(scene.total).toBe('M0,44L360,604')
    expect(scene.trends[0]!.line).toBe('M100,156L220,492')
    // Upper edge down, lower edge back; the band point at 12 m lies below the stratum and is left out.
    expect(scene.trends[0]!.area).toBe('M120,156L80,156Z')
    expect(scene.breaks).toEqual([604])
  })

  it('places OCR and POP of a trend and their reference lines', () => {
    const def = reportData().definition
    const p = reportData().profile
    const lines = def.strata.map((_s, i) => ({ band: i, samples: sampleTrend(def, i, p) })).filter(l => l.samples.length)
    const ocr = ocrAxis(lines, 92)
    const pop = popAxis(lines, 100)
    const o = ratioTrackScene({ kind: 'ocr', y, scale: ocr, lines })
    expect(o.reference).toBeCloseTo(ocr(1), 9)
    const q = ratioTrackScene({ kind: 'pop', y, scale: pop, lines })
    expect(q.reference).toBeCloseTo(pop(0), 9)
    expect(q.paths.length).toBe(lines.length)
  })

  it('ticks the axes at round display values (kPa, or psf in US units)', () => {
    const scale = d3.scaleLinear().domain([0, 200]).range([0, 400])
    const si = frameScene({ width: 400, band: { top: 44, bottom: 604 }, y, lengthFactor: 1, scale, factor: 1, ticks: 5 })
    expect(si.xTicks.map(t => t.label)).toEqual(['0', '50', '100', '150', '200'])
    expect(si.depthGrid[1]).toEqual({ at: 100, label: '1' })
    // 200 kPa = 4177 psf: ticks at 0, 1000, …, 4000 psf; 1000 psf = 47.88 kPa → 95.76 px.
    const us = frameScene({ width: 400, band: { top: 44, bottom: 604 }, y, lengthFactor: 1 / 0.3048, scale, factor: 1 / 0.04788026, ticks: 5 })
    expect(us.xTicks[1]!.label).toBe('1,000')
    expect(us.xTicks[1]!.at).toBeCloseTo(95.76, 2)
  })

  it('draws a stratum\'s page with only its depth range on the depth axis', () => {
    const d = reportData()
    const drawing = modelDrawing({ definition: d.definition, profile: d.profile, points: d.points, fitBands: d.fitBands, units: 'SI', range: { top: 3.4, bottom: 15 } })
    expect(drawing.y.domain()).toEqual([3.4, 15])
    expect(drawing.y(3.4)).toBe(drawing.band.top)
    expect(drawing.svg.startsWith('<svg')).toBe(true)
    expect(drawing.svg).toContain('font-family="SourceSans3"')
  })
})
