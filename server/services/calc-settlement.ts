import { RESULT_CAUTION } from '#shared/caution'
import { computeSettlement } from '#shared/geotech/settlement'
import { runMonteCarlo } from '#shared/probabilistic/monte-carlo'
import { PROBABILISTIC_DEFAULTS, PROBABILISTIC_LIMITS, type SettlementRequest } from '#shared/schemas/calc'
import { groupThousands } from '#shared/text/count'
import type { ProbabilisticSettlementReply, SettlementReply } from '#shared/types/calc'
import { unprocessableError } from '~~/server/services/http-errors'
import { MAX_SUBLAYERS, runEngine } from '~~/server/utils/engine'

/**
 * POST /api/calc/settlement: the deterministic settlement and, when asked, the Monte Carlo block.
 * The work is bounded before it starts: the sublayer count (the convergence report doubles it) and
 * the realisations answered inline.
 */
export function calcSettlement(body: SettlementRequest, options: { sublayers: boolean }): SettlementReply {
  const planned = body.layers.reduce((n, l) => {
    if (!l.compressible || !(l.thickness > 0)) return n
    if (body.sublayers && 'count' in body.sublayers) return n + body.sublayers.count
    const max = body.sublayers?.maxThickness ?? 0.25
    return n + Math.ceil(l.thickness / max)
  }, 0)
  if (planned > MAX_SUBLAYERS) {
    throw unprocessableError(`The sublayering asks for ${planned} sublayers; the limit is ${MAX_SUBLAYERS}. Use a larger maxThickness.`, { code: 'too-many-sublayers' })
  }
  const probabilistic = body.probabilistic
  const realizations = probabilistic?.realizations ?? PROBABILISTIC_DEFAULTS.realizations
  if (probabilistic && realizations > PROBABILISTIC_LIMITS.inline) {
    throw createError({
      statusCode: 413,
      statusMessage: 'Payload Too Large',
      message: `${realizations} realisations are more than this route computes at once (${PROBABILISTIC_LIMITS.inline}). Ask for ${PROBABILISTIC_LIMITS.inline} or fewer, or start a settlement run (POST /api/projects/{projectId}/settlement-runs), which runs as a job.`,
      data: { code: 'too-many-realizations', limit: PROBABILISTIC_LIMITS.inline },
    })
  }
  if (probabilistic && realizations * planned > PROBABILISTIC_LIMITS.inlineWork) {
    throw createError({
      statusCode: 413,
      statusMessage: 'Payload Too Large',
      message: `${realizations} realisations of ${planned} sublayers are more than this route computes at once (${groupThousands(PROBABILISTIC_LIMITS.inlineWork, ',')} realisation-sublayers). Use thicker sublayers or fewer realisations, or start a settlement run (POST /api/projects/{projectId}/settlement-runs), which runs as a job.`,
      data: { code: 'too-much-work', limit: PROBABILISTIC_LIMITS.inlineWork },
    })
  }
  if (probabilistic) {
    const names = new Set(body.layers.map(l => l.name))
    const unknown = Object.keys(probabilistic.layers).filter(k => !names.has(k))
    if (unknown.length > 0) {
      throw unprocessableError(`probabilistic.layers names ${unknown.map(k => `"${k}"`).join(', ')}, not a layer of the request.`, {
        code: 'layer-unknown',
        issues: unknown.map(k => ({ path: `probabilistic.layers.${k}`, message: 'is not the name of a layer' })),
      })
    }
  }
  const result = runEngine(() => computeSettlement(body))
  const { settlement, convergence, layers, time, times, secondary, warnings } = result
  const reply: SettlementReply = options.sublayers
    ? { ...result, caution: RESULT_CAUTION }
    : { settlement, convergence, layers, time, times, secondary, warnings, caution: RESULT_CAUTION }
  if (probabilistic) reply.probabilistic = probabilisticBlock(body, probabilistic, realizations)
  return reply
}

function probabilisticBlock(body: SettlementRequest, p: NonNullable<SettlementRequest['probabilistic']>, realizations: number): ProbabilisticSettlementReply {
  const seed = p.seed ?? PROBABILISTIC_DEFAULTS.seed
  const mc = runEngine(() => runMonteCarlo(body, {
    realizations,
    seed,
    strata: p.layers,
    ccE0Correlation: p.ccE0Correlation ?? PROBABILISTIC_DEFAULTS.ccE0Correlation,
    limit: p.limit,
  }))
  return {
    realizations: mc.realizations,
    seed,
    mean: mc.mean,
    sd: mc.sd,
    quantiles: mc.quantiles,
    histogram: mc.histogram,
    ...(mc.exceedance ? { exceedance: mc.exceedance } : {}),
    ...(mc.t90 ? { t90: mc.t90 } : {}),
    sensitivity: mc.sensitivity.map(e => ({ layer: e.stratum, variable: e.variable, rankCorrelation: e.rankCorrelation })),
    warnings: mc.warnings,
  }
}
