import { computeStressProfile } from '../../../shared/geotech/stress'
import { fitTrend } from '../../../shared/geotech/trends'
import type { ModelVersionReportData } from '../../../shared/reports/model-version'
import { toStressInput } from '../../../shared/site-model/convert'
import { stratumBounds } from '../../../shared/site-model/definition'
import { stressAt } from '../../../shared/plots/stress-history'
import { scenarioDefinition } from '../../helpers/scenario-definition'

/**
 * A model-version report's data from the demo ground model: invented σ'p points scattered about the
 * scenario's trends (a fixed pseudo-random sequence), one left out by the engineer and one excluded by a
 * reviewer flag per compressible stratum, and the fits' bands computed from the included points.
 */
export function reportData(over: Partial<ModelVersionReportData> = {}): ModelVersionReportData {
  const definition = scenarioDefinition()
  const profile = computeStressProfile({ ...toStressInput(definition) }).points.map(p => ({ depth: p.depth, layer: p.layer, totalStress: p.totalStress, porePressure: p.porePressure, effectiveStress: p.effectiveStress }))
  const bounds = stratumBounds(definition)
  let seed = 7
  const rand = () => {
    seed = (seed * 16807) % 2147483647
    return seed / 2147483647
  }
  const points: ModelVersionReportData['points'] = []
  definition.strata.forEach((s, band) => {
    if (!s.trend || !s.compressible) return
    const b = bounds[band]!
    for (let k = 0; k < 12; k++) {
      const depth = b.top + ((k + 0.5) / 12) * (b.bottom - b.top)
      const e = stressAt(profile, depth)!.effectiveStress
      const p = s.trend.model === 'pop' ? e + s.trend.parameters.pop! : s.trend.model === 'linear' ? s.trend.parameters.intercept! + s.trend.parameters.gradient! * depth : e * 1.5
      points.push({ band, depth, preconsolidation: Math.max(5, p * (0.88 + 0.24 * rand())), source: k % 3 === 0 ? 'oedometer' : 'cpt', qualityClass: k % 3 === 0 ? 'good-to-fair' : null, state: k === 4 ? 'excluded' : k === 7 ? 'flagged-out' : 'included', verdict: k === 7 ? 'exclude' : null })
    }
  })
  const fitBands = definition.strata.map((s, band) => {
    const t = s.trend
    if (!t || t.manual) return null
    const pts = points.filter(p => p.band === band && p.state === 'included').map(p => ({ depth: p.depth, preconsolidation: p.preconsolidation, effectiveStress: stressAt(profile, p.depth)!.effectiveStress }))
    if (pts.length < 3) return null
    const fit = fitTrend(pts, { model: t.model, logSpace: t.logSpace })
    t.n = fit.n
    t.r2 = fit.r2
    t.rmse = fit.rmse
    t.aicc = Number.isFinite(fit.aicc) ? fit.aicc : null
    t.parameters = fit.parameters
    return fit.band
  })
  return {
    project: { name: 'Trent Wharf yard', jobNumber: 'TRN-0417', client: 'Harbour Board', units: 'SI' },
    model: { name: 'Yard model' },
    version: { number: 2, status: 'approved', message: 'Crust refit after the second CPT campaign', savedBy: 'Demo Designer', savedAt: '2026-11-20T09:00:00.000Z', savedFrom: null, superseded: false, supersededBy: null },
    approval: { by: 'Demo Reviewer', at: '2026-11-21T10:30:00.000Z', hash: 'a3f1c09e5b7d2468ace13579bdf02468ace13579bdf02468ace13579bdf0246a', override: null, overFlags: 0 },
    submitted: { by: 'Demo Designer', at: '2026-11-20T12:00:00.000Z' },
    definition,
    profile,
    points,
    fitBands,
    flags: [{ verdict: 'exclude', target: 'CPT-02 CPT σ\'p at 6.10 m', comment: 'Cone drift after the rod change', statusNow: 'open' }],
    previousApproved: { version: 1, changes: [{ path: 'strata[1].thickness', a: 2.0, b: 2.2 }], flagsChanged: true },
    issue: null,
    ...over,
  }
}
