import { and, eq, sql } from 'drizzle-orm'
import { PointParamsSchema, PointUpdateSchema } from '#shared/schemas/investigation'
import { investigationPoints } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { assertFinalDepthHolds, requirePoint } from '~~/server/services/points'
import { versionedUpdate } from '~~/server/services/http-errors'
import { isUniqueViolation } from '~~/server/utils/db-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const { version, ...patch } = await validateBody(event, PointUpdateSchema)
  try {
    const point = await useDb().transaction(async (tx) => {
      const before = await requirePoint(project.id, pointId, tx, { lock: true })
      // A shallower final depth must still hold everything logged at the point.
      if (patch.finalDepth !== undefined && patch.finalDepth < before.finalDepth) await assertFinalDepthHolds(tx, pointId, patch.finalDepth)
      const row = await versionedUpdate({
        entity: 'Point',
        update: () => tx.update(investigationPoints).set({ ...patch, version: sql`${investigationPoints.version} + 1` })
          .where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, project.id), eq(investigationPoints.version, version))).returning(),
        current: () => before,
      })
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'point', entityId: pointId, before, after: row }, tx)
      return row
    })
    return { point }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${patch.identifier} already exists in this project.`, data: { issues: [{ path: 'identifier', message: 'is already used by another point in this project' }] } })
    throw err
  }
})
