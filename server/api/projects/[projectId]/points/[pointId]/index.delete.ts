import { and, eq } from 'drizzle-orm'
import { useDb } from '../../../../../db/client'
import { investigationPoints } from '../../../../../db/schema'
import { rehomeAttachmentsOf } from '../../../../../services/attachments'
import { recordAudit } from '../../../../../services/audit'
import { requirePoint } from '../../../../../services/points'

/** Deletes a point and everything logged at it (audited with the point row); its files move to the project. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParams)
  await useDb().transaction(async (tx) => {
    const before = await requirePoint(project.id, pointId, tx, { lock: true })
    await rehomeAttachmentsOf(tx, { projectId: project.id, actorId: user.id, ownerType: 'point', ownerId: pointId, label: `point ${before.identifier}` })
    await tx.delete(investigationPoints).where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, project.id)))
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'delete', entity: 'point', entityId: pointId, before }, tx)
  })
  return { ok: true }
})
