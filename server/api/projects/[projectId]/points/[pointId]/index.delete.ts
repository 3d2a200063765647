import { and, eq } from 'drizzle-orm'
import { investigationPoints } from '~~/server/db/schema'
import { rehomeAttachmentsOf } from '~~/server/services/attachments'
import { recordAudit } from '~~/server/services/audit'
import { requirePoint } from '~~/server/services/points'
import { PointParamsSchema } from '#shared/schemas/investigation'

/** Deletes a point and everything logged at it (audited with the point row); its files move to the project. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  await useDb().transaction(async (tx) => {
    const before = await requirePoint(project.id, pointId, tx, { lock: true })
    await rehomeAttachmentsOf(tx, { projectId: project.id, actorId: user.id, ownerType: 'point', ownerId: pointId, label: `point ${before.identifier}` })
    await tx.delete(investigationPoints).where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, project.id)))
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'delete', entity: 'point', entityId: pointId, before }, tx)
  })
  return { ok: true }
})
