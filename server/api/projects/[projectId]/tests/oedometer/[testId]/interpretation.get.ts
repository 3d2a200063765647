import { RESULT_CAUTION } from '#shared/caution'
import { OedometerTestParamsSchema } from '#shared/schemas/lab'
import { adoptionHistory, ccCheck, insituAt, interpretTest, requireTest, sampleDepth, stressContext, testJson, timeAnalysis, timeSummary } from '~~/server/services/lab'
import type { ServerOedometerInterpretationReply } from '#shared/types/lab'

/**
 * The four σ'p constructions side by side with Cc, Cr, sample quality at σ'v0 (from the stress
 * model in force, at the sample's mid-depth), cv and Cα from time readings, the liquid-limit check
 * on Cc, and the adoption in force with its history. A curve with no yield is 422 with the
 * engine's message.
 */
export default defineEventHandler(async (event): Promise<ServerOedometerInterpretationReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  const ctx = await requireTest(project.id, testId)
  const stress = await stressContext(project.id)
  const insitu = insituAt(stress, sampleDepth(ctx.sample))
  const out = runEngine(() => interpretTest(ctx.test, insitu.effectiveStress))
  const warnings = [...out.warnings]
  if (insitu.effectiveStress === null) {
    warnings.push(`The stress model in force does not reach ${insitu.depth.toFixed(2)} m (or gives σ'v0 ≤ 0 there): no σ'v0, OCR or sample quality.`)
  }
  const [history, cc] = await Promise.all([adoptionHistory(testId), ccCheck(ctx, out.cc)])
  const adoption = history.find(a => a.supersededAt === null) ?? null
  const casagrande = out.results.find(r => r.method === 'casagrande')?.preconsolidation ?? null
  const time = timeAnalysis(ctx.test)
  const summary = timeSummary(time, adoption?.value ?? casagrande)
  const sigmaV0 = insitu.effectiveStress
  return {
    test: testJson(ctx),
    stressModel: { ...stress.info, ...insitu },
    e0: out.e0,
    cc: out.cc,
    cr: out.cr,
    recompressionBasis: out.recompressionBasis,
    virginLine: out.virginLine,
    loading: out.loading,
    loops: out.loops,
    methods: out.results.map(r => ({ ...r, ocr: sigmaV0 ? r.preconsolidation / sigmaV0 : null, pop: sigmaV0 ? r.preconsolidation - sigmaV0 : null })),
    sampleQuality: out.sampleQuality ?? null,
    timeCurves: {
      method: 'taylor-sqrt-t' as const,
      reference: 'cv by Taylor\'s √t method (Taylor 1948), Tv90 = 0.848, double drainage with Hdr = half the mean specimen height over the stage; Cα = Δe per log cycle of time after Taylor\'s t100 (common practice).',
      stages: time,
      summary,
      calphaOverCc: summary.virgin.calpha !== null && out.cc > 0 ? summary.virgin.calpha / out.cc : null,
    },
    ccCheck: cc,
    warnings,
    adoption,
    history,
    caution: RESULT_CAUTION,
  }
})
