import { and, eq, isNull } from 'drizzle-orm'
import { isGeotechError } from '#shared/geotech/errors'
import type { OedometerInterpretation } from '#shared/geotech/oedometer'
import { ADOPTION_METHOD_LABELS, AdoptionInputSchema, OedometerTestParamsSchema } from '#shared/schemas/lab'
import { preconsolidationAdoptions } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { unprocessableError } from '~~/server/services/http-errors'
import { adoptionHistory, insituAt, interpretTest, isEngineMethod, requireTest, sampleDepth, stressContext } from '~~/server/services/lab'

/** A named construction's value may differ from the engine's by rounding only. */
const MATCH_TOLERANCE = 0.01

/**
 * Adopts a σ'p for the test with a reason: the adoption in force is superseded (kept in the
 * history), the new one records the sample quality and σ'v0 from the stress model in force now.
 * A value named after one of the constructions must be that construction's σ'p.
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'interpretation.write')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  const body = await validateBody(event, AdoptionInputSchema)
  const stress = await stressContext(project.id)
  const { adoption, superseded } = await useDb().transaction(async (tx) => {
    const ctx = await requireTest(project.id, testId, tx, { lock: true })
    const insitu = insituAt(stress, sampleDepth(ctx.sample))
    let out: OedometerInterpretation | null = null
    try {
      out = interpretTest(ctx.test, insitu.effectiveStress)
    }
    catch (err) {
      // A curve the engine cannot read may still carry the engineer's own value; a named construction needs the engine.
      if (!isGeotechError(err) || isEngineMethod(body.method)) runEngine(() => { throw err })
    }
    if (out && isEngineMethod(body.method)) {
      const r = out.results.find(m => m.method === body.method)
      const label = ADOPTION_METHOD_LABELS[body.method]
      if (!r) throw unprocessableError(`The ${label} construction gives no σ'p on this curve; adopt another method's value, or type one.`, { code: 'method-without-result' })
      if (Math.abs(body.value / r.preconsolidation - 1) > MATCH_TOLERANCE) {
        throw unprocessableError(`The ${label} σ'p of this curve is ${r.preconsolidation.toFixed(1)} kPa, not ${body.value} kPa. Adopt it as it is, or type your own value.`, { code: 'value-does-not-match-method' })
      }
    }
    const now = new Date()
    const [previous] = await tx.update(preconsolidationAdoptions).set({ supersededAt: now })
      .where(and(eq(preconsolidationAdoptions.oedometerTestId, testId), isNull(preconsolidationAdoptions.supersededAt))).returning()
    const [row] = await tx.insert(preconsolidationAdoptions).values({
      projectId: project.id,
      oedometerTestId: testId,
      method: body.method,
      value: body.value,
      reason: body.reason,
      deltaEOverE0: out?.sampleQuality?.deltaEOverE0 ?? null,
      qualityClass: out?.sampleQuality?.class ?? null,
      effectiveStress: insitu.effectiveStress,
      adoptedBy: user.id,
      adoptedAt: now,
    }).returning()
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'adopt', entity: 'preconsolidation-adoption', entityId: row!.id, before: previous ?? null, after: row }, tx)
    return { adoption: row!, superseded: previous ?? null }
  })
  setResponseStatus(event, 201)
  return { adoption: { ...adoption, adoptedByName: user.displayName }, superseded, history: await adoptionHistory(testId) }
})
