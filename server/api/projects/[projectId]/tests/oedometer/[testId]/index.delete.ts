import { eq } from 'drizzle-orm'
import { OedometerTestParamsSchema } from '#shared/schemas/lab'
import { oedometerTests } from '~~/server/db/schema'
import { rehomeAttachmentsOf } from '~~/server/services/attachments'
import { recordAudit } from '~~/server/services/audit'
import { requireTest } from '~~/server/services/lab'

/** Deletes a test and its adoption history (audited with the test row); its files move to the project. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { testId } = validateParams(event, OedometerTestParamsSchema)
  await useDb().transaction(async (tx) => {
    const { test, sample, point } = await requireTest(project.id, testId, tx, { lock: true })
    await rehomeAttachmentsOf(tx, { projectId: project.id, actorId: user.id, ownerType: 'test', ownerId: test.id, label: `the oedometer test on ${point.identifier} ${sample.identifier}` })
    await tx.delete(oedometerTests).where(eq(oedometerTests.id, test.id))
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'delete', entity: 'oedometer-test', entityId: testId, before: test }, tx)
  })
  return { ok: true }
})
