import { and, eq, isNull, sql } from 'drizzle-orm'
import { OedometerTestParamsSchema, OedometerTestUpdateSchema } from '#shared/schemas/lab'
import { oedometerTests, preconsolidationAdoptions } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { prepareSpecimen, requireTest, testJson } from '~~/server/services/lab'
import { versionedUpdate } from '~~/server/services/http-errors'

/**
 * Edits a test (version → 409 with the current test). When the curve changes (stages, convention,
 * e0, specimen height), the σ'p adopted from the old curve is withdrawn: it is marked superseded
 * and stays in the history, and the test needs a new adoption.
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  const { version, ...patch } = await validateBody(event, OedometerTestUpdateSchema)
  const result = await useDb().transaction(async (tx) => {
    const ctx = await requireTest(project.id, testId, tx, { lock: true })
    const before = ctx.test
    if (before.version !== version) {
      throw createError({
        statusCode: 409,
        statusMessage: 'Conflict',
        message: 'This test was changed by someone else since you opened it. Review their version and apply your change again.',
        data: { current: testJson(ctx) },
      })
    }
    const specimen = {
      specimenHeight: patch.specimenHeight ?? before.specimenHeight,
      initialWaterContent: patch.initialWaterContent !== undefined ? patch.initialWaterContent : before.initialWaterContent,
      specificGravity: patch.specificGravity !== undefined ? patch.specificGravity : before.specificGravity,
      e0: patch.e0 !== undefined ? patch.e0 : before.e0,
      convention: patch.convention ?? before.convention,
      stages: patch.stages ?? before.stages.map(s => ({ stress: s.stress, value: s.entered, ...(s.readings ? { readings: s.readings } : {}) })),
    }
    const prepared = prepareSpecimen(specimen)
    const curveChanged = prepared.e0 !== before.e0 || JSON.stringify(prepared.stages) !== JSON.stringify(before.stages)
    const row = await versionedUpdate({
      entity: 'Oedometer test',
      update: () => tx.update(oedometerTests).set({
        ...(patch.label !== undefined ? { label: patch.label } : {}),
        ...(patch.testType !== undefined ? { testType: patch.testType } : {}),
        ...(patch.remarks !== undefined ? { remarks: patch.remarks } : {}),
        specimenHeight: specimen.specimenHeight,
        initialWaterContent: specimen.initialWaterContent,
        specificGravity: specimen.specificGravity,
        convention: specimen.convention,
        e0: prepared.e0,
        stages: prepared.stages,
        version: sql`${oedometerTests.version} + 1`,
      }).where(and(eq(oedometerTests.id, testId), eq(oedometerTests.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'oedometer-test', entityId: testId, before, after: row }, tx)
    let withdrawn = null
    if (curveChanged) {
      const [w] = await tx.update(preconsolidationAdoptions).set({ supersededAt: new Date() })
        .where(and(eq(preconsolidationAdoptions.oedometerTestId, testId), isNull(preconsolidationAdoptions.supersededAt))).returning()
      if (w) {
        withdrawn = w
        await recordAudit({ actorId: user.id, projectId: project.id, action: 'withdraw', entity: 'preconsolidation-adoption', entityId: w.id, before: { ...w, supersededAt: null }, after: w }, tx)
      }
    }
    return { test: { ...ctx, test: row }, withdrawn, notes: prepared.notes }
  })
  return { test: testJson(result.test), adoptionWithdrawn: result.withdrawn, notes: result.notes }
})
