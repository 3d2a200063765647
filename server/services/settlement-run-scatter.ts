import { fitTrend, type TrendCovariance } from '#shared/geotech/trends'
import type { RunDrains } from '#shared/schemas/settlement-runs'
import type { TestCompressibility } from '#shared/site-model/compressibility'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { scatterFromTests, type RunScatterData } from '#shared/settlement-run/probabilistic'
import type { RunScatterReply } from '#shared/types/settlement-runs'
import { stressContextOf } from './lab'
import { requireModel, requireVersion } from './model-versions'
import { listTests } from './oedometer-tests'
import { allPreconsolidationPoints } from './preconsolidation-points'

/**
 * "From the data": the COVs of a model version's compressible strata from the project's interpreted
 * oedometer tests (the tests each stratum's compressibility is adopted from, with the reviewer
 * exclusions the version recorded), and each fitted σ'p trend's parameter covariance, refitted to
 * the version's included σ'p points through the version's own stresses. The pure part is
 * `scatterFromTests` (shared/settlement-run/probabilistic.ts).
 */

/** Tests read for the COVs: the list's own page bound, generous for one project. */
const TEST_LIMIT = 10_000
/** The σ'p points' CPT spacing, as the stress canvas reads them (the query's default). */
const CPT_SPACING = 0.25

/** Oedometer-test exclusions in force when the version was saved. */
function excludedTests(def: SiteModelDefinition): Set<string> {
  return new Set(def.flagsInForce.filter(f => f.targetType === 'oedometer-test' && f.verdict === 'exclude').map(f => f.targetId))
}

/** Each fitted (not hand-drawn) σ'p trend's covariance, refitted to the points it names; a stratum whose refit fails is left out. */
async function trendCovariances(projectId: string, def: SiteModelDefinition): Promise<Record<string, TrendCovariance>> {
  const fitted = def.strata.filter(s => s.compressible && s.trend && !s.trend.manual && s.trend.includedPointIds.length > 0)
  if (fitted.length === 0) return {}
  const ctx = stressContextOf(def, { source: 'given', modelId: null, modelName: null, version: null, status: null, description: 'The run\'s model version.' })
  const { points } = await allPreconsolidationPoints(projectId, ctx, { spacing: CPT_SPACING, dense: false })
  const byId = new Map(points.map(p => [p.id, p]))
  const out: Record<string, TrendCovariance> = {}
  for (const s of fitted) {
    const t = s.trend
    if (!t) continue
    const used: { depth: number, preconsolidation: number, effectiveStress: number }[] = []
    for (const id of t.includedPointIds) {
      const p = byId.get(id)
      if (p && p.effectiveStress !== null) used.push({ depth: p.depth, preconsolidation: p.preconsolidation, effectiveStress: p.effectiveStress })
    }
    if (used.length < 2) continue
    try {
      const fit = fitTrend(used, {
        model: t.model,
        logSpace: t.logSpace,
        ...(t.crustBelow ? { crustBelow: t.crustBelow } : {}),
        effectiveStressAt: z => ctx.at(z)?.effectiveStress ?? Number.NaN,
      })
      const names = fit.covariance?.names ?? []
      const finite = fit.covariance?.matrix.every(row => row.every(Number.isFinite)) ?? false
      if (fit.covariance && finite && names.every(n => t.parameters[n] !== undefined)) out[s.code] = fit.covariance
    }
    catch {
      // A fit that cannot be repeated (too few points, singular): σ'p then scatters by its default COV.
    }
  }
  return out
}

/** The data behind "from the data" for a definition: per-stratum COVs and the σ'p fits' covariances. */
export async function runScatterData(projectId: string, def: SiteModelDefinition, drains: RunDrains | null | undefined): Promise<RunScatterData> {
  const [list, trends] = await Promise.all([
    listTests(projectId, { limit: TEST_LIMIT, offset: 0 }),
    trendCovariances(projectId, def),
  ])
  const tests: TestCompressibility[] = list.tests.map(t => ({
    id: t.id, stratumCode: t.stratumCode, depth: t.depth, qualityClass: t.reading.qualityClass,
    cc: t.reading.cc, cr: t.reading.cr, e0: t.e0, cv: t.reading.cv, calpha: t.reading.calpha,
  }))
  return { strata: scatterFromTests(def, tests, excludedTests(def), trends, drains), trends }
}

/** GET …/settlement-runs/scatter: 404 for a model or version not of this project. */
export async function settlementRunScatter(projectId: string, modelId: string, version: number): Promise<RunScatterReply> {
  await requireModel(projectId, modelId)
  const v = await requireVersion(modelId, version)
  const data = await runScatterData(projectId, v.definition, null)
  return { strata: data.strata }
}
