import { describe, expect, it, vi } from 'vitest'
import {
  CPT_AREA_RATIO,
  CPT_FINAL_DEPTH,
  CPT_SPACING,
  DEMO_OEDOMETER_PLAN,
  generateDemoInvestigation,
  plannedOedometerSample,
} from '../../../shared/demo/generate'
import { DEMO_PROJECT } from '../../../shared/demo/scenario'
import { DEMO_STRATA, GAMMA_W, GROUNDWATER_TRUTH, SITE_PLAN, demoStratum, groundAt } from '../../../shared/demo/site'
import { POINT_KINDS, SAMPLE_TYPES, type InvestigationRecord, type PointRecord } from '../../../shared/investigation/types'
import { isStratumColourKey, isStratumPatternKey } from '../../../shared/strata/appearance'
import { isUscsGroupSymbol } from '../../../shared/strata/uscs'
import { stratumAtDepth } from './helpers'

const record = generateDemoInvestigation()

function points(kind: PointRecord['kind'], prefix: string): PointRecord[] {
  return record.points.filter(p => p.kind === kind && p.identifier.startsWith(prefix))
}

/** A digest of every number in the record, so two generations can be compared by more than their shape. */
function fingerprint(r: InvestigationRecord): { qcSum: string, stageSum: string, vaneSum: string, pressureSum: string } {
  const sum = (values: number[]): string => values.reduce((s, v) => s + v, 0).toFixed(6)
  return {
    qcSum: sum(r.points.flatMap(p => p.cpt?.qc ?? [])),
    stageSum: sum(r.points.flatMap(p => p.samples.flatMap(s => s.oedometer?.stages.map(st => st.voidRatio) ?? []))),
    vaneSum: sum(r.points.flatMap(p => p.vane.map(v => v.peak))),
    pressureSum: sum(r.points.flatMap(p => p.groundwater.map(g => g.pressure ?? 0))),
  }
}

describe('demo investigation — determinism and speed', () => {
  it('two independent generations are deep-equal and share the same fingerprint', () => {
    const a = generateDemoInvestigation()
    const b = generateDemoInvestigation()
    expect(a).toEqual(b)
    expect(fingerprint(a)).toEqual(fingerprint(b))
    expect(Number(fingerprint(a).qcSum)).toBeGreaterThan(0)
  })

  it('shares no objects between calls: editing one result leaves the next untouched', () => {
    const a = generateDemoInvestigation()
    const reference = generateDemoInvestigation()
    a.points[0]!.intervals[0]!.top = 99
    a.points.find(p => p.cpt)!.cpt!.qc[0] = -1
    a.strata[0]!.unitWeight = 0
    expect(generateDemoInvestigation()).toEqual(reference)
  })

  it('never calls Math.random (all randomness is seeded)', () => {
    const spy = vi.spyOn(Math, 'random')
    try {
      generateDemoInvestigation()
      expect(spy).not.toHaveBeenCalled()
    }
    finally {
      spy.mockRestore()
    }
  })

  it('survives a JSON round trip unchanged (no NaN, Infinity or undefined anywhere)', () => {
    expect(JSON.parse(JSON.stringify(record))).toEqual(record)
  })
})

describe('demo investigation — project, strata and counts', () => {
  it('carries the scenario project', () => {
    expect(record.project).toEqual({ jobNumber: DEMO_PROJECT.jobNumber, name: DEMO_PROJECT.name, client: DEMO_PROJECT.client })
  })

  it('lists the five strata in order with palette and pattern keys of the product', () => {
    expect(record.strata.map(s => s.code)).toEqual(['MG', 'CRUST', 'EST', 'GLAC', 'SAND'])
    expect(record.strata.map(s => s.displayOrder)).toEqual([1, 2, 3, 4, 5])
    for (const s of record.strata) {
      expect(isStratumColourKey(s.colour), s.colour).toBe(true)
      expect(isStratumPatternKey(s.pattern), s.pattern).toBe(true)
    }
    expect(record.strata.find(s => s.code === 'EST')!.unitWeightSaturated).toBe(16)
    expect(record.strata.find(s => s.code === 'GLAC')!.unitWeightSaturated).toBe(20.5)
  })

  it('has 6 boreholes, 4 CPTs, 14 oedometer tests, 10 vane profiles and 3 piezometers with 18+ readings', () => {
    expect(points('borehole', 'BH-').map(p => p.identifier)).toEqual(['BH-01', 'BH-02', 'BH-03', 'BH-04', 'BH-05', 'BH-06'])
    expect(points('cpt', 'CPT-').map(p => p.identifier)).toEqual(['CPT-01', 'CPT-02', 'CPT-03', 'CPT-04'])
    expect(record.points.flatMap(p => p.samples).filter(s => s.oedometer !== null)).toHaveLength(14)
    const vanes = record.points.filter(p => p.vane.length > 0)
    expect(vanes.map(p => p.identifier)).toEqual(['VT-01', 'VT-02', 'VT-03', 'VT-04', 'VT-05', 'VT-06', 'VT-07', 'VT-08', 'VT-09', 'VT-10'])
    expect(vanes.every(p => p.kind === 'borehole')).toBe(true)
    const piezometers = points('piezometer', 'P-')
    expect(piezometers.map(p => [p.identifier, p.finalDepth])).toEqual([['P-1', 6], ['P-2', 12], ['P-3', 18]])
    for (const p of piezometers) expect(p.groundwater.filter(g => g.kind === 'piezometer').length).toBeGreaterThanOrEqual(18)
    expect(record.points).toHaveLength(6 + 4 + 10 + 3)
  })

  it('uses unique point identifiers, valid kinds and unique sample identifiers per point', () => {
    const ids = record.points.map(p => p.identifier)
    expect(new Set(ids).size).toBe(ids.length)
    for (const p of record.points) {
      expect(POINT_KINDS).toContain(p.kind)
      const sampleIds = p.samples.map(s => s.identifier)
      expect(new Set(sampleIds).size, p.identifier).toBe(sampleIds.length)
      for (const s of p.samples) expect(SAMPLE_TYPES).toContain(s.type)
    }
  })

  it('the oedometer plan resolves every entry to a distinct tube that carries the test', () => {
    const found = DEMO_OEDOMETER_PLAN.map(plan => plannedOedometerSample(record, plan))
    expect(found.every(s => s?.oedometer)).toBe(true)
    expect(new Set(found).size).toBe(14)
    expect(DEMO_OEDOMETER_PLAN.filter(p => p.quality === 'very-poor')).toHaveLength(2)
    expect(new Set(DEMO_OEDOMETER_PLAN.map(p => p.stratum))).toEqual(new Set(['CRUST', 'EST', 'GLAC']))
  })
})

describe('demo investigation — logs', () => {
  const logged = record.points.filter(p => p.intervals.length > 0)

  it('intervals never overlap, never pass the final depth and run continuously from the surface', () => {
    expect(logged.length).toBe(16)
    for (const p of logged) {
      expect(p.intervals[0]!.top, p.identifier).toBe(0)
      expect(p.intervals[p.intervals.length - 1]!.bottom, p.identifier).toBe(p.finalDepth)
      p.intervals.forEach((iv, k) => {
        expect(iv.bottom, `${p.identifier} #${k}`).toBeGreaterThan(iv.top)
        expect(iv.bottom).toBeLessThanOrEqual(p.finalDepth)
        if (k > 0) expect(iv.top, `${p.identifier} #${k}`).toBeCloseTo(p.intervals[k - 1]!.bottom, 9)
      })
    }
  })

  it('every USCS symbol is a valid group symbol and one its stratum allows', () => {
    for (const p of logged) {
      for (const iv of p.intervals) {
        expect(iv.uscs).not.toBeNull()
        expect(isUscsGroupSymbol(iv.uscs!), iv.uscs!).toBe(true)
        const stratum = DEMO_STRATA.find(s => s.code === iv.stratumCode)
        expect(stratum, iv.stratumCode ?? 'null').toBeDefined()
        expect(stratum!.uscs).toContain(iv.uscs)
      }
    }
  })

  it('strata appear in order, and the logged boundaries are the ground model at the hole', () => {
    for (const p of points('borehole', 'BH-')) {
      const ground = groundAt(p.easting, p.northing)
      const codes = [...new Set(p.intervals.map(iv => iv.stratumCode))]
      expect(codes).toEqual(['MG', 'CRUST', 'EST', 'GLAC', 'SAND'])
      ground.bases.slice(0, 4).forEach((base, i) => {
        const lastOfStratum = p.intervals.filter(iv => iv.stratumCode === DEMO_STRATA[i]!.code).at(-1)!
        expect(lastOfStratum.bottom).toBeCloseTo(base, 9)
      })
    }
  })

  it('descriptions follow the field order and name the geological unit; moisture and consistency are filled', () => {
    for (const p of points('borehole', 'BH-')) {
      for (const iv of p.intervals) {
        expect(iv.description).toMatch(/^(Very soft to soft|Soft to firm|Soft|Firm to stiff|Stiff|Dense|Very dense|Medium dense|Loose to medium dense) /)
        expect(iv.description).toMatch(/ [A-Z]{4,}[ ,]/) // the main constituent in capitals
        expect(iv.description).toMatch(/\((MADE GROUND|CRUST|ESTUARINE CLAY|GLACIAL CLAY|SAND)\)$/)
        expect(iv.moisture).not.toBeNull()
        expect(iv.description).toContain(`, ${iv.moisture}`)
        expect(iv.description.startsWith(iv.consistency!)).toBe(true)
      }
    }
    const crust = points('borehole', 'BH-').flatMap(p => p.intervals).filter(iv => iv.stratumCode === 'CRUST')
    expect(crust.some(iv => /rootlets/.test(iv.description) && /desiccated/.test(iv.description))).toBe(true)
  })

  it('boreholes reach the sand at 22–30 m; coordinates lie on the yard or a little around it; ground at +2.5 ± 0.4 m', () => {
    const { minEasting, maxEasting, minNorthing, maxNorthing } = SITE_PLAN.yard
    expect(maxEasting - minEasting).toBe(120)
    expect(maxNorthing - minNorthing).toBe(80)
    for (const p of points('borehole', 'BH-')) {
      expect(p.finalDepth).toBeGreaterThanOrEqual(22)
      expect(p.finalDepth).toBeLessThanOrEqual(30)
    }
    for (const p of record.points) {
      expect(p.easting).toBeGreaterThan(minEasting - 15)
      expect(p.easting).toBeLessThan(maxEasting + 15)
      expect(p.northing).toBeGreaterThan(minNorthing - 15)
      expect(p.northing).toBeLessThan(maxNorthing + 15)
      expect(Math.abs(p.groundElevation - 2.5)).toBeLessThanOrEqual(0.4 + 1e-9)
    }
    const elevations = record.points.map(p => p.groundElevation)
    expect(Math.max(...elevations) - Math.min(...elevations)).toBeGreaterThan(0.3) // the site does vary
  })

  it('dates are ISO strings; the fieldwork ran in spring 2025', () => {
    for (const p of record.points) {
      expect(p.startedOn).toMatch(/^\d{4}-\d{2}-\d{2}$/)
      expect(p.endedOn! >= p.startedOn!).toBe(true)
      expect(p.startedOn! >= '2025-03-01' && p.endedOn! <= '2025-05-31', p.identifier).toBe(true)
      for (const g of p.groundwater) expect(Number.isNaN(Date.parse(g.observedAt))).toBe(false)
      for (const g of p.groundwater) expect(g.observedAt).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}Z$/)
    }
  })
})

describe('demo investigation — samples, index tests and SPT', () => {
  const holes = points('borehole', 'BH-')

  it('thin-walled tubes sit wholly inside the clay strata, about every 1.5 m (every metre in the thin crust)', () => {
    for (const p of holes) {
      const tubes = p.samples.filter(s => s.type === 'thin-walled-tube')
      expect(tubes.length).toBeGreaterThanOrEqual(12)
      for (const t of tubes) {
        const top = stratumAtDepth(p, t.top)
        expect(['CRUST', 'EST', 'GLAC']).toContain(top)
        expect(stratumAtDepth(p, t.bottom - 1e-6)).toBe(top)
      }
      const est = tubes.filter(t => stratumAtDepth(p, t.top) === 'EST').map(t => t.top)
      for (let k = 1; k < est.length; k++) expect(est[k]! - est[k - 1]!).toBeCloseTo(1.5, 1)
    }
  })

  it('index tests scatter about the strata: unit weights near the stratum, LL roughly consistent with Cc ≈ 0.009(LL − 10)', () => {
    for (const code of ['CRUST', 'EST', 'GLAC'] as const) {
      const truth = demoStratum(code)
      const tests = holes.flatMap(p => p.samples.filter(s => s.index && stratumAtDepth(p, s.top) === code).map(s => s.index!))
      expect(tests.length).toBeGreaterThan(8)
      for (const t of tests) {
        expect(t.bulkUnitWeight).not.toBeNull()
        expect(Math.abs(t.bulkUnitWeight! - truth.unitWeightSaturated)).toBeLessThan(1.2)
        expect(t.waterContent).toBeGreaterThan(0)
        if (t.liquidLimit !== null) expect(t.liquidLimit).toBeGreaterThan(t.plasticLimit!)
      }
      const withLimits = tests.filter(t => t.liquidLimit !== null)
      expect(withLimits.length / tests.length).toBeGreaterThan(0.6) // limits on most samples
      const meanLl = withLimits.reduce((s, t) => s + t.liquidLimit!, 0) / withLimits.length
      expect(0.009 * (meanLl - 10) / truth.compressibility!.cc).toBeGreaterThan(0.85)
      expect(0.009 * (meanLl - 10) / truth.compressibility!.cc).toBeLessThan(1.2)
    }
  })

  it('SPT tests lie in the sand with N = sum of the two test drives and dense-sand values', () => {
    for (const p of holes) {
      expect(p.spt.length).toBeGreaterThanOrEqual(2)
      for (const t of p.spt) {
        expect(stratumAtDepth(p, t.depth)).toBe('SAND')
        expect(t.depth + 0.45).toBeLessThanOrEqual(p.finalDepth)
        expect(t.n).toBe((t.blows[1] ?? 0) + (t.blows[2] ?? 0))
        expect(t.n).toBeGreaterThanOrEqual(20)
        expect(t.n).toBeLessThanOrEqual(70)
      }
    }
  })

  it('groundwater: a strike and a standing level near 1.6 m, and the sand strike rising to about 4.5 m', () => {
    for (const p of holes) {
      const standing = p.groundwater.filter(g => g.kind === 'standing')
      expect(standing).toHaveLength(1)
      expect(Math.abs(standing[0]!.depth! - GROUNDWATER_TRUTH.standingLevel)).toBeLessThan(0.2)
      const strikes = p.groundwater.filter(g => g.kind === 'strike')
      expect(strikes).toHaveLength(2)
      expect(stratumAtDepth(p, strikes[1]!.depth!)).toBe('SAND')
      expect(strikes[1]!.remarks).toMatch(/rose to 4\.\d+ m/)
    }
  })

  it('piezometers read the truth at their tips within a few kPa, monthly over 18 months', () => {
    for (const p of points('piezometer', 'P-')) {
      const truth = groundAt(p.easting, p.northing).stressAt(p.finalDepth).porePressure
      const readings = p.groundwater.filter(g => g.kind === 'piezometer')
      for (const r of readings) {
        expect(r.depth).toBeNull()
        expect(Math.abs(r.pressure! - truth)).toBeLessThan(5)
      }
      const first = new Date(readings[0]!.observedAt)
      const last = new Date(readings[readings.length - 1]!.observedAt)
      const months = (last.getUTCFullYear() - first.getUTCFullYear()) * 12 + last.getUTCMonth() - first.getUTCMonth()
      expect(months).toBe(18)
      const pressures = readings.map(r => r.pressure!)
      expect(Math.max(...pressures) - Math.min(...pressures)).toBeGreaterThan(1) // seasons show
    }
    // P-1 hydrostatic from the 1.6 m table: γw·(6 − 1.6).
    const p1 = points('piezometer', 'P-1')[0]!
    const mean = p1.groundwater.reduce((s, g) => s + g.pressure!, 0) / p1.groundwater.length
    expect(mean).toBeCloseTo(GAMMA_W * (6 - 1.6), 0)
  })
})

describe('demo investigation — CPTu and vane records', () => {
  it('soundings run at 0.02 m to 22 m with equal-length arrays, area ratio 0.8 and physical values', () => {
    for (const p of points('cpt', 'CPT-')) {
      const c = p.cpt!
      expect(c.areaRatio).toBe(CPT_AREA_RATIO)
      expect(c.depth).toHaveLength(Math.round(CPT_FINAL_DEPTH / CPT_SPACING))
      expect(c.depth[c.depth.length - 1]).toBe(22)
      expect(p.finalDepth).toBe(22)
      for (let i = 1; i < c.depth.length; i++) expect(c.depth[i]! - c.depth[i - 1]!).toBeCloseTo(0.02, 9)
      expect(c.qc).toHaveLength(c.depth.length)
      expect(c.fs).toHaveLength(c.depth.length)
      expect(c.u2).toHaveLength(c.depth.length)
      expect(c.qc.every(v => v > 0)).toBe(true)
      expect(c.fs.every(v => v > 0)).toBe(true)
      expect(c.u2.every(v => v >= 0)).toBe(true)
    }
  })

  it('vane readings lie in the estuarine clay, with remoulded strength from a sensitivity of 3 to 6', () => {
    for (const p of record.points.filter(q => q.vane.length > 0)) {
      expect(p.vane.length).toBeGreaterThanOrEqual(8)
      for (const v of p.vane) {
        expect(stratumAtDepth(p, v.depth)).toBe('EST')
        const sensitivity = v.peak / v.remoulded!
        expect(sensitivity).toBeGreaterThan(2.9)
        expect(sensitivity).toBeLessThan(6.2)
        expect(v.peak).toBeGreaterThan(10)
        expect(v.peak).toBeLessThan(60)
      }
    }
  })
})
