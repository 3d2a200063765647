/**
 * End to end: the demo data, read back through the engine exactly as the product reads it (σ'v0 from each
 * point's own log, the strata's unit weights and the groundwater readings), recover the ground model the
 * data were generated from.
 */
import { describe, expect, it } from 'vitest'
import { DEMO_OEDOMETER_PLAN, plannedOedometerSample, type DemoOedometerPlan } from '../../../shared/demo/generate'
import { ESTUARINE_POP, GLACIAL_OCR, demoStratum, groundAt } from '../../../shared/demo/site'
import {
  checkCompressionIndex,
  cptProfile,
  resamplePreconsolidation,
  vanePreconsolidation,
} from '../../../shared/geotech/insitu'
import { interpretOedometer, OEDOMETER_METHODS, SAMPLE_QUALITY_CLASSES, type OedometerInterpretation } from '../../../shared/geotech/oedometer'
import { fitTrend, type TrendPoint } from '../../../shared/geotech/trends'
import type { PointRecord, SampleRecord } from '../../../shared/investigation/types'
import { generateDemoInvestigation } from '../../../shared/demo/generate'
import { strataOfLog, stratumAtDepth, stressFromRecord } from './helpers'

const record = generateDemoInvestigation()

interface Interpreted {
  plan: DemoOedometerPlan
  point: PointRecord
  sample: SampleRecord
  depth: number
  effectiveStress: number
  /** σ'p of the ground model at the sample, for comparison only. */
  truth: number
  out: OedometerInterpretation
  casagrande: number
}

function pointById(id: string): PointRecord {
  const p = record.points.find(q => q.identifier === id)
  if (!p) throw new Error(`no point ${id}`)
  return p
}

/** Mid-depth of the tube: the specimen is trimmed from its middle. */
function specimenDepth(sample: SampleRecord): number {
  return 0.5 * (sample.top + sample.bottom)
}

const interpreted: Interpreted[] = DEMO_OEDOMETER_PLAN.map((plan) => {
  const point = pointById(plan.point)
  const sample = plannedOedometerSample(record, plan)!
  const depth = specimenDepth(sample)
  const effectiveStress = stressFromRecord(record, point)(depth).effectiveStress
  const oed = sample.oedometer!
  const out = interpretOedometer({ points: oed.stages, e0: oed.e0, insituStress: effectiveStress })
  const casagrande = out.results.find(r => r.method === 'casagrande')!.preconsolidation
  const truth = groundAt(point.easting, point.northing).preconsolidationAt(depth)!
  return { plan, point, sample, depth, effectiveStress, truth, out, casagrande }
})
const good = interpreted.filter(t => t.plan.quality !== 'very-poor')
const disturbed = interpreted.filter(t => t.plan.quality === 'very-poor')

function popFit(points: TrendPoint[]): number {
  return fitTrend(points, { model: 'pop' }).parameters.pop!
}

describe('demo oedometer tests through the engine', () => {
  it('every test is interpretable by all four methods without throwing', () => {
    for (const t of interpreted) {
      expect(t.out.results.map(r => r.method).sort(), t.plan.point).toEqual([...OEDOMETER_METHODS].sort())
      expect(t.out.loops).toHaveLength(1)
      expect(t.out.recompressionBasis).toBe('unload-reload-loop')
      expect(t.out.loading.length).toBeGreaterThanOrEqual(8)
      expect(t.out.loading.length).toBeLessThanOrEqual(10)
    }
  })

  it('the record\'s σ\'v0 at each sample agrees with the ground model within 3 %', () => {
    for (const t of interpreted) {
      const truth = groundAt(t.point.easting, t.point.northing).stressAt(t.depth).effectiveStress
      expect(Math.abs(t.effectiveStress / truth - 1), `${t.plan.point} ${t.depth}`).toBeLessThan(0.03)
    }
  })

  it('every good test gives Casagrande σ\'p within 15 % of the truth at its depth', () => {
    expect(good).toHaveLength(12)
    for (const t of good) {
      const ratio = t.casagrande / t.truth
      expect(ratio, `${t.plan.point} ${t.plan.stratum} ${t.depth} m`).toBeGreaterThan(0.85)
      expect(ratio, `${t.plan.point} ${t.plan.stratum} ${t.depth} m`).toBeLessThan(1.15)
    }
  })

  it('the two disturbed tests understate σ\'p by 25–40 % and class as very poor', () => {
    expect(disturbed).toHaveLength(2)
    for (const t of disturbed) {
      const ratio = t.casagrande / t.truth
      expect(ratio, t.plan.point).toBeGreaterThan(0.6)
      expect(ratio, t.plan.point).toBeLessThan(0.75)
      expect(['very-poor', 'poor']).toContain(t.out.sampleQuality!.class)
      expect(t.out.sampleQuality!.class).toBe('very-poor')
    }
  })

  it('the good tests are better than very poor and spread over the other three classes, as planned', () => {
    const classes = good.map(t => t.out.sampleQuality!.class)
    expect(classes).not.toContain('very-poor')
    expect(new Set(classes)).toEqual(new Set(SAMPLE_QUALITY_CLASSES.slice(0, 3)))
    expect(good.filter(t => t.out.sampleQuality!.class === t.plan.quality).length).toBeGreaterThanOrEqual(11)
  })

  it('Cc from the virgin lines and Cr from the loops come back near the stratum truth', () => {
    for (const code of ['CRUST', 'EST', 'GLAC'] as const) {
      const truth = demoStratum(code).compressibility!
      const tests = good.filter(t => t.plan.stratum === code)
      const cc = tests.reduce((s, t) => s + t.out.cc, 0) / tests.length
      const cr = tests.reduce((s, t) => s + t.out.cr, 0) / tests.length
      expect(Math.abs(cc / truth.cc - 1), code).toBeLessThan(0.08)
      expect(Math.abs(cr / truth.cr - 1), code).toBeLessThan(0.15)
      for (const t of tests) expect(Math.abs(t.sample.oedometer!.e0 / truth.e0 - 1)).toBeLessThan(0.06)
    }
  })

  it('measured Cc agrees with the liquid-limit estimate on the same tube (within a factor of two)', () => {
    for (const t of interpreted) {
      const ll = t.sample.index?.liquidLimit
      if (ll == null) continue
      expect(checkCompressionIndex(t.out.cc, ll).flagged, `${t.plan.point} ${t.sample.identifier}`).toBe(false)
    }
  })
})

describe('demo stress history recovered by trend fits', () => {
  it(`estuarine clay: constant-POP fit of the good oedometer tests gives POP = ${ESTUARINE_POP} ± 8 kPa`, () => {
    const points = good.filter(t => t.plan.stratum === 'EST').map(t => ({ depth: t.depth, preconsolidation: t.casagrande, effectiveStress: t.effectiveStress }))
    expect(points).toHaveLength(6)
    const pop = popFit(points)
    console.info(`EST POP from oedometers (Casagrande, n = 6): ${pop.toFixed(1)} kPa (truth ${ESTUARINE_POP})`)
    expect(Math.abs(pop - ESTUARINE_POP)).toBeLessThanOrEqual(8)
    // Leaving the two disturbed specimens in drags the fit down: why the reviewer must flag them.
    const all = interpreted.filter(t => t.plan.stratum === 'EST').map(t => ({ depth: t.depth, preconsolidation: t.casagrande, effectiveStress: t.effectiveStress }))
    expect(popFit(all)).toBeLessThan(pop - 5)
  })

  it(`glacial clay: constant-OCR fit of the oedometer tests gives OCR = ${GLACIAL_OCR} ± 0.3`, () => {
    const points = good.filter(t => t.plan.stratum === 'GLAC').map(t => ({ depth: t.depth, preconsolidation: t.casagrande, effectiveStress: t.effectiveStress }))
    const ocr = fitTrend(points, { model: 'ocr' }).parameters.ocr!
    console.info(`GLAC OCR from oedometers (n = ${points.length}): ${ocr.toFixed(2)} (truth ${GLACIAL_OCR})`)
    expect(Math.abs(ocr - GLACIAL_OCR)).toBeLessThanOrEqual(0.3)
  })

  it(`estuarine clay: CPTu σ'p = 0.33·qnet, resampled and fitted with constant POP, gives POP = ${ESTUARINE_POP} ± 8 kPa`, () => {
    const holes = record.points.filter(p => p.identifier.startsWith('BH-'))
    const points: TrendPoint[] = []
    for (const cpt of record.points.filter(p => p.kind === 'cpt')) {
      // Layering and stresses from the nearest borehole, as an engineer correlates a sounding with the logs.
      const nearest = [...holes].sort((a, b) => Math.hypot(a.easting - cpt.easting, a.northing - cpt.northing) - Math.hypot(b.easting - cpt.easting, b.northing - cpt.northing))[0]!
      const stressAt = stressFromRecord(record, nearest)
      const est = strataOfLog(nearest).find(s => s.code === 'EST')!
      const c = cpt.cpt!
      const profile = cptProfile({ depth: c.depth, qc: c.qc, fs: c.fs, u2: c.u2, areaRatio: c.areaRatio, stressAt })
      expect(profile.flaggedRows).toBe(0)
      const windows = resamplePreconsolidation(profile.depth, profile.preconsolidation, { spacing: 0.25 })
      for (const w of windows) {
        if (w.depth < est.top + 0.8 || w.depth > est.bottom - 0.8) continue
        points.push({ depth: w.depth, preconsolidation: w.preconsolidation, effectiveStress: stressAt(w.depth).effectiveStress })
      }
    }
    expect(points.length).toBeGreaterThan(120)
    const pop = popFit(points)
    console.info(`EST POP from CPTu (n = ${points.length}): ${pop.toFixed(1)} kPa (truth ${ESTUARINE_POP})`)
    expect(Math.abs(pop - ESTUARINE_POP)).toBeLessThanOrEqual(8)
  })

  it(`estuarine clay: field vane σ'p (Bjerrum μ from the measured PI, su/σ'p = 0.22) gives POP = ${ESTUARINE_POP} ± 8 kPa`, () => {
    const limits = record.points.flatMap(p => p.samples.filter(s => s.index?.liquidLimit != null && stratumAtDepth(p, specimenDepth(s)) === 'EST').map(s => s.index!))
    const pi = limits.reduce((s, t) => s + (t.liquidLimit! - t.plasticLimit!), 0) / limits.length
    const points: TrendPoint[] = []
    for (const p of record.points.filter(q => q.vane.length > 0)) {
      const stressAt = stressFromRecord(record, p)
      for (const v of p.vane) points.push({ depth: v.depth, preconsolidation: vanePreconsolidation(v.peak, { pi }).preconsolidation, effectiveStress: stressAt(v.depth).effectiveStress })
    }
    const pop = popFit(points)
    console.info(`EST POP from vanes (n = ${points.length}, PI = ${pi.toFixed(0)}): ${pop.toFixed(1)} kPa (truth ${ESTUARINE_POP})`)
    expect(Math.abs(pop - ESTUARINE_POP)).toBeLessThanOrEqual(8)
  })

  it('CPTu pore pressures: Bq 0.4–0.8 in the soft clay, lower in the crust and glacial clay, near zero in the sand', () => {
    const medians: Record<string, number[]> = { CRUST: [], EST: [], GLAC: [], SAND: [] }
    for (const cpt of record.points.filter(p => p.kind === 'cpt')) {
      const ground = groundAt(cpt.easting, cpt.northing)
      const c = cpt.cpt!
      const profile = cptProfile({ depth: c.depth, qc: c.qc, fs: c.fs, u2: c.u2, areaRatio: c.areaRatio, stressAt: z => ground.stressAt(z) })
      const byStratum: Record<string, number[]> = { CRUST: [], EST: [], GLAC: [], SAND: [] }
      for (let i = 0; i < profile.depth.length; i++) {
        const z = profile.depth[i]!
        const code = ground.stratumAt(z).code
        const inside = ground.tops.every(b => Math.abs(z - b) > 0.3)
        if (inside && byStratum[code] && Number.isFinite(profile.porePressureRatio[i]!)) byStratum[code]!.push(profile.porePressureRatio[i]!)
      }
      for (const [code, values] of Object.entries(byStratum)) {
        if (values.length < 10) continue
        values.sort((a, b) => a - b)
        medians[code]!.push(values[values.length >> 1]!)
      }
    }
    for (const m of medians.EST!) {
      expect(m).toBeGreaterThan(0.4)
      expect(m).toBeLessThan(0.8)
    }
    expect(medians.EST).toHaveLength(4)
    for (const m of [...medians.CRUST!, ...medians.GLAC!]) expect(m).toBeLessThan(0.4)
    for (const m of medians.SAND!) expect(Math.abs(m)).toBeLessThan(0.05)
  })
})
