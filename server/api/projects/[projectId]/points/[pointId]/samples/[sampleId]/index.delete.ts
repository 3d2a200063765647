import { and, eq } from 'drizzle-orm'
import { useDb } from '../../../../../../../db/client'
import { samples } from '../../../../../../../db/schema'
import { recordAudit } from '../../../../../../../services/audit'
import { requirePoint } from '../../../../../../../services/points'
import { notFound } from '../../../../../../../services/versioned'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, sampleId } = validateParams(event, SampleParams)
  await useDb().transaction(async (tx) => {
    const point = await requirePoint(project.id, pointId, tx)
    const [before] = await tx.delete(samples).where(and(eq(samples.id, sampleId), eq(samples.pointId, point.id))).returning()
    if (!before) notFound('Sample')
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'delete', entity: 'sample', entityId: sampleId, before }, tx)
  })
  return { ok: true }
})
