import { and, asc, count, eq, ilike, type SQL, sql } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import type { z } from 'zod'
import { ImportLimitError, PROJECT_POINT_LIMIT } from '#shared/imports/limits'
import { groupThousands } from '#shared/text/count'
import type { PointInput, PointListQuerySchema, PointUpdateSchema } from '#shared/schemas/investigation'
import { useDb } from '../db/client'
import { cptSoundings, investigationPoints } from '../db/schema'
import { rehomeAttachmentsOf } from './attachments'
import { recordAudit } from './audit'
import { conflictOnDuplicate, unprocessableError, versionedUpdate } from './http-errors'
import { holdPointLimit } from './imports/commit'
import { assertFinalDepthHolds, requirePoint } from './points'

/** The project's investigation points, filtered by identifier search and kind, paged. */
export async function listPoints(projectId: string, { q, kind, limit, offset }: z.infer<typeof PointListQuerySchema>) {
  const where: SQL[] = [eq(investigationPoints.projectId, projectId)]
  if (q) where.push(ilike(investigationPoints.identifier, `%${q.replace(/[%_\\]/g, m => `\\${m}`)}%`))
  if (kind) where.push(eq(investigationPoints.kind, kind))
  const db = useDb()
  const [rows, [total]] = await Promise.all([
    db.select({ point: investigationPoints, cptCount: cptSoundings.count })
      .from(investigationPoints)
      .leftJoin(cptSoundings, eq(cptSoundings.pointId, investigationPoints.id))
      .where(and(...where))
      .orderBy(asc(investigationPoints.identifier))
      .limit(limit).offset(offset),
    db.select({ n: count() }).from(investigationPoints).where(and(...where)),
  ])
  return { points: rows.map(r => ({ ...r.point, cptCount: r.cptCount ?? 0 })), total: total?.n ?? 0, limit, offset }
}

/** A new point, within the project's point limit (422) and with an identifier new in the project (409). */
export async function createPoint(projectId: string, actorId: string, body: PointInput) {
  try {
    return await conflictOnDuplicate(() => useDb().transaction(async (tx) => {
      await holdPointLimit(tx, projectId, 1)
      const row = returnedRow(await tx.insert(investigationPoints).values({ ...body, projectId }).returning())
      await recordAudit({ actorId, projectId, action: 'create', entity: 'point', entityId: row.id, after: row }, tx)
      return row
    }), `${body.identifier} already exists in this project.`)
  }
  catch (err) {
    if (err instanceof ImportLimitError) throw unprocessableError(`A project holds at most ${groupThousands(PROJECT_POINT_LIMIT)} points and this one is full; ${body.identifier} was not added.`, { code: err.code })
    throw err
  }
}

/** Edits a point (stale version: 409 with the current row); a shallower final depth must still hold everything logged at it. */
export async function updatePoint(projectId: string, actorId: string, pointId: string, { version, ...patch }: z.infer<typeof PointUpdateSchema>) {
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    const before = await requirePoint(projectId, pointId, tx, { lock: true })
    if (patch.finalDepth !== undefined && patch.finalDepth < before.finalDepth) await assertFinalDepthHolds(tx, pointId, patch.finalDepth)
    const row = await versionedUpdate({
      entity: 'Point',
      update: () => tx.update(investigationPoints).set({ ...patch, version: sql`${investigationPoints.version} + 1` })
        .where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, projectId), eq(investigationPoints.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId, projectId, action: 'update', entity: 'point', entityId: pointId, before, after: row }, tx)
    return row
  }), `${patch.identifier} already exists in this project.`, { issues: [{ path: 'identifier', message: 'is already used by another point in this project' }] })
}

/** Deletes a point and everything logged at it (audited with the point row); its files move to the project. */
export async function deletePoint(projectId: string, actorId: string, pointId: string) {
  await useDb().transaction(async (tx) => {
    const before = await requirePoint(projectId, pointId, tx, { lock: true })
    await rehomeAttachmentsOf(tx, { projectId, actorId, ownerType: 'point', ownerId: pointId, label: `point ${before.identifier}` })
    await tx.delete(investigationPoints).where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, projectId)))
    await recordAudit({ actorId, projectId, action: 'delete', entity: 'point', entityId: pointId, before }, tx)
  })
}
