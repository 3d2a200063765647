import { and, eq } from 'drizzle-orm'
import { samples } from '~~/server/db/schema'
import { rehomeAttachmentsOf } from '~~/server/services/attachments'
import { recordAudit } from '~~/server/services/audit'
import { requirePoint } from '~~/server/services/points'
import { notFound } from '~~/server/services/http-errors'
import { SampleParamsSchema } from '#shared/schemas/investigation'

/** Deletes a sample with its tests (audited with the sample row); their files move to the project. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, sampleId } = validateParams(event, SampleParamsSchema)
  await useDb().transaction(async (tx) => {
    const point = await requirePoint(project.id, pointId, tx)
    const [found] = await tx.select().from(samples).where(and(eq(samples.id, sampleId), eq(samples.pointId, point.id))).for('update')
    if (!found) notFound('Sample')
    await rehomeAttachmentsOf(tx, { projectId: project.id, actorId: user.id, ownerType: 'sample', ownerId: sampleId, label: `sample ${found.identifier} of ${point.identifier}` })
    const [before] = await tx.delete(samples).where(and(eq(samples.id, sampleId), eq(samples.pointId, point.id))).returning()
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'delete', entity: 'sample', entityId: sampleId, before }, tx)
  })
  return { ok: true }
})
