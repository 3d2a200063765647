import { eq } from 'drizzle-orm'
import { OedometerTestParams } from '#shared/schemas/lab'
import { useDb } from '../../../../../../db/client'
import { oedometerTests } from '../../../../../../db/schema'
import { recordAudit } from '../../../../../../services/audit'
import { requireTest } from '../../../../../../services/lab'

/** Deletes a test and its adoption history (audited with the test row). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { testId } = validateParams(event, OedometerTestParams)
  await useDb().transaction(async (tx) => {
    const { test } = await requireTest(project.id, testId, tx, { lock: true })
    await tx.delete(oedometerTests).where(eq(oedometerTests.id, test.id))
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'delete', entity: 'oedometer-test', entityId: testId, before: test }, tx)
  })
  return { ok: true }
})
