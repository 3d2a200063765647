// POST /api/calc/settlement with a `probabilistic` block over real HTTP: the contract, a value
// against the closed form, 413 above the inline limit, 422 for a layer name the request lacks,
// and reproducibility by seed.
import { beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../helpers/http'
import { demoEmail, signIn } from '../helpers/http'

const BODY = {
  layers: [
    { name: 'Fill', thickness: 1, unitWeight: 19, unitWeightSaturated: 20, compressible: false },
    { name: 'Clay', thickness: 8, unitWeight: 16, unitWeightSaturated: 16, compressible: true, cc: 0.85, cr: 0.09, e0: 2.1, preconsolidation: { type: 'ocr', value: 1 }, cv: 1.2 },
    { name: 'Silt', thickness: 3, unitWeight: 18, unitWeightSaturated: 18, compressible: true, cc: 0.3, cr: 0.04, e0: 0.9, preconsolidation: { type: 'pop', value: 30 }, cv: 4 },
  ],
  groundwater: { waterTableDepth: 1 },
  load: { type: 'uniform', pressure: 60 },
}

interface Quantiles { p05: number, p10: number, p50: number, p90: number, p95: number }
interface Block {
  realizations: number
  seed: number
  mean: number
  sd: number
  quantiles: Quantiles
  histogram: { edges: number[], counts: number[] }
  exceedance?: { limit: number, probability: number }
  t90?: { mean: number, sd: number, quantiles: Quantiles }
  sensitivity: { layer: string, variable: string, rankCorrelation: number }[]
  warnings: string[]
}
interface Answer { settlement: number, probabilistic?: Block, caution: string, message?: string, data?: { code?: string, issues?: { path: string }[] } }

describe('POST /api/calc/settlement — probabilistic', () => {
  let designer: Client
  beforeAll(async () => { designer = await signIn(demoEmail('designer')) })

  it('answers the block beside the unchanged deterministic result', async () => {
    const plain = await designer.post<Answer>('/api/calc/settlement?sublayers=false', BODY)
    const r = await designer.post<Answer>('/api/calc/settlement?sublayers=false', {
      ...BODY,
      probabilistic: { realizations: 2000, seed: 11, layers: { Clay: { cc: { cov: 0.25 }, e0: { cov: 0.1 }, cv: { cov: 0.4 } }, Silt: { preconsolidation: { cov: 0.3 } } }, limit: 0.6 },
    })
    expect(r.status).toBe(200)
    expect(r.body.settlement).toBe(plain.body.settlement)
    expect(r.body.caution).toBe(plain.body.caution)
    const p = r.body.probabilistic!
    expect(Object.keys(p).sort()).toEqual(['exceedance', 'histogram', 'mean', 'quantiles', 'realizations', 'sd', 'seed', 'sensitivity', 't90', 'warnings'])
    expect(p.realizations).toBe(2000)
    expect(p.seed).toBe(11)
    const q = p.quantiles
    expect(q.p05).toBeLessThan(q.p10)
    expect(q.p10).toBeLessThan(q.p50)
    expect(q.p50).toBeLessThan(q.p90)
    expect(q.p90).toBeLessThan(q.p95)
    expect(p.sd).toBeGreaterThan(0)
    expect(p.histogram.counts.reduce((a, b) => a + b, 0)).toBe(2000)
    expect(p.histogram.edges).toHaveLength(p.histogram.counts.length + 1)
    expect(p.exceedance!.limit).toBe(0.6)
    expect(p.exceedance!.probability).toBeGreaterThanOrEqual(0)
    expect(p.exceedance!.probability).toBeLessThanOrEqual(1)
    expect(p.t90!.quantiles.p50).toBeGreaterThan(0)
    expect(p.sensitivity.map(s => `${s.layer}/${s.variable}`).sort()).toEqual(['Clay/cc', 'Clay/cv', 'Clay/e0', 'Silt/preconsolidation'])
    // Cc of the thick soft clay drives the settlement; cv does not change it at all.
    expect(p.sensitivity[0]).toMatchObject({ layer: 'Clay', variable: 'cc' })
    expect(p.sensitivity[0]!.rankCorrelation).toBeGreaterThan(0.8)
    expect(Math.abs(p.sensitivity.find(s => s.variable === 'cv')!.rankCorrelation)).toBeLessThan(0.1)
  })

  it('an NC layer with only Cc random: P50 = S/√(1 + COV²) (lognormal; Aitchison & Brown 1957) within 4 sampling SE at 20 000 realisations', async () => {
    const body = { ...BODY, layers: BODY.layers.slice(0, 2) }
    const cov = 0.3
    const r = await designer.post<Answer>('/api/calc/settlement?sublayers=false', { ...body, probabilistic: { realizations: 20_000, seed: 5, layers: { Clay: { cc: { cov } } } } })
    expect(r.status).toBe(200)
    const s = r.body.settlement
    const sigma = Math.sqrt(Math.log(1 + cov * cov))
    const p50 = s / Math.sqrt(1 + cov * cov)
    // SE of a sample median of a lognormal: p50·σ·√(0.25/N)/φ(0) (Cramér 1946, §28.5).
    const se = p50 * sigma * Math.sqrt(0.25 / 20_000) * Math.sqrt(2 * Math.PI)
    expect(Math.abs(r.body.probabilistic!.quantiles.p50 - p50)).toBeLessThan(4 * se)
  })

  it('the same seed gives the same numbers; another seed other numbers', async () => {
    const probabilistic = { realizations: 1000, seed: 77, layers: { Clay: { cc: { cov: 0.3 }, cr: { cov: 0.3 } } } }
    const a = await designer.post<Answer>('/api/calc/settlement?sublayers=false', { ...BODY, probabilistic })
    const b = await designer.post<Answer>('/api/calc/settlement?sublayers=false', { ...BODY, probabilistic })
    const c = await designer.post<Answer>('/api/calc/settlement?sublayers=false', { ...BODY, probabilistic: { ...probabilistic, seed: 78 } })
    expect(b.body.probabilistic).toEqual(a.body.probabilistic)
    expect(c.body.probabilistic!.quantiles.p50).not.toBe(a.body.probabilistic!.quantiles.p50)
  })

  it('more than 20 000 realisations: 413 with a pointer to settlement runs', async () => {
    const r = await designer.post<Answer>('/api/calc/settlement', { ...BODY, probabilistic: { realizations: 20_001, layers: { Clay: { cc: { cov: 0.2 } } } } })
    expect(r.status).toBe(413)
    expect(r.body.message).toContain('settlement run')
    expect(r.body.data?.code).toBe('too-many-realizations')
  })

  it('more realisations × sublayers than the route computes at once: 413 too', async () => {
    const r = await designer.post<Answer>('/api/calc/settlement', { ...BODY, sublayers: { count: 2500 }, probabilistic: { realizations: 10_000, layers: { Clay: { cc: { cov: 0.2 } } } } })
    expect(r.status).toBe(413)
    expect(r.body.data?.code).toBe('too-much-work')
    expect(r.body.message).toContain('settlement run')
  })

  it('a layer name the request lacks, or one that is not compressible: 422 with the reason', async () => {
    const r = await designer.post<Answer>('/api/calc/settlement', { ...BODY, probabilistic: { layers: { Peat: { cc: { cov: 0.2 } } } } })
    expect(r.status).toBe(422)
    expect(r.body.message).toContain('"Peat"')
    expect(r.body.data?.code).toBe('layer-unknown')
    expect(r.body.data?.issues?.[0]?.path).toBe('probabilistic.layers.Peat')
    const fill = await designer.post<Answer>('/api/calc/settlement', { ...BODY, probabilistic: { layers: { Fill: { cc: { cov: 0.2 } } } } })
    expect(fill.status).toBe(422)
    expect(fill.body.message).toContain('no compressible layer')
  })

  it('shape errors are 400: a COV above 2, fewer than 100 realisations, an unknown variable', async () => {
    for (const probabilistic of [
      { layers: { Clay: { cc: { cov: 2.5 } } } },
      { realizations: 50, layers: {} },
      { layers: { Clay: { cα: { cov: 0.2 } } } },
    ]) {
      const r = await designer.post<Answer>('/api/calc/settlement', { ...BODY, probabilistic })
      expect(r.status, JSON.stringify(probabilistic)).toBe(400)
    }
  })
})
