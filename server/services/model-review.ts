import { and, asc, desc, eq, gt, inArray, isNotNull, isNull, lt, ne } from 'drizzle-orm'
import { roleCan } from '#shared/auth/roles'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import type { ServerBlockingFlag, ServerVersionEvent, ServerVersionReview, VersionReviewer } from '#shared/types/review-lifecycle'
import type { ServerModelVersionRow } from '#shared/types/models'
import { type Tx, useDb } from '../db/client'
import { anyOf } from '../db/any'
import { returnedRow } from '../db/rows'
import {
  type ApprovalFlagRecord, investigationPoints, oedometerTests, preconsolidationAdoptions, projectMembers, reviewFlags, samples,
  type siteModels, siteModelVersionEvents, siteModelVersionReviewers, siteModelVersions, users,
} from '../db/schema'
import { contentHash } from '../utils/content-hash'
import { recordAudit } from './audit'
import { loggedIntervals, sampleDepth, stratumAtLogged } from './lab'
import { publishLiveEvent } from './live-events'
import { notFound, unprocessableError } from './http-errors'
import { requireModel, requireVersion } from './model-versions'
import { notify } from './notify'

type VersionRecord = typeof siteModelVersions.$inferSelect

/** The app page of a saved version: every notice about it links here. */
export function versionPagePath(projectId: string, modelId: string, version: number): string {
  return `/projects/${projectId}/models/${modelId}/versions/${version}`
}

function conflict(message: string, data?: Record<string, unknown>): never {
  throw createError({ statusCode: 409, statusMessage: 'Conflict', message, data })
}

const STATUS_WORDS: Record<VersionRecord['status'], string> = {
  saved: 'saved, not sent for review',
  submitted: 'already submitted for review',
  approved: 'already approved',
  returned: 'returned; save a new version from it and send that one',
}

/** The version row of a project's model, locked for the rest of the transaction (404 when it is not there). */
async function lockVersion(tx: Tx, projectId: string, modelId: string, version: number): Promise<{ model: typeof siteModels.$inferSelect, row: VersionRecord }> {
  const model = await requireModel(projectId, modelId, tx)
  const [row] = await tx.select().from(siteModelVersions)
    .where(and(eq(siteModelVersions.modelId, modelId), eq(siteModelVersions.version, version))).for('update')
  if (!row) notFound(`Version ${version}`)
  return { model, row }
}

/**
 * Sends a saved version for review. Every reviewer must be a member of the project whose role
 * may review (`review.write`) and not the person who saved the version (422 naming the ids
 * that are not); only a version in status `saved` can be sent (409 otherwise).
 */
export async function submitVersion(projectId: string, actorId: string, modelId: string, version: number, body: { message: string, reviewerIds: string[] }): Promise<VersionRecord> {
  const reviewerIds = [...new Set(body.reviewerIds.map(id => id.toLowerCase()))]
  return useDb().transaction(async (tx) => {
    const { model, row } = await lockVersion(tx, projectId, modelId, version)
    if (row.status !== 'saved') conflict(`Version ${version} is ${STATUS_WORDS[row.status]}.`, { status: row.status })
    const members = await tx.select({ userId: projectMembers.userId, role: projectMembers.role, disabledAt: users.disabledAt })
      .from(projectMembers).innerJoin(users, eq(users.id, projectMembers.userId))
      .where(and(eq(projectMembers.projectId, projectId), inArray(projectMembers.userId, reviewerIds)))
    const byId = new Map(members.map(m => [m.userId, m]))
    const problems: { path: string, message: string }[] = []
    for (const [i, id] of reviewerIds.entries()) {
      const m = byId.get(id)
      if (!m) problems.push({ path: `reviewerIds.${i}`, message: `${id} is not a member of this project` })
      else if (!roleCan(m.role, 'review.write')) problems.push({ path: `reviewerIds.${i}`, message: `${id} is a member whose role (${m.role}) cannot review` })
      else if (m.disabledAt) problems.push({ path: `reviewerIds.${i}`, message: `${id} has a disabled account` })
      else if (id === row.createdBy) problems.push({ path: `reviewerIds.${i}`, message: `${id} saved this version and cannot review it` })
    }
    if (problems.length) {
      throw unprocessableError(`These reviewers cannot review this version: ${problems.map(p => p.message).join('; ')}.`, { issues: problems, badIds: problems.map(p => p.path) })
    }
    const now = new Date()
    const saved = returnedRow(await tx.update(siteModelVersions).set({ status: 'submitted', submittedBy: actorId, submittedAt: now })
      .where(eq(siteModelVersions.id, row.id)).returning())
    await tx.insert(siteModelVersionReviewers).values(reviewerIds.map(userId => ({ versionId: row.id, userId })))
    await tx.insert(siteModelVersionEvents).values({ versionId: row.id, kind: 'submitted', actorId, comment: body.message, at: now })
    await recordAudit({ actorId, projectId, action: 'update', entity: 'site-model-version', entityId: row.id, before: { status: row.status }, after: { modelId, version, status: 'submitted', reviewerIds, message: body.message } }, tx)
    await notify({
      kind: 'review-requested',
      projectId,
      recipients: reviewerIds,
      actorId,
      title: `Review requested: ${model.name} version ${version}`,
      body: body.message,
      link: versionPagePath(projectId, modelId, version),
    }, tx)
    await publishLiveEvent({ type: 'version.changed', projectId, entityId: row.id }, tx)
    return saved
  })
}

/**
 * The point ids (σ'p points: adoptions, `cpt:…`, `vane:…`) and oedometer test ids that the
 * version's fits use: each stratum trend's fitted points, each compressibility depth trend's
 * tests, and — for compressibility adopted as the mean of a stratum's tests — the tests logged
 * in that stratum (those reviewer flags had already taken out when the version was saved excepted).
 */
export async function pointsTheFitsUse(projectId: string, def: SiteModelDefinition, tx?: Tx): Promise<{ pointIds: Set<string>, testIds: Set<string> }> {
  const pointIds = new Set<string>()
  const testIds = new Set<string>()
  const meanStrata = new Set<string>()
  for (const s of def.strata) {
    for (const id of s.trend?.includedPointIds ?? []) pointIds.add(id)
    const c = s.compressibility
    for (const t of Object.values(c?.trends ?? {})) for (const id of t?.testIds ?? []) testIds.add(id)
    if (c?.source === 'mean') meanStrata.add(s.code)
  }
  if (meanStrata.size) {
    const db = tx ?? useDb()
    const honoured = new Set(def.flagsInForce.filter(f => f.targetType === 'oedometer-test' && f.verdict === 'exclude').map(f => f.targetId))
    const tests = await db.select({ id: oedometerTests.id, pointId: samples.pointId, top: samples.top, bottom: samples.bottom })
      .from(oedometerTests).innerJoin(samples, eq(samples.id, oedometerTests.sampleId))
      .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
      .where(eq(investigationPoints.projectId, projectId))
    const intervals = await loggedIntervals([...new Set(tests.map(t => t.pointId))])
    for (const t of tests) {
      const code = stratumAtLogged(intervals.get(t.pointId) ?? [], sampleDepth(t))
      if (code && meanStrata.has(code) && !honoured.has(t.id)) testIds.add(t.id)
    }
  }
  return { pointIds, testIds }
}

/**
 * The project's open flags with verdict exclude or questionable on what the version's fits use:
 * a σ'p point, CPT point or vane reading among a trend's fitted points, or an oedometer test that
 * a compressibility value was taken from or whose adopted σ'p (any adoption of it) a trend fitted.
 * A flag on a log interval names no fitted point and does not block.
 */
export async function blockingFlags(projectId: string, def: SiteModelDefinition, tx?: Tx): Promise<ServerBlockingFlag[]> {
  const db = tx ?? useDb()
  const open = await db.select({ flag: reviewFlags, author: users.displayName }).from(reviewFlags)
    .leftJoin(users, eq(users.id, reviewFlags.createdBy))
    .where(and(eq(reviewFlags.projectId, projectId), eq(reviewFlags.status, 'open'), inArray(reviewFlags.verdict, ['exclude', 'questionable'])))
    .orderBy(asc(reviewFlags.createdAt))
  if (!open.length) return []
  const used = await pointsTheFitsUse(projectId, def, tx)
  const flaggedTests = open.filter(o => o.flag.targetType === 'oedometer-test').map(o => o.flag.targetId)
  const adoptionsOfTest = new Map<string, string[]>()
  if (flaggedTests.length) {
    const rows = await db.select({ id: preconsolidationAdoptions.id, testId: preconsolidationAdoptions.oedometerTestId }).from(preconsolidationAdoptions)
      .where(and(eq(preconsolidationAdoptions.projectId, projectId), anyOf(preconsolidationAdoptions.oedometerTestId, flaggedTests)))
    for (const r of rows) adoptionsOfTest.set(r.testId, [...(adoptionsOfTest.get(r.testId) ?? []), r.id])
  }
  const bears = (f: typeof reviewFlags.$inferSelect) => {
    if (f.targetType === 'oedometer-test') return used.testIds.has(f.targetId) || (adoptionsOfTest.get(f.targetId) ?? []).some(id => used.pointIds.has(id))
    if (f.targetType === 'log-interval') return false
    return used.pointIds.has(f.targetId)
  }
  return open.filter(o => bears(o.flag)).map(o => ({
    flagId: o.flag.id,
    targetType: o.flag.targetType,
    targetId: o.flag.targetId,
    verdict: o.flag.verdict,
    comment: o.flag.comment,
    author: o.author,
    createdAt: o.flag.createdAt,
  }))
}

/** The people told of a decision: the submitter, and members who may write models and saved a version of this one or created it. */
async function modelEngineers(tx: Tx, projectId: string, modelId: string, model: { createdBy: string | null }): Promise<string[]> {
  const savers = await tx.selectDistinct({ userId: siteModelVersions.createdBy }).from(siteModelVersions)
    .where(and(eq(siteModelVersions.modelId, modelId), isNotNull(siteModelVersions.createdBy)))
  const ids = [...new Set([...savers.flatMap(s => (s.userId ? [s.userId] : [])), ...(model.createdBy ? [model.createdBy] : [])])]
  if (!ids.length) return []
  const members = await tx.select({ userId: projectMembers.userId, role: projectMembers.role }).from(projectMembers)
    .where(and(eq(projectMembers.projectId, projectId), inArray(projectMembers.userId, ids)))
  return members.filter(m => roleCan(m.role, 'model.write')).map(m => m.userId)
}

/**
 * A reviewer approves or returns a submitted version (409 unless it is submitted). The person
 * who saved it cannot approve it (403). Approval is refused (409, `code: 'open-flags'`, with the
 * flags) while open exclude/questionable flags stand on what its fits use, unless an override
 * reason is given; the approval records the definition's content hash, the override and those
 * flags, and supersedes the model's previously approved version.
 */
export async function decideVersion(projectId: string, actorId: string, modelId: string, version: number, body: { decision: 'approve' | 'return', comment: string, override?: string }): Promise<VersionRecord> {
  return useDb().transaction(async (tx) => {
    const { model, row } = await lockVersion(tx, projectId, modelId, version)
    if (row.status !== 'submitted') {
      conflict(`Version ${version} is ${row.status === 'saved' ? 'not submitted for review' : row.status === 'approved' ? 'already approved' : 'already returned'}: only a submitted version can be approved or returned.`, { status: row.status })
    }
    const now = new Date()
    const link = versionPagePath(projectId, modelId, version)
    const recipients = [...(row.submittedBy ? [row.submittedBy] : []), ...await modelEngineers(tx, projectId, modelId, model)]
    if (body.decision === 'return') {
      const saved = returnedRow(await tx.update(siteModelVersions).set({ status: 'returned', decidedBy: actorId, decidedAt: now, decisionComment: body.comment })
        .where(eq(siteModelVersions.id, row.id)).returning())
      await tx.insert(siteModelVersionEvents).values({ versionId: row.id, kind: 'returned', actorId, comment: body.comment, at: now })
      await recordAudit({ actorId, projectId, action: 'update', entity: 'site-model-version', entityId: row.id, before: { status: row.status }, after: { modelId, version, status: 'returned', comment: body.comment } }, tx)
      await notify({ kind: 'version-returned', projectId, recipients, actorId, title: `Returned: ${model.name} version ${version}`, body: body.comment, link }, tx)
      await publishLiveEvent({ type: 'version.changed', projectId, entityId: row.id }, tx)
      return saved
    }
    if (row.createdBy === actorId) {
      throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: `You saved version ${version}, so you cannot approve it: another reviewer must (separation of duties).` })
    }
    const blocking = await blockingFlags(projectId, row.definition, tx)
    const override = body.override ?? null
    if (blocking.length && !override) {
      conflict(`${blocking.length} open flag${blocking.length === 1 ? '' : 's'} (exclude or questionable) stand on points the fits of version ${version} use. Resolve them, or give the reason for approving anyway.`, { code: 'open-flags', flags: blocking })
    }
    const approvalFlags: ApprovalFlagRecord[] = blocking.map(f => ({ flagId: f.flagId, targetType: f.targetType, targetId: f.targetId, verdict: f.verdict, comment: f.comment }))
    const saved = returnedRow(await tx.update(siteModelVersions).set({
      status: 'approved',
      decidedBy: actorId,
      decidedAt: now,
      decisionComment: body.comment,
      approvalHash: contentHash(row.definition),
      approvalOverride: blocking.length ? override : null,
      approvalFlags,
    }).where(eq(siteModelVersions.id, row.id)).returning())
    await tx.insert(siteModelVersionEvents).values({ versionId: row.id, kind: 'approved', actorId, comment: [body.comment, blocking.length ? `Approved over ${blocking.length} open flag${blocking.length === 1 ? '' : 's'}: ${body.override}` : ''].filter(Boolean).join('\n'), at: now })
    // A newer approval supersedes older ones; approving an older version while a newer one stands approved leaves the newer in force.
    const [newer] = await tx.select({ version: siteModelVersions.version }).from(siteModelVersions)
      .where(and(eq(siteModelVersions.modelId, modelId), eq(siteModelVersions.status, 'approved'), gt(siteModelVersions.version, version)))
      .orderBy(desc(siteModelVersions.version)).limit(1)
    const superseded = newer
      ? [saved]
      : await tx.select().from(siteModelVersions)
          .where(and(eq(siteModelVersions.modelId, modelId), eq(siteModelVersions.status, 'approved'), isNull(siteModelVersions.supersededAt), lt(siteModelVersions.version, version), ne(siteModelVersions.id, row.id)))
    const by = newer ? newer.version : version
    for (const old of superseded) {
      await tx.update(siteModelVersions).set({ supersededAt: now, supersededBy: by }).where(eq(siteModelVersions.id, old.id))
      await tx.insert(siteModelVersionEvents).values({ versionId: old.id, kind: 'superseded', actorId, comment: `Version ${by} is approved.`, at: now })
      await recordAudit({ actorId, projectId, action: 'update', entity: 'site-model-version', entityId: old.id, after: { modelId, version: old.version, supersededBy: by } }, tx)
    }
    await recordAudit({ actorId, projectId, action: 'update', entity: 'site-model-version', entityId: row.id, before: { status: row.status }, after: { modelId, version, status: 'approved', hash: saved.approvalHash, override: saved.approvalOverride, flags: approvalFlags.map(f => f.flagId) } }, tx)
    await notify({ kind: 'version-approved', projectId, recipients, actorId, title: `Approved: ${model.name} version ${version}`, body: [body.comment, blocking.length ? `Approved over open flags: ${body.override}` : ''].filter(Boolean).join('\n\n'), link }, tx)
    await publishLiveEvent({ type: 'version.changed', projectId, entityId: row.id }, tx)
    return returnedRow(await tx.select().from(siteModelVersions).where(eq(siteModelVersions.id, row.id)))
  })
}

/** A saved version's review: names, the reviewers, the timeline and (while submitted) the flags that block approval. */
export async function versionReview(projectId: string, v: ServerModelVersionRow): Promise<ServerVersionReview> {
  const db = useDb()
  const names = async (id: string | null) => id ? (await db.select({ n: users.displayName }).from(users).where(eq(users.id, id)))[0]?.n ?? null : null
  const [reviewers, timeline, submittedBy, decidedBy, blocking] = await Promise.all([
    db.select({ userId: users.id, displayName: users.displayName }).from(siteModelVersionReviewers)
      .innerJoin(users, eq(users.id, siteModelVersionReviewers.userId))
      .where(eq(siteModelVersionReviewers.versionId, v.id)).orderBy(asc(users.displayName)) as Promise<VersionReviewer[]>,
    db.select({ id: siteModelVersionEvents.id, kind: siteModelVersionEvents.kind, actor: users.displayName, comment: siteModelVersionEvents.comment, at: siteModelVersionEvents.at })
      .from(siteModelVersionEvents).leftJoin(users, eq(users.id, siteModelVersionEvents.actorId))
      .where(eq(siteModelVersionEvents.versionId, v.id)).orderBy(asc(siteModelVersionEvents.at), asc(siteModelVersionEvents.kind)) as Promise<ServerVersionEvent[]>,
    names(v.submittedBy),
    names(v.decidedBy),
    v.status === 'submitted' ? blockingFlags(projectId, v.definition) : Promise.resolve([]),
  ])
  return { superseded: v.supersededAt !== null, submittedBy, decidedBy, reviewers, timeline, blockingFlags: blocking }
}

/** GET …/versions/:version: the version with its review. */
export async function versionWithReview(projectId: string, modelId: string, version: number) {
  const model = await requireModel(projectId, modelId)
  const v = await requireVersion(modelId, version)
  return { model: { id: model.id, name: model.name }, version: v, review: await versionReview(projectId, v) }
}

/** The approval an export carries: who approved the version, when, and the hash of its definition. */
export async function approvalOf(v: Pick<VersionRecord, 'status' | 'decidedBy' | 'decidedAt' | 'approvalHash'>): Promise<{ by: string | null, at: string, hash: string } | null> {
  if (v.status !== 'approved' || !v.approvalHash || !v.decidedAt) return null
  const [u] = v.decidedBy ? await useDb().select({ n: users.displayName }).from(users).where(eq(users.id, v.decidedBy)) : []
  return { by: u?.n ?? null, at: v.decidedAt.toISOString(), hash: v.approvalHash }
}
