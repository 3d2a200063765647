// checkRunInput: a well-formed run the site cannot take is refused in plain words (422 at the route).
import { describe, expect, it } from 'vitest'
import type { RunLoad, RunOptions } from '../../shared/schemas/settlement-runs'
import { checkRunInput, computeRun, type RunComputeInput } from '../../shared/settlement-run/compute'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { scenarioDefinition } from '../helpers/scenario-definition'

const OPTIONS: RunOptions = { maxSublayerThickness: 0.25, years: [1, 10], designLife: 50, angularDistortionLimit: 1 / 500 }
const fill: RunLoad = { type: 'rectangle', x: 0, y: 0, width: 20, length: 30, rotation: 0, pressure: 60 }

function input(def: SiteModelDefinition = scenarioDefinition(), extra: Partial<RunComputeInput> = {}): RunComputeInput {
  return { definition: def, loads: [fill], points: [{ label: 'C', x: 0, y: 0 }], grid: null, options: OPTIONS, version: 3, ...extra }
}

function withStratum(code: string, change: (s: SiteModelDefinition['strata'][number]) => void): SiteModelDefinition {
  const def = scenarioDefinition()
  change(def.strata.find(s => s.code === code)!)
  return def
}

describe('checkRunInput', () => {
  it('accepts the demo ground model under a fill', () => {
    expect(checkRunInput(input())).toBeNull()
  })

  it('names the stratum and the missing parameter, and the version', () => {
    const noCc = withStratum('EST', (s) => { delete (s.compressibility as { cc?: number }).cc })
    expect(checkRunInput(input(noCc))).toEqual({ code: 'compressibility-missing', message: 'Stratum EST has no compression index (Cc) in version 3.', path: ['model'] })
    const noE0 = withStratum('GLA', (s) => { delete (s.compressibility as { e0?: number }).e0 })
    expect(checkRunInput(input(noE0))!.message).toBe('Stratum GLA has no initial void ratio (e0) in version 3.')
    const none = withStratum('CRUST', (s) => { delete s.compressibility })
    expect(checkRunInput(input(none))!.message).toBe('Stratum CRUST (Desiccated crust) is compressible but has no compressibility (Cc, Cr, e0) in version 3.')
    const noTrend = withStratum('EST', (s) => { delete s.trend })
    expect(checkRunInput(input(noTrend))!.message).toBe('Stratum EST has no σ\'p trend in version 3.')
    // A load of nothing settles nothing: the parameters are not needed.
    expect(checkRunInput(input(noCc, { loads: [{ ...fill, pressure: 0 }] }))).toBeNull()
  })

  it('names the stratum and depth where σ\'v0 ≤ 0 (uplift under an artesian pressure)', () => {
    const def = scenarioDefinition()
    // 400 kPa of water pressure at 12 m: u rises 400 / (12 − 1.6) = 38.5 kPa/m below the water table,
    // faster than the crust's 18.5 kN/m³; σ'v0 = 30 kPa at 1.6 m (1.2 × 19 + 0.4 × 18) reaches 0 at
    // 1.6 + 30 / (38.46 − 18.5) = 3.10 m, in the crust (common practice, by hand).
    def.groundwater.piezometers = [{ depth: 12, porePressure: 400 }]
    const p = checkRunInput(input(def))!
    expect(p.code).toBe('effective-stress-not-positive')
    expect(p.message).toMatch(/^σ'v0 falls to 0 kPa at \d+(\.\d+)? m in stratum CRUST \(Desiccated crust\) in version 3: /)
    const depth = Number(/at ([\d.]+) m/.exec(p.message)![1])
    expect(depth).toBeCloseTo(1.6 + 30 / (400 / 10.4 - 18.5), 2)
  })

  it('refuses loads and points off the site, grids without a footprint or too large', () => {
    expect(checkRunInput(input(undefined, { loads: [{ ...fill, x: 4995 }] }))!.code).toBe('load-off-site')
    expect(checkRunInput(input(undefined, { points: [{ label: 'far', x: 0, y: -6000 }] }))!.message).toBe('Point "far" at (0.0, -6000.0) m lies beyond ±5000 m of the site origin.')
    expect(checkRunInput(input(undefined, { loads: [{ type: 'uniform', pressure: 20 }], grid: { spacing: 5, margin: 0 } }))!.code).toBe('grid-without-footprint')
    expect(checkRunInput(input(undefined, { grid: { spacing: 0.5, margin: 100 } }))!.code).toBe('grid-too-large')
  })

  it('a run the check accepts computes', () => {
    const out = computeRun(input())
    expect(out.results.points[0]!.settlement).toBeGreaterThan(0.1)
  })
})
