import { and, desc, eq, isNull, sql } from 'drizzle-orm'
import { parseFlagTarget, VERDICT_LABELS, type FlagTarget, type FlagVerdict } from '#shared/review/flags'
import type { Tx } from '../db/client'
import { auditEvents, investigationPoints, logIntervals, oedometerTests, preconsolidationAdoptions, reviewFlags, reviewReplies } from '../db/schema'
import { notify } from './notify'

interface FlagRef {
  id: string
  projectId: string
  targetType: FlagTarget
  targetId: string
  verdict: FlagVerdict
  comment: string
}

/** The page of a flag's thread. */
const flagLink = (f: Pick<FlagRef, 'id' | 'projectId'>) => `/projects/${f.projectId}/review?status=all&flag=${f.id}`

const metres = (m: number) => String(Number(m.toFixed(2)))

/** What a flag is on, in words, and who owns that work: the engineer of the adopted σ'p, the person who logged the interval. */
async function flagSubject(tx: Tx, f: Pick<FlagRef, 'projectId' | 'targetType' | 'targetId'>): Promise<{ what: string, owners: string[] }> {
  const target = parseFlagTarget(f.targetType, f.targetId)
  if (!target) return { what: 'a record', owners: [] }
  if (f.targetType === 'oedometer-test' || f.targetType === 'preconsolidation-point') {
    const byAdoption = f.targetType === 'preconsolidation-point'
    const [row] = await tx.select({ label: oedometerTests.label, adoptedBy: preconsolidationAdoptions.adoptedBy })
      .from(preconsolidationAdoptions)
      .innerJoin(oedometerTests, eq(oedometerTests.id, preconsolidationAdoptions.oedometerTestId))
      .where(and(
        eq(preconsolidationAdoptions.projectId, f.projectId),
        byAdoption ? eq(preconsolidationAdoptions.id, target.id) : and(eq(preconsolidationAdoptions.oedometerTestId, target.id), isNull(preconsolidationAdoptions.supersededAt)),
      ))
      .orderBy(desc(preconsolidationAdoptions.adoptedAt)).limit(1)
    if (row) return { what: `the adopted σ'p of test ${row.label}`, owners: row.adoptedBy ? [row.adoptedBy] : [] }
    const [test] = await tx.select({ label: oedometerTests.label }).from(oedometerTests).where(eq(oedometerTests.id, target.id))
    return { what: test ? `test ${test.label}` : 'a test', owners: [] }
  }
  if (f.targetType === 'log-interval') {
    const [iv] = await tx.select({ top: logIntervals.top, bottom: logIntervals.bottom, pointId: investigationPoints.id, point: investigationPoints.identifier })
      .from(logIntervals).innerJoin(investigationPoints, eq(investigationPoints.id, logIntervals.pointId))
      .where(and(eq(logIntervals.id, target.id), eq(investigationPoints.projectId, f.projectId)))
    if (!iv) return { what: 'a logged interval', owners: [] }
    // Whoever last saved the hole's log with this interval in it logged it (the log's audit entries hold every row).
    const [logged] = await tx.select({ actorId: auditEvents.actorId }).from(auditEvents)
      .where(and(
        eq(auditEvents.projectId, f.projectId), eq(auditEvents.entity, 'log'), eq(auditEvents.entityId, iv.pointId),
        sql`${auditEvents.after} @> ${JSON.stringify({ intervals: [{ id: target.id }] })}::jsonb`,
      ))
      .orderBy(desc(auditEvents.at), desc(auditEvents.id)).limit(1)
    return { what: `${iv.point} ${metres(iv.top)}–${metres(iv.bottom)} m`, owners: logged?.actorId ? [logged.actorId] : [] }
  }
  if (f.targetType === 'cpt-point') return { what: 'a CPT-derived σ\'p point', owners: [] }
  return { what: 'a vane-derived σ\'p point', owners: [] }
}

/** A flag was raised: the person who adopted the test's σ'p or logged the interval is told (in the flag's transaction). */
export async function noticeFlagRaised(tx: Tx, actorId: string, flag: FlagRef): Promise<void> {
  const { what, owners } = await flagSubject(tx, flag)
  if (owners.length === 0) return
  await notify({
    kind: 'flag-raised',
    projectId: flag.projectId,
    recipients: owners,
    actorId,
    title: `${VERDICT_LABELS[flag.verdict]} flag on ${what}`,
    body: flag.comment,
    link: flagLink(flag),
  }, tx)
}

/** A reply in a flag's thread: the flag's author and everyone who replied before are told (in the reply's transaction). */
export async function noticeFlagReply(tx: Tx, actorId: string, flagId: string, replyId: string, body: string): Promise<void> {
  const [flag] = await tx.select().from(reviewFlags).where(eq(reviewFlags.id, flagId))
  if (!flag) return
  const earlier = await tx.selectDistinct({ userId: reviewReplies.createdBy }).from(reviewReplies)
    .where(and(eq(reviewReplies.flagId, flagId), sql`${reviewReplies.id} <> ${replyId}`))
  const recipients = [flag.createdBy, ...earlier.map(r => r.userId)].filter((id): id is string => !!id)
  if (recipients.length === 0) return
  const { what } = await flagSubject(tx, flag)
  await notify({
    kind: 'flag-reply',
    projectId: flag.projectId,
    recipients,
    actorId,
    title: `New reply on the flag on ${what}`,
    body,
    link: flagLink(flag),
  }, tx)
}
