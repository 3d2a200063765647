import { describe, expect, it } from 'vitest'
import { SiteModelDefinitionSchema, type SiteModelDefinition, type StratumTrend } from '../../../shared/site-model/definition'
import { definitionTrendProblems, trendProblemWords, unacceptedProblems } from '../../../shared/site-model/trend-checks'

/**
 * A hand-checked two-stratum site: CRUST 0–2 m (γ 18 kN/m³), SOFT 2–8 m (γ = γsat
 * = 16 kN/m³), water table at 2 m, γw taken as 10 kN/m³ so the sums stay round.
 * σ'v0 = 18·z in the crust (36 kPa at 2 m) and 36 + 6·(z − 2) in SOFT (72 kPa at 8 m).
 */
function site(trends: { crust?: Partial<StratumTrend>, soft?: Partial<StratumTrend> }, waterTableDepth = 2): SiteModelDefinition {
  const trend = (t?: Partial<StratumTrend>): StratumTrend | undefined => (t
    ? { model: 'constant', logSpace: false, parameters: {}, n: 6, r2: 0.5, rmse: 3, aic: 10, aicc: 12, includedPointIds: [], excludedPointIds: [], ...t }
    : undefined)
  return SiteModelDefinitionSchema.parse({
    schemaVersion: 2,
    gammaW: 10,
    groundwater: { waterTableDepth, piezometers: [] },
    strata: [
      { code: 'CRUST', name: 'Crust', thickness: 2, unitWeight: 18, unitWeightSaturated: 19, compressible: true, trend: trend(trends.crust) },
      { code: 'SOFT', name: 'Soft clay', thickness: 6, unitWeight: 16, unitWeightSaturated: 16, compressible: true, trend: trend(trends.soft) },
    ],
  })
}

describe('trend checks: a fit that could mislead', () => {
  it('finds nothing wrong with σ\'p above σ\'v0 throughout and R² ≥ 0', () => {
    // Constant POP 10 kPa: σ'p = σ'v0 + 10 everywhere.
    expect(definitionTrendProblems(site({ soft: { model: 'pop', parameters: { pop: 10 } } }))).toEqual([])
    // A constant 80 kPa stays above σ'v0's 72 kPa at the base of SOFT.
    expect(definitionTrendProblems(site({ soft: { model: 'constant', parameters: { preconsolidation: 80 } } }))).toEqual([])
  })

  it('finds σ\'p below σ\'v0 where it is furthest below (hand-computed)', () => {
    // σ'p = 20 + 5·z: 30 kPa at 2 m (σ'v0 36) and 60 kPa at 8 m (σ'v0 72): worst at the base, 12 kPa below.
    const [soft] = definitionTrendProblems(site({ soft: { model: 'linear', parameters: { intercept: 20, gradient: 5 } } }))
    expect(soft!.code).toBe('SOFT')
    expect(soft!.band).toBe(1)
    expect(soft!.problems).toHaveLength(1)
    const p = soft!.problems[0]!
    expect(p.code).toBe('below-effective-stress')
    expect(p.depth).toBeCloseTo(8, 5)
    expect(p.preconsolidation).toBeCloseTo(60, 4)
    expect(p.effectiveStress).toBeCloseTo(72, 4)
    expect(trendProblemWords(p)).toBe('σ\'p 60.0 kPa is below σ\'v0 72.0 kPa at 8.00 m')
  })

  it('finds an OCR below 1 (σ\'p = 0.9·σ\'v0: 64.8 against 72 kPa at the base)', () => {
    const [soft] = definitionTrendProblems(site({ soft: { model: 'ocr', parameters: { ocr: 0.9 } } }))
    expect(soft!.problems.map(p => p.code)).toEqual(['below-effective-stress'])
    expect(soft!.problems[0]!.preconsolidation).toBeCloseTo(64.8, 4)
  })

  it('finds σ\'p at or below 0 (a negative intercept at the top of the crust)', () => {
    // σ'p = −10 + 30·z: −10 kPa at the surface; 50 kPa against 36 at 2 m, so only "not positive".
    const [crust] = definitionTrendProblems(site({ crust: { model: 'linear', parameters: { intercept: -10, gradient: 30 } } }))
    expect(crust!.code).toBe('CRUST')
    expect(crust!.problems.map(p => p.code)).toEqual(['not-positive'])
    expect(crust!.problems[0]!.depth).toBeCloseTo(0, 5)
    expect(crust!.problems[0]!.preconsolidation).toBeCloseTo(-10, 4)
    expect(trendProblemWords(crust!.problems[0]!)).toBe('σ\'p is -10.0 kPa at 0.00 m: it must stay above 0')
  })

  it('finds R² below 0, and checks the water table inside a stratum', () => {
    // Water table at 5 m (a stress breakpoint inside SOFT): σ'v0 at 8 m = 36 + 3·16 + 3·16 − 3·10 = 102 kPa,
    // below the constant 150 kPa everywhere, so R² alone is wrong here.
    const [soft] = definitionTrendProblems(site({ soft: { model: 'constant', parameters: { preconsolidation: 150 }, r2: -0.32 } }, 5))
    expect(soft!.problems).toEqual([{ code: 'negative-r2', r2: -0.32 }])
    expect(trendProblemWords(soft!.problems[0]!)).toBe('R² is -0.32: the trend fits the points worse than their mean')
  })

  it('does not check a hand-drawn trend (it has its own reason)', () => {
    const def = site({ soft: { model: 'linear', parameters: {}, r2: null, manual: { knots: [{ depth: 2, preconsolidation: 5 }, { depth: 8, preconsolidation: 5 }], reason: 'Drawn through the lab values.' } } })
    expect(definitionTrendProblems(def)).toEqual([])
  })

  it('leaves the problems a reason covers out of those still to answer', () => {
    const def = site({ soft: { model: 'ocr', parameters: { ocr: 0.9 }, r2: -0.1, acceptedDespite: { problems: ['below-effective-stress'], reason: 'Underdrained below 6 m; see the piezometers.' } } })
    const [soft] = definitionTrendProblems(def)
    expect(soft!.problems.map(p => p.code)).toEqual(['negative-r2', 'below-effective-stress'])
    expect(unacceptedProblems(def.strata[1]!, soft!.problems).map(p => p.code)).toEqual(['negative-r2'])
  })
})

describe('the definition schema and kept problem trends', () => {
  it('reads a trend without acceptedDespite (older versions) and one with it; refuses a short reason', () => {
    const base = site({ soft: { model: 'pop', parameters: { pop: -5 } } })
    expect(SiteModelDefinitionSchema.safeParse(base).success).toBe(true)
    const kept = structuredClone(base)
    kept.strata[1]!.trend!.acceptedDespite = { problems: ['below-effective-stress'], reason: 'Underconsolidated under the recent fill.' }
    expect(SiteModelDefinitionSchema.parse(kept).strata[1]!.trend!.acceptedDespite!.reason).toBe('Underconsolidated under the recent fill.')
    kept.strata[1]!.trend!.acceptedDespite = { problems: ['below-effective-stress'], reason: 'ok' }
    expect(SiteModelDefinitionSchema.safeParse(kept).success).toBe(false)
  })
})
