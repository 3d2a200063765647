import { and, count, desc, eq, sql, type SQL } from 'drizzle-orm'
import { FlagListQuerySchema } from '#shared/schemas/review'
import { investigationPoints, logIntervals, reviewFlags, reviewReplies, users } from '~~/server/db/schema'
import type { ServerReviewFlagPage } from '#shared/types/review'

/**
 * The project's review list, newest first, filtered by status, target type,
 * verdict or target. A flagged log interval comes with its hole and depths
 * (null once the interval is gone), so the list needs no look-up per hole.
 */
export default defineEventHandler(async (event): Promise<ServerReviewFlagPage> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const q = validateQuery(event, FlagListQuerySchema)
  const where: SQL[] = [eq(reviewFlags.projectId, project.id)]
  if (q.status) where.push(eq(reviewFlags.status, q.status))
  if (q.targetType) where.push(eq(reviewFlags.targetType, q.targetType))
  if (q.verdict) where.push(eq(reviewFlags.verdict, q.verdict))
  if (q.targetId) where.push(eq(reviewFlags.targetId, q.targetId))
  const db = useDb()
  const replyCounts = db.select({ flagId: reviewReplies.flagId, n: count().as('n') }).from(reviewReplies).groupBy(reviewReplies.flagId).as('reply_counts')
  const rows = await db.select({
    flag: reviewFlags,
    author: users.displayName,
    replies: replyCounts.n,
    interval: { id: logIntervals.id, top: logIntervals.top, bottom: logIntervals.bottom, uscs: logIntervals.uscs, description: logIntervals.description },
    intervalPoint: { id: investigationPoints.id, identifier: investigationPoints.identifier },
  })
    .from(reviewFlags)
    .leftJoin(users, eq(users.id, reviewFlags.createdBy))
    .leftJoin(replyCounts, eq(replyCounts.flagId, reviewFlags.id))
    // The CASE keeps the uuid cast to interval targets (other targets' ids are not uuids).
    .leftJoin(logIntervals, sql`${logIntervals.id} = case when ${reviewFlags.targetType} = 'log-interval' then ${reviewFlags.targetId}::uuid end`)
    .leftJoin(investigationPoints, and(eq(investigationPoints.id, logIntervals.pointId), eq(investigationPoints.projectId, project.id)))
    .where(and(...where))
    .orderBy(desc(reviewFlags.createdAt))
    .limit(q.limit).offset(q.offset)
  return {
    flags: rows.map(r => ({
      ...r.flag,
      author: r.author,
      replyCount: Number(r.replies ?? 0),
      ...(r.flag.targetType === 'log-interval'
        ? { interval: r.interval && r.intervalPoint ? { ...r.interval, pointId: r.intervalPoint.id, pointIdentifier: r.intervalPoint.identifier } : null }
        : {}),
    })),
    limit: q.limit,
    offset: q.offset,
  }
})
