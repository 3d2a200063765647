import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { generateDemoInvestigation, plannedOedometerSample, DEMO_OEDOMETER_PLAN } from '../../../shared/demo/generate'
import { DEMO_STAGES_COLUMNS, demoStagesExample } from '../../../shared/demo/import-examples'
import { suggestMapping, validateRows } from '../../../shared/imports/targets'
import { toVoidRatio } from '../../../shared/lab/stages'
import { parseCsv } from './helpers'

const record = generateDemoInvestigation()
const example = demoStagesExample(record)
const test = plannedOedometerSample(record, DEMO_OEDOMETER_PLAN.find(p => p.point === 'BH-05' && p.stratum === 'CRUST')!)!.oedometer!

describe('demo oedometer stages example (BH-05 crust test as strain %)', () => {
  it('is the shipped file, byte for byte', () => {
    expect(readFileSync(resolve(import.meta.dirname, '../../../docs/examples/saltmarsh-lane-oedometer-stages.csv'), 'utf8')).toBe(example.csv)
  })

  it('maps itself and passes the row check against the test it belongs to', () => {
    const [header, ...rows] = parseCsv(example.csv)
    expect(header).toEqual([...DEMO_STAGES_COLUMNS])
    const mapping = suggestMapping('oedometer-stages', header!)
    expect(mapping).toEqual({ stage: 'stage', stress: 'effective stress (kPa)', strain: 'strain (%)' })
    const r = validateRows('oedometer-stages', header!, rows, mapping, { points: new Map(), samples: new Set(), strata: new Set(), oedometerBasis: { e0: test.e0, specimenHeight: 20 } })
    expect(r.errors).toEqual([])
    expect(r.records).toHaveLength(test.stages.length + 1)
  })

  it('gives back the demo curve within the file\'s rounding, and ends with an unloading stage that swells', () => {
    const e = example.stages.map(s => toVoidRatio('strain', s.strain, { e0: test.e0, specimenHeight: 20 }))
    test.stages.forEach((s, i) => {
      expect(example.stages[i]!.stress).toBe(s.stress)
      // 0.0005 % of strain is (1 + e0)·5e-6 ≈ 1e-5 in e.
      expect(Math.abs(e[i]! - s.voidRatio)).toBeLessThan(1.1e-5)
    })
    const last = example.stages.length - 1
    expect(example.stages[last]!.stress).toBe(test.stages[test.stages.length - 1]!.stress / 4)
    expect(e[last]!).toBeGreaterThan(e[last - 1]!)
  })
})
