import { and, asc, count, desc, eq, type SQL, sql } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import type { z } from 'zod'
import type { CreateFlagSchema, FlagListQuerySchema, UpdateFlagSchema } from '#shared/schemas/review'
import { parseFlagTarget, type FlagTarget } from '#shared/review/flags'
import { useDb } from '../db/client'
import { investigationPoints, logIntervals, oedometerTests, preconsolidationAdoptions, reviewFlags, reviewReplies, samples, users, vaneReadings } from '../db/schema'
import { recordAudit } from './audit'
import { notFound, versionedUpdate } from './http-errors'
import { publishLiveEvent } from './live-events'
import { noticeFlagRaised, noticeFlagReply } from './review-notices'

/** The flagged record must belong to the project (checked in the WHERE clause); anything else is 404. */
export async function assertTargetInProject(projectId: string, type: FlagTarget, targetId: string): Promise<void> {
  const target = parseFlagTarget(type, targetId)
  if (!target) notFound('The flagged record')
  const db = useDb()
  const id = target.id
  const inProject = eq(investigationPoints.projectId, projectId)
  let found = false
  if (type === 'preconsolidation-point') {
    found = (await db.select({ id: preconsolidationAdoptions.id }).from(preconsolidationAdoptions).where(and(eq(preconsolidationAdoptions.id, id), eq(preconsolidationAdoptions.projectId, projectId)))).length > 0
  }
  else if (type === 'oedometer-test') {
    found = (await db.select({ id: oedometerTests.id }).from(oedometerTests)
      .innerJoin(samples, eq(samples.id, oedometerTests.sampleId))
      .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
      .where(and(eq(oedometerTests.id, id), inProject))).length > 0
  }
  else if (type === 'log-interval') {
    found = (await db.select({ id: logIntervals.id }).from(logIntervals)
      .innerJoin(investigationPoints, eq(investigationPoints.id, logIntervals.pointId))
      .where(and(eq(logIntervals.id, id), inProject))).length > 0
  }
  else if (type === 'cpt-point') {
    found = (await db.select({ id: investigationPoints.id }).from(investigationPoints).where(and(eq(investigationPoints.id, id), inProject))).length > 0
  }
  else if (type === 'vane-reading') {
    found = (await db.select({ id: vaneReadings.id }).from(vaneReadings)
      .innerJoin(investigationPoints, eq(investigationPoints.id, vaneReadings.pointId))
      .where(and(eq(vaneReadings.id, id), inProject))).length > 0
  }
  if (!found) notFound('The flagged record')
}

/** Open flags that take points out of fits, as recorded in a saved model version. */
export async function flagsInForce(projectId: string) {
  const rows = await useDb().select({ flagId: reviewFlags.id, targetType: reviewFlags.targetType, targetId: reviewFlags.targetId, verdict: reviewFlags.verdict })
    .from(reviewFlags).where(and(eq(reviewFlags.projectId, projectId), eq(reviewFlags.status, 'open')))
  return rows
}

/**
 * The project's review list, newest first, filtered by status, target type, verdict or target. A
 * flagged log interval comes with its hole and depths (null once the interval is gone), so the list
 * needs no look-up per hole.
 */
export async function listFlags(projectId: string, q: z.infer<typeof FlagListQuerySchema>) {
  const where: SQL[] = [eq(reviewFlags.projectId, projectId)]
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
    .leftJoin(investigationPoints, and(eq(investigationPoints.id, logIntervals.pointId), eq(investigationPoints.projectId, projectId)))
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
}

/**
 * A reviewer flags a σ'p point, test or log interval (the target must be the project's: 404
 * otherwise). The same reviewer's open flag with the same verdict on the same target is 409.
 */
export async function createFlag(projectId: string, actorId: string, body: z.infer<typeof CreateFlagSchema>) {
  await assertTargetInProject(projectId, body.targetType, body.targetId)
  return useDb().transaction(async (tx) => {
    // One at a time per target, so two identical requests cannot both pass the check below.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`review-flag:${projectId}:${body.targetType}:${body.targetId}`}))`)
    const [same] = await tx.select({ id: reviewFlags.id }).from(reviewFlags).where(and(
      eq(reviewFlags.projectId, projectId), eq(reviewFlags.targetType, body.targetType), eq(reviewFlags.targetId, body.targetId),
      eq(reviewFlags.verdict, body.verdict), eq(reviewFlags.createdBy, actorId), eq(reviewFlags.status, 'open'),
    )).limit(1)
    if (same) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'You already have an open flag with this verdict on this point: reply in its thread or change it instead.', data: { flagId: same.id } })
    }
    const row = returnedRow(await tx.insert(reviewFlags).values({ ...body, projectId, createdBy: actorId }).returning())
    await recordAudit({ actorId, projectId, action: 'create', entity: 'review-flag', entityId: row.id, after: row }, tx)
    await publishLiveEvent({ type: 'flag.changed', projectId, entityId: row.id }, tx)
    await noticeFlagRaised(tx, actorId, row)
    return row
  })
}

/** One flag of the project with its author and thread. */
export async function flagThread(projectId: string, flagId: string) {
  const db = useDb()
  const [flag] = await db.select({ flag: reviewFlags, author: users.displayName }).from(reviewFlags).leftJoin(users, eq(users.id, reviewFlags.createdBy))
    .where(and(eq(reviewFlags.id, flagId), eq(reviewFlags.projectId, projectId)))
  if (!flag) notFound('Flag')
  const replies = await db.select({ id: reviewReplies.id, body: reviewReplies.body, createdAt: reviewReplies.createdAt, author: users.displayName })
    .from(reviewReplies).leftJoin(users, eq(users.id, reviewReplies.createdBy))
    .where(eq(reviewReplies.flagId, flagId)).orderBy(asc(reviewReplies.createdAt))
  return { flag: { ...flag.flag, author: flag.author }, replies }
}

/** Changes a flag's verdict or comment, or resolves / reopens it (stale version: 409). */
export async function updateFlag(projectId: string, actorId: string, flagId: string, { version, status, ...patch }: z.infer<typeof UpdateFlagSchema>) {
  const scope = and(eq(reviewFlags.id, flagId), eq(reviewFlags.projectId, projectId))
  return useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(reviewFlags).where(scope)
    const statusPatch = status === undefined
      ? {}
      : status === 'resolved' ? { status, resolvedBy: actorId, resolvedAt: new Date() } : { status, resolvedBy: null, resolvedAt: null }
    const row = await versionedUpdate({
      entity: 'Flag',
      update: () => tx.update(reviewFlags).set({ ...patch, ...statusPatch, version: sql`${reviewFlags.version} + 1` }).where(and(scope, eq(reviewFlags.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId, projectId, action: status === 'resolved' ? 'resolve' : status === 'open' ? 'reopen' : 'update', entity: 'review-flag', entityId: flagId, before, after: row }, tx)
    await publishLiveEvent({ type: 'flag.changed', projectId, entityId: flagId }, tx)
    return row
  })
}

/** A reply in a flag's thread. */
export async function replyToFlag(projectId: string, actorId: string, flagId: string, body: string) {
  return useDb().transaction(async (tx) => {
    const [flag] = await tx.select({ id: reviewFlags.id }).from(reviewFlags).where(and(eq(reviewFlags.id, flagId), eq(reviewFlags.projectId, projectId)))
    if (!flag) notFound('Flag')
    const row = returnedRow(await tx.insert(reviewReplies).values({ flagId, body, createdBy: actorId }).returning())
    await recordAudit({ actorId, projectId, action: 'create', entity: 'review-reply', entityId: row.id, after: row }, tx)
    await publishLiveEvent({ type: 'flag.reply', projectId, entityId: flagId }, tx)
    await noticeFlagReply(tx, actorId, flagId, row.id, body)
    return row
  })
}
