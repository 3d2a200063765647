import type { SettlementRun, SettlementRunView } from '../types/settlement-runs'

/**
 * A run without its points' time curves: what a run's results page keeps (and sends with its HTML). The curves are
 * most of a finished run's reply; the page reads those of the point it shows with that point's detail.
 */
export function withoutCurves(run: SettlementRun): SettlementRunView {
  if (!run.results) return { ...run, results: null }
  return { ...run, results: { ...run.results, points: run.results.points.map(({ curve: _curve, ...rest }) => rest) } }
}
