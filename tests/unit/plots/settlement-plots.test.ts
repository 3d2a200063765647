// The settlement plot builders the run page and the PDF report share.
import { describe, expect, it } from 'vitest'
import { settlementPlanSvg } from '../../../shared/plots/settlement-contours'
import { settlementDepthScene, settlementDepthSvg } from '../../../shared/plots/settlement-depth'
import { settlementTimeScene, settlementTimeSvg } from '../../../shared/plots/settlement-time'
import { computeRun } from '../../../shared/settlement-run/compute'
import { scenarioDefinition } from '../../helpers/scenario-definition'

const out = computeRun({
  definition: scenarioDefinition(),
  loads: [{ type: 'rectangle', label: 'Slab <A>', x: 0, y: 0, width: 20, length: 10, rotation: 0, pressure: 80 }],
  points: [{ label: 'C', x: 0, y: 0 }],
  grid: { spacing: 5, margin: 5 },
  options: { maxSublayerThickness: 0.5, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 },
})
const point = out.results.points[0]!

describe('settlement plot builders', () => {
  it('time: log ticks at the decades, settlement down, t50 and t90 marked, one line per stratum', () => {
    const s = settlementTimeScene({ series: [{ name: 'r', point }], years: [1, 10], unitSystem: 'SI', width: 500 })
    expect(s.xTicks.map(t => t.label)).toContain('1')
    expect(s.yTicks[0]!.label).toBe('0')
    expect(s.yTicks[0]!.at).toBe(s.margin.top)
    expect(s.marks.map(m => m.label)).toEqual(['t50', 't90'])
    expect(s.lines.filter(l => l.label.endsWith(', primary')).map(l => l.label.replace(', primary', ''))).toEqual(point.curve!.layers.map(l => l.name))
    expect(s.yLabel).toBe('Settlement (mm)')
    expect(settlementTimeScene({ series: [{ name: 'r', point }], years: [1], unitSystem: 'US', width: 500 }).yLabel).toBe('Settlement (in)')
    expect(settlementTimeSvg(s, { legend: true })).toMatch(/^<svg [^>]*>.*<\/svg>$/)
  })

  it('depth: depth increases downward, strata named once each, US labels in ft and psf', () => {
    const rows = out.details[0]!.sublayers
    const s = settlementDepthScene({ sublayers: rows, unitSystem: 'US', width: 400, height: 400 })
    expect(s.xLabel).toBe('Stress (psf)')
    expect(s.yLabel).toBe('Depth (ft)')
    const ys = s.yTicks.map(t => t.at)
    expect([...ys].sort((a, b) => a - b)).toEqual(ys)
    expect(new Set(s.strata.map(x => x.name)).size).toBe(s.strata.length)
    expect(s.lines).toHaveLength(5)
    // Zoom: a smaller depth domain spreads the same rows over the plot.
    const z = settlementDepthScene({ sublayers: rows, unitSystem: 'SI', width: 400, height: 400, depthDomain: [0, 5] })
    expect(z.strata[0]!.yBottom).toBeGreaterThan(settlementDepthScene({ sublayers: rows, unitSystem: 'SI', width: 400, height: 400 }).strata[0]!.yBottom)
    expect(settlementDepthSvg(s)).toContain('clip-path="url(#depth-clip)"')
  })

  it('plan: bands, the load outline and the named point; text is escaped', () => {
    const svg = settlementPlanSvg({ grid: out.results.grid ?? null, loads: [{ type: 'rectangle', label: 'Slab <A>', x: 0, y: 0, width: 20, length: 10, rotation: 0, pressure: 80 }], points: [point], maximum: null, unitSystem: 'SI', width: 500, height: 360 })
    expect(svg).toContain('Slab &lt;A&gt;')
    expect(svg).not.toContain('<A>')
    expect((svg.match(/fill-opacity="0.82"/g) ?? []).length).toBeGreaterThan(2)
    expect(svg).toContain('Easting (m)')
  })
})
