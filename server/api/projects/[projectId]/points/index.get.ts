import { and, asc, count, eq, ilike, type SQL } from 'drizzle-orm'
import { PointListQuerySchema } from '#shared/schemas/investigation'
import { cptSoundings, investigationPoints } from '~~/server/db/schema'
import type { ServerPointPage } from '#shared/types/investigation'

/** The project's investigation points, filtered by identifier search and kind, paged. */
export default defineEventHandler(async (event): Promise<ServerPointPage> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { q, kind, limit, offset } = validateQuery(event, PointListQuerySchema)
  const where: SQL[] = [eq(investigationPoints.projectId, project.id)]
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
})
