import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { computeSettlement } from '../../../shared/geotech/settlement'
import { ModelIncompleteError, toSettlementLayers, toStressInput } from '../../../shared/site-model/convert'
import { depthTrendAt, SITE_MODEL_SCHEMA_VERSION, SiteModelDefinitionSchema, stratumBounds, type DepthTrend, type SiteModelDefinition } from '../../../shared/site-model/definition'
import { sublayerTable } from '../../../shared/site-model/sublayers'

const fixture = (name: string): unknown => JSON.parse(readFileSync(new URL(`./fixtures/${name}`, import.meta.url), 'utf8'))

describe('schema version 2 reads version-1 definitions unchanged', () => {
  it('a saved version-1 definition (no depth trends) parses to itself', () => {
    const v1 = fixture('definition-v1.json') as SiteModelDefinition
    expect(v1.schemaVersion).toBe(1)
    expect(SiteModelDefinitionSchema.parse(v1)).toEqual(v1)
  })

  it('and gives the sublayer table and settlement layers the release before depth trends gave (stored output)', () => {
    const v1 = SiteModelDefinitionSchema.parse(fixture('definition-v1.json'))
    const before = fixture('sublayers-v1.json') as ReturnType<typeof sublayerTable>
    const now = sublayerTable(v1, 0.25)
    // One additive field since: each compressible layer names its stratum's drainage group (its code),
    // so a stratum's slices consolidate as one. Without it, byte for byte: the same rows and layers.
    const codes = new Map(v1.strata.map(s => [s.name, s.code]))
    for (const l of now.layers) expect(l.drainageGroup).toBe(l.compressible ? codes.get(l.name.replace(/ \(\d+\/\d+\)$/, '')) : undefined)
    const withoutGroups = { ...now, layers: now.layers.map(({ drainageGroup: _g, ...rest }) => rest) }
    expect(JSON.stringify(withoutGroups)).toBe(JSON.stringify(before))
  })

  it('a version-1 definition may not carry depth trends; version 2 may', () => {
    const v1 = fixture('definition-v1.json') as SiteModelDefinition
    const est = v1.strata[2]!
    const trend: DepthTrend = { referenceDepth: 9, value: 0.85, gradient: 0.02, n: 5, r2: 0.7, testDepths: { top: 4, bottom: 13 }, testIds: ['a', 'b', 'c', 'd', 'e'] }
    const withTrend = { ...v1, strata: v1.strata.map(s => (s === est ? { ...s, compressibility: { ...s.compressibility!, trends: { cc: trend } } } : s)) }
    const r = SiteModelDefinitionSchema.safeParse(withTrend)
    expect(r.success).toBe(false)
    expect(r.error?.issues.map(i => [i.path.join('.'), i.message])).toEqual([['schemaVersion', 'depth trends of compressibility need schemaVersion 2']])
    expect(SITE_MODEL_SCHEMA_VERSION).toBe(2)
    expect(SiteModelDefinitionSchema.safeParse({ ...withTrend, schemaVersion: 2 }).success).toBe(true)
  })
})

/** The v1 fixture moved to version 2 with a Cc and an e0 depth trend on the estuarine clay (band 2, 3.4–15 m). */
function withEstTrends(trends: NonNullable<NonNullable<SiteModelDefinition['strata'][number]['compressibility']>['trends']>): SiteModelDefinition {
  const v1 = SiteModelDefinitionSchema.parse(fixture('definition-v1.json'))
  return SiteModelDefinitionSchema.parse({
    ...v1,
    schemaVersion: 2,
    strata: v1.strata.map((s, i) => (i === 2 ? { ...s, compressibility: { ...s.compressibility!, trends } } : s)),
  })
}
const ccTrend: DepthTrend = { referenceDepth: 9.2, value: 0.84, gradient: 0.028, n: 5, r2: 0.81, testDepths: { top: 4.3, bottom: 13.6 }, testIds: ['a', 'b', 'c', 'd', 'e'] }
const e0Trend: DepthTrend = { referenceDepth: 9.2, value: 2.1, gradient: -0.035, n: 5, r2: 0.64, testDepths: { top: 4.3, bottom: 13.6 }, testIds: ['a', 'b', 'c', 'd', 'e'] }

describe('a depth trend through the conversion and the sublayer table', () => {
  it('every sublayer of the stratum carries the trend at its own mid-depth; other parameters and strata stay constant', () => {
    const d = withEstTrends({ cc: ccTrend, e0: e0Trend })
    const { rows } = sublayerTable(d, 0.25)
    const [top, bottom] = [stratumBounds(d)[2]!.top, stratumBounds(d)[2]!.bottom]
    const est = rows.filter(r => r.layer.startsWith('Estuarine clay'))
    // 11.6 m in sublayers of at most 0.25 m: 47 of them.
    expect(est).toHaveLength(Math.ceil(11.6 / 0.25))
    expect(est[0]!.top).toBeCloseTo(top, 12)
    expect(est[est.length - 1]!.bottom).toBeCloseTo(bottom, 12)
    for (const r of est) {
      expect(r.depth).toBeCloseTo((r.top + r.bottom) / 2, 12)
      expect(r.cc).toBeCloseTo(0.84 + 0.028 * (r.depth - 9.2), 12)
      expect(r.e0).toBeCloseTo(2.1 - 0.035 * (r.depth - 9.2), 12)
      expect(r.cr).toBe(0.09)
      expect(r.cv).toBe(1.2)
      // σ'p is still the POP trend of the stratum.
      expect(r.pop).toBeCloseTo(25, 9)
    }
    expect(est[est.length - 1]!.cc - est[0]!.cc).toBeCloseTo(0.028 * (est[est.length - 1]!.depth - est[0]!.depth), 12)
    // The strata without trends give the rows they gave before.
    const before = (fixture('sublayers-v1.json') as ReturnType<typeof sublayerTable>).rows
    expect(rows.filter(r => !r.layer.startsWith('Estuarine clay'))).toEqual(before.filter(r => !r.layer.startsWith('Estuarine clay')))
    // σ'v0 and σ'p of the sliced stratum are those of the unsliced one.
    before.filter(r => r.layer.startsWith('Estuarine clay')).forEach((r, k) => {
      expect(est[k]!.effectiveStress).toBeCloseTo(r.effectiveStress, 9)
      expect(est[k]!.preconsolidation).toBeCloseTo(r.preconsolidation, 9)
    })
  })

  it('the settlement layers are the slices, and the settlement engine at the same sublayering sees the same values', () => {
    const d = withEstTrends({ cc: ccTrend })
    const { rows, layers } = sublayerTable(d, 0.5)
    const slices = layers.filter(l => l.name.startsWith('Estuarine clay'))
    expect(slices).toHaveLength(Math.ceil(11.6 / 0.5))
    expect(slices[0]!.name).toBe(`Estuarine clay (1/${slices.length})`)
    expect(slices.reduce((s, l) => s + l.thickness, 0)).toBeCloseTo(11.6, 12)
    expect(slices.every(l => l.preconsolidation?.type === 'pop' && l.preconsolidation.value === 25)).toBe(true)
    const s = computeSettlement({ ...toStressInput(d), layers, load: { type: 'uniform', pressure: 120 }, sublayers: { maxThickness: 0.5 } })
    expect(s.sublayers).toHaveLength(rows.length)
    rows.forEach((r, k) => {
      const sub = s.sublayers[k]!
      expect(sub.depth).toBeCloseTo(r.depth, 8)
      expect(sub.effectiveStress).toBeCloseTo(r.effectiveStress, 6)
    })
    const estRows = rows.filter(r => r.layer.startsWith('Estuarine clay'))
    const estSubs = s.sublayers.filter(x => x.layer.startsWith('Estuarine clay'))
    // Each sublayer's compression is Δe/(1 + e0)·h with its own row's Cc, Cr and e0 (domain §3).
    estSubs.forEach((sub, k) => {
      const r = estRows[k]!
      const de = sub.case === 'OC' ? r.cr * Math.log10(sub.finalEffectiveStress / sub.effectiveStress) : r.cr * Math.log10(sub.preconsolidation / sub.effectiveStress) + r.cc * Math.log10(sub.finalEffectiveStress / sub.preconsolidation)
      expect(sub.compression).toBeCloseTo((de / (1 + r.e0)) * sub.thickness, 12)
    })
  })

  it('a crust trend with a depth trend is cut at the breakpoint and then into slices', () => {
    const v1 = SiteModelDefinitionSchema.parse(fixture('definition-v1.json'))
    const crustTrend: DepthTrend = { referenceDepth: 2.3, value: 0.35, gradient: 0.05, n: 3, r2: 0.9, testDepths: { top: 1.5, bottom: 3.1 }, testIds: ['x', 'y', 'z'] }
    const d = SiteModelDefinitionSchema.parse({ ...v1, schemaVersion: 2, strata: v1.strata.map((s, i) => (i === 1 ? { ...s, compressibility: { ...s.compressibility!, trends: { cc: crustTrend } } } : s)) })
    const { rows, layers } = sublayerTable(d, 0.25)
    const crust = layers.filter(l => l.name.startsWith('Desiccated crust'))
    // 1.2–3.0 m above the breakpoint (8 slices), 3.0–3.4 m below (2 slices).
    expect(crust.map(l => l.thickness.toFixed(4))).toEqual([...Array(8).fill('0.2250'), '0.2000', '0.2000'])
    expect(crust.slice(0, 8).every(l => l.preconsolidation?.type === 'linear')).toBe(true)
    expect(crust.slice(8).every(l => l.preconsolidation?.type === 'pop')).toBe(true)
    // The linear σ'p of the slices joins up: each slice's bottom is the next one's top.
    for (let k = 0; k < 7; k++) {
      const a = crust[k]!.preconsolidation as { top: number, bottom: number }
      const b = crust[k + 1]!.preconsolidation as { top: number, bottom: number }
      expect(a.bottom).toBeCloseTo(b.top, 9)
    }
    const before = (fixture('sublayers-v1.json') as ReturnType<typeof sublayerTable>).rows.filter(r => r.layer.startsWith('Desiccated crust'))
    const now = rows.filter(r => r.layer.startsWith('Desiccated crust'))
    expect(now).toHaveLength(before.length)
    now.forEach((r, k) => {
      expect(r.preconsolidation).toBeCloseTo(before[k]!.preconsolidation, 6)
      expect(r.cc).toBeCloseTo(depthTrendAt(crustTrend, r.depth), 12)
    })
  })

  it('refuses a trend that turns non-positive within the stratum, in the schema and in the conversion', () => {
    // e0 falling 0.2 per metre from 2.1 at 9.2 m is 0 at 19.7 m: fine in the clay (to 15 m)...
    const steep: DepthTrend = { ...e0Trend, gradient: -0.2 }
    const d = withEstTrends({ e0: steep })
    expect(sublayerTable(d).rows.length).toBeGreaterThan(0)
    // ...until the clay's base is moved to 21 m.
    const deeper = { ...d, strata: d.strata.map((s, i) => (i === 2 ? { ...s, thickness: 17.6 } : s)) }
    const r = SiteModelDefinitionSchema.safeParse(deeper)
    expect(r.success).toBe(false)
    expect(r.error?.issues.map(i => [i.path.join('.'), i.message])).toEqual([['strata.2.compressibility.trends.e0', 'the e0 trend gives -0.26 at the base of Estuarine clay (21.00 m); it must stay above 0 through the stratum: keep the constant']])
    expect(() => toSettlementLayers(deeper, () => 50)).toThrow(ModelIncompleteError)
    expect(() => toSettlementLayers(deeper, () => 50)).toThrow('Stratum "Estuarine clay": the e0 trend gives -0.26 at the base')
  })
})
