import { describe, expect, it } from 'vitest'
import { withoutCurves } from '../../shared/settlement-run/view'
import type { RunPointResult, RunTimeCurve, SettlementRun } from '../../shared/types/settlement-runs'

const curve: RunTimeCurve = { years: [0.1, 1, 10], total: [0.01, 0.05, 0.12], primary: [0.01, 0.05, 0.11], secondary: [0, 0, 0.01], layers: [] }
function point(label: string, settlement: number): RunPointResult {
  return { label, x: 12, y: 30, settlement, layers: [{ name: 'Soft clay', settlement }], t50: 1.2, t90: 6.5, time: [{ years: 1, settlement: settlement / 2, degree: 0.5 }], secondary: 0.01, curve, convergence: null, surfaceStressIncrease: 48, warnings: [] }
}
function run(results: SettlementRun['results']): SettlementRun {
  return {
    id: 'r1', name: 'Yard fill, stage 1', status: results ? 'finished' : 'running', progress: results ? 1 : 0.4, error: null,
    model: { modelId: 'm1', modelName: 'Terminal platform', version: 2, status: 'approved', approvedBy: 'A', approvedAt: null },
    loads: [], points: [], grid: null, options: { maxSublayerThickness: 0.25, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 },
    createdBy: null, createdAt: '2026-11-30T08:00:00.000Z', startedAt: null, finishedAt: null, results,
  }
}

describe('withoutCurves', () => {
  const full = run({ points: [point('C1', 0.31), point('C2', 0.18)], maximum: { settlement: 0.31, x: 12, y: 30, label: 'C1' }, warnings: ['one'], caution: 'Check it.', stats: { computeMs: 40, sublayers: 220 } })

  it('leaves out every point\'s time curves and keeps the rest of each point', () => {
    const view = withoutCurves(full)
    expect(view.results!.points).toHaveLength(2)
    for (const [i, p] of view.results!.points.entries()) {
      expect('curve' in p).toBe(false)
      const { curve: _c, ...rest } = full.results!.points[i]!
      expect(p).toEqual(rest)
    }
    expect(view.results!.maximum).toEqual({ settlement: 0.31, x: 12, y: 30, label: 'C1' })
    expect(view.results!.warnings).toEqual(['one'])
    expect(view.name).toBe('Yard fill, stage 1')
  })

  it('does not change the run it is given', () => {
    withoutCurves(full)
    expect(full.results!.points[0]!.curve).toEqual(curve)
  })

  it('passes a run without results as it is', () => {
    const view = withoutCurves(run(null))
    expect(view.results).toBeNull()
    expect(view.progress).toBe(0.4)
  })
})
