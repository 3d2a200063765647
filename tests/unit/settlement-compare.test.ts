import { describe, expect, it } from 'vitest'
import { describeLoad, headlineDifferences, inputDifferences, longestT90, matchPoints } from '../../shared/settlement-run/compare'
import type { RunPointResult, RunResults, SettlementRun } from '../../shared/types/settlement-runs'

function point(label: string, settlement: number, t90: number | null, secondary: number | null = null): RunPointResult {
  return { label, x: 0, y: 0, settlement, layers: [], t50: null, t90, time: [], secondary, curve: null, convergence: null, surfaceStressIncrease: 0, warnings: [] }
}
function results(points: RunPointResult[], max: number, grid?: { diff: number, ad: number }): RunResults {
  return {
    points,
    grid: grid ? { xs: [0, 1], ys: [0, 1], settlement: [[0, 0], [0, 0]], maxDifferential: grid.diff, maxAngularDistortion: grid.ad, worstDifferential: null, worstAngularDistortion: null, angularDistortionLimit: 1 / 500, exceedsLimit: false } : undefined,
    maximum: { settlement: max, x: 0, y: 0, label: null },
    warnings: [],
    caution: '',
    stats: { computeMs: 1, sublayers: 1 },
  }
}
type Inputs = Pick<SettlementRun, 'model' | 'loads' | 'points' | 'grid' | 'options'>
function inputs(over: Partial<Inputs> = {}): Inputs {
  return {
    model: { modelId: 'm1', modelName: 'Yard model', version: 1, status: 'approved', approvedBy: 'A', approvedAt: null },
    loads: [{ type: 'rectangle', x: 10, y: 20, width: 30, length: 40, rotation: 0, pressure: 50 }],
    points: [{ label: 'C', x: 10, y: 20 }],
    grid: { spacing: 5, margin: 10 },
    options: { maxSublayerThickness: 0.25, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 },
    ...over,
  }
}

describe('inputDifferences', () => {
  it('finds nothing between a run and itself', () => {
    expect(inputDifferences(inputs(), inputs())).toEqual([])
  })

  it('names the version, a changed load, an added load, the grid and an option', () => {
    const b = inputs({
      model: { modelId: 'm1', modelName: 'Yard model', version: 2, status: 'submitted', approvedBy: null, approvedAt: null },
      loads: [
        { type: 'rectangle', x: 10, y: 20, width: 30, length: 40, rotation: 0, pressure: 60 },
        { type: 'circle', label: 'Tank', x: 0, y: 0, radius: 8, fill: { thickness: 2, unitWeight: 19 } },
      ],
      grid: null,
      options: { maxSublayerThickness: 0.25, years: [1, 10], designLife: 100, angularDistortionLimit: 1 / 500 },
    })
    const d = inputDifferences(inputs(), b)
    expect(d.map(x => x.what)).toEqual(['Model version', 'Load 1', 'Load 2 (Tank)', 'Grid', 'Design life'])
    expect(d[0]).toEqual({ what: 'Model version', a: 'Yard model v1 (approved)', b: 'Yard model v2 (not approved)' })
    expect(d[1]!.a).toContain('50 kPa')
    expect(d[1]!.b).toContain('60 kPa')
    expect(d[2]).toEqual({ what: 'Load 2 (Tank)', a: '—', b: 'circle r 8 m at (0, 0), fill 2 m × 19 kN/m³' })
    expect(d[3]).toEqual({ what: 'Grid', a: 'every 5 m, 10 m beyond the loads', b: 'none' })
    expect(d[4]).toEqual({ what: 'Design life', a: '50 years', b: '100 years' })
  })

  it('reads a limit as 1/n', () => {
    const d = inputDifferences(inputs(), inputs({ options: { maxSublayerThickness: 0.25, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 300 } }))
    expect(d).toEqual([{ what: 'Angular distortion limit', a: '1/500', b: '1/300' }])
  })
})

describe('describeLoad', () => {
  it('writes an embankment with its height, slope and rotation', () => {
    expect(describeLoad({ type: 'embankment', x: 5, y: 6, crestWidth: 20, crestLength: 60, height: 3, sideSlope: 2, unitWeight: 19.5, rotation: 15 }))
      .toBe('embankment crest 20 × 60 m at (5, 6), 3 m high, slope 2:1, 19.5 kN/m³, 15°')
    expect(describeLoad({ type: 'uniform', pressure: 25 })).toBe('uniform, 25 kPa')
  })
})

describe('headlineDifferences', () => {
  it('gives b − a for each figure and null where a run has none', () => {
    const a = results([point('C', 0.2, 3.5, 0.01), point('E', 0.1, 1.2)], 0.21, { diff: 0.02, ad: 1 / 800 })
    const b = results([point('C', 0.25, 4.0, 0.02)], 0.26)
    const h = headlineDifferences(a, b)
    const by = Object.fromEntries(h.map(f => [f.key, f]))
    expect(by.maxSettlement!.difference).toBeCloseTo(0.05, 12)
    expect(by.t90!).toEqual({ key: 't90', a: 3.5, b: 4.0, difference: 0.5 })
    expect(by.secondary!.difference).toBeCloseTo(0.01, 12)
    expect(by.maxDifferential!).toEqual({ key: 'maxDifferential', a: 0.02, b: null, difference: null })
    expect(by.maxAngularDistortion!.difference).toBeNull()
  })

  it('has no figures for a run that did not finish', () => {
    const h = headlineDifferences(null, results([point('C', 0.2, 1)], 0.2))
    expect(h.every(f => f.a === null && f.difference === null)).toBe(true)
  })
})

describe('longestT90 and matchPoints', () => {
  it('takes the longest t90 and skips points without one', () => {
    expect(longestT90(results([point('A', 0.1, null), point('B', 0.1, 2.5), point('C', 0.1, 7)], 0.1))).toBe(7)
    expect(longestT90(results([point('A', 0.1, null)], 0.1))).toBeNull()
  })

  it('matches points by label, trimmed and case-blind, keeping each side\'s own', () => {
    const a = results([point('C1', 0.2, null), point('Edge', 0.1, null)], 0.2)
    const b = results([point('edge ', 0.15, null), point('Tank', 0.3, null)], 0.3)
    const m = matchPoints(a, b)
    expect(m.map(p => p.label)).toEqual(['C1', 'Edge', 'Tank'])
    expect(m[0]).toEqual({ label: 'C1', a: 0.2, b: null, difference: null })
    expect(m[1]!.difference).toBeCloseTo(0.05, 12)
    expect(m[2]).toEqual({ label: 'Tank', a: null, b: 0.3, difference: null })
  })
})

// A US project reads the inputs in ft, psf or tsf and pcf (1 ft = 0.3048 m, 1 psf = 0.047880 kPa,
// 1 tsf = 2000 psf, 1 pcf = 0.157087 kN/m³: NIST SP 811, 2008, App. B.8).
describe('input words in US units', () => {
  it('writes a load in ft and psf, or tsf when the project chose it', () => {
    expect(describeLoad({ type: 'circle', x: 3.048, y: 0, radius: 6.096, pressure: 47.880259 }, { system: 'US' })).toBe('circle r 20 ft at (10, 0), 1000 psf')
    expect(describeLoad({ type: 'uniform', pressure: 95.760518 }, { system: 'US', usStress: 'tsf' })).toBe('uniform, 1 tsf')
    expect(describeLoad({ type: 'uniform', fill: { thickness: 3.048, unitWeight: 18.850 } }, { system: 'US' })).toBe('uniform, fill 10 ft × 120 pcf')
  })

  it('words the grid and the sublayer option in feet', () => {
    const b = inputs({ grid: { spacing: 3.048, margin: 6.096 }, options: { maxSublayerThickness: 0.3048, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 } })
    const d = inputDifferences(inputs(), b, { system: 'US' })
    expect(d.find(x => x.what === 'Grid')?.b).toBe('every 10 ft, 20 ft beyond the loads')
    expect(d.find(x => x.what === 'Largest sublayer')?.b).toBe('1 ft')
  })
})
