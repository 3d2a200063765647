// The ground tracks of the model canvas and the site-model report: unit weights per stratum and the pore-pressure
// profile against the hydrostatic line, checked at known depths of the invented demo ground model
// (tests/helpers/scenario-definition.ts). u = γw (z − zw) below the water table is hydrostatic pressure
// (common practice); between piezometric control points the model's u is linear (the engine's rule).
import * as d3 from 'd3'
import { describe, expect, it } from 'vitest'
import { computeStressProfile } from '#shared/geotech/stress'
import { groundDrawing, poreTrackScene, unitWeightTrackScene } from '#shared/plots/model-ground'
import { toStressInput } from '#shared/site-model/convert'
import { scenarioDefinition } from '../../helpers/scenario-definition'

const def = scenarioDefinition()
const profile = computeStressProfile({ ...toStressInput(def) }).points.map(p => ({ depth: p.depth, layer: p.layer, totalStress: p.totalStress, porePressure: p.porePressure, effectiveStress: p.effectiveStress }))
// The demo model is 30 m deep (1.2 + 2.2 + 11.6 + 6.5 + 8.5 m); 20 px per metre below a 44 px head.
const y = d3.scaleLinear().domain([0, 30]).range([44, 644])

/** The vertices of an SVG path made of M/L commands. */
function vertices(d: string): { x: number, y: number }[] {
  return [...d.matchAll(/[ML]([-\d.e]+),([-\d.e]+)/g)].map(m => ({ x: Number(m[1]), y: Number(m[2]) }))
}

describe('unit-weight track', () => {
  const scene = unitWeightTrackScene({ definition: def, width: 200 })

  it('spans 14–21 kN/m³ widened to the strata\'s values: 16 to 20.5 gives 13 to 22', () => {
    expect(scene.scale.domain()).toEqual([13, 22])
    expect(scene.scale.range()).toEqual([4, 196])
  })

  it('draws γ where a stratum is above the water table (1.6 m) and γsat where it is below', () => {
    const seg = (band: number, key: 'unitWeight' | 'unitWeightSaturated') => scene.segments.find(s => s.band === band && s.key === key)!
    expect(scene.segments).toHaveLength(10)
    // Made ground 0–1.2 m lies wholly above the water table: γ 19 applies, γsat 20 nowhere.
    expect(seg(0, 'unitWeight')).toMatchObject({ value: 19, top: 0, bottom: 1.2, active: { top: 0, bottom: 1.2 } })
    expect(seg(0, 'unitWeightSaturated')).toMatchObject({ value: 20, active: null })
    // The crust 1.2–3.4 m is cut by it: γ 18 to 1.6 m, γsat 18.5 below.
    expect(seg(1, 'unitWeight').active).toEqual({ top: 1.2, bottom: 1.6 })
    expect(seg(1, 'unitWeightSaturated')).toMatchObject({ value: 18.5, active: { top: 1.6 } })
    expect(seg(1, 'unitWeightSaturated').active!.bottom).toBeCloseTo(3.4, 9)
    // The estuarine clay 3.4–15.0 m is below it: γsat 16 only.
    expect(seg(2, 'unitWeight').active).toBeNull()
    expect(seg(2, 'unitWeightSaturated').value).toBe(16)
    expect(seg(2, 'unitWeightSaturated').active!.top).toBeCloseTo(3.4, 9)
    expect(seg(2, 'unitWeightSaturated').bottom).toBeCloseTo(15, 9)
    // 16 kN/m³ on 13–22 over 4–196 px: 4 + 192 × 3/9 = 68 px.
    expect(scene.scale(16)).toBeCloseTo(68, 9)
  })

  it('widens for logged unit weights outside the strata\'s values', () => {
    expect(unitWeightTrackScene({ definition: def, width: 200, logged: [12.2, 23.4] }).scale.domain()).toEqual([11, 24])
  })
})

describe('pore-pressure track', () => {
  const scene = poreTrackScene({ definition: def, profile, y, width: 300 })
  const uAt = (depth: number) => {
    const v = vertices(scene.pore).find(p => Math.abs(p.y - y(depth)) < 1e-6)
    if (!v) throw new Error(`no vertex at ${depth} m`)
    return scene.scale.invert(v.x)
  }

  it('follows the model\'s u: 0 above the water table, hydrostatic to 12 m, linear between the control points', () => {
    expect(uAt(1.2)).toBeCloseTo(0, 6)
    expect(uAt(1.6)).toBeCloseTo(0, 6)
    // 9.81 × (3.4 − 1.6) = 17.658 kPa; 9.81 × (12 − 1.6) = 102.024 kPa (the first control point).
    expect(uAt(3.4)).toBeCloseTo(17.658, 2)
    expect(uAt(12)).toBeCloseTo(102.024, 2)
    // 15 m, 3/9.5 of the way from 102.024 to 9.81 × (21.5 − 4.5) = 166.77 kPa: 122.47 kPa (below hydrostatic 131.45).
    expect(uAt(15)).toBeCloseTo(122.47, 1)
    expect(uAt(21.5)).toBeCloseTo(166.77, 2)
  })

  it('draws the hydrostatic line from the water table to the base: 9.81 × (30 − 1.6) = 278.6 kPa at 30 m', () => {
    expect(scene.scale.domain()).toEqual([0, 300])
    expect(scene.scale.invert(scene.hydrostatic.x1)).toBeCloseTo(0, 9)
    expect(scene.hydrostatic.y1).toBeCloseTo(y(1.6), 9)
    expect(scene.scale.invert(scene.hydrostatic.x2)).toBeCloseTo(278.604, 6)
    expect(scene.hydrostatic.y2).toBeCloseTo(y(30), 9)
    expect(scene.waterTable).toEqual({ y: y(1.6), depth: 1.6 })
    expect(scene.piezometers.map(p => [p.depth, Math.round(scene.scale.invert(p.x) * 1000) / 1000])).toEqual([[12, 102.024], [21.5, 166.77]])
  })
})

describe('the report\'s ground drawing', () => {
  it('puts the strata, the γ track and the u track side by side over the whole model, with a key', () => {
    const g = groundDrawing({ definition: def, profile, units: 'SI', width: 720, height: 760 })
    expect(g.y.domain()).toEqual([0, 30])
    expect(g.frames.strata.x).toBeLessThan(g.frames.unitWeight.x)
    expect(g.frames.unitWeight.x + g.frames.unitWeight.width).toBeLessThan(g.frames.pore.x)
    expect(g.frames.pore.x + g.frames.pore.width).toBeLessThanOrEqual(720)
    for (const text of ['Strata', 'γ and γsat', 'Pore pressure u', 'water table 1.60 m', 'Estuarine clay', 'hydrostatic', 'piezometric control point']) expect(g.svg).toContain(text)
    expect(g.svg.match(/<circle [^>]*r="4"/g)).toHaveLength(3)
  })

  it('labels in US units when the project uses them', () => {
    const g = groundDrawing({ definition: def, profile, units: 'US', width: 720, height: 760 })
    expect(g.svg).toContain('water table 5.25 ft')
    expect(g.svg).toContain('(pcf)')
  })
})
