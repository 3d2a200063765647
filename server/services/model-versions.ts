import { and, desc, eq } from 'drizzle-orm'
import { buildStressModel } from '#shared/geotech/stress'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { toStressInput } from '#shared/site-model/convert'
import { diffDefinitions } from '#shared/site-model/diff'
import { definitionTrendProblems, trendProblemWords, unacceptedProblems } from '#shared/site-model/trend-checks'
import type { ServerModelVersionRow, ServerModelVersionSummary, ServerSiteModelRecord } from '#shared/types/models'
import { type Tx, useDb } from '../db/client'
import { siteModels, siteModelVersions, users } from '../db/schema'
import { notFound, unprocessableError } from './http-errors'

export async function requireModel(projectId: string, modelId: string, tx?: Tx): Promise<ServerSiteModelRecord> {
  const db = tx ?? useDb()
  const [m] = await db.select().from(siteModels).where(and(eq(siteModels.id, modelId), eq(siteModels.projectId, projectId)))
  if (!m) notFound('Model')
  return m
}

export async function requireVersion(modelId: string, version: number, tx?: Tx): Promise<ServerModelVersionRow> {
  const db = tx ?? useDb()
  const [v] = await db.select({ v: siteModelVersions, author: users.displayName }).from(siteModelVersions)
    .leftJoin(users, eq(users.id, siteModelVersions.createdBy))
    .where(and(eq(siteModelVersions.modelId, modelId), eq(siteModelVersions.version, version)))
  if (!v) notFound(`Version ${version}`)
  return { ...v.v, author: v.author }
}

export async function listVersions(modelId: string): Promise<ServerModelVersionSummary[]> {
  const rows = await useDb().select({ version: siteModelVersions.version, message: siteModelVersions.message, status: siteModelVersions.status, createdAt: siteModelVersions.createdAt, author: users.displayName, supersededAt: siteModelVersions.supersededAt })
    .from(siteModelVersions).leftJoin(users, eq(users.id, siteModelVersions.createdBy))
    .where(eq(siteModelVersions.modelId, modelId)).orderBy(desc(siteModelVersions.version))
  return rows.map(({ supersededAt, ...r }) => ({ ...r, superseded: supersededAt !== null }))
}

/** A model whose stresses cannot be computed (σ'v0 ≤ 0 somewhere) is refused with the engine's 422. */
export function assertDefinitionComputable(def: SiteModelDefinition) {
  runEngine(() => buildStressModel(toStressInput(def)))
}

/** The model's latest saved version (number and definition), if any. */
export async function latestVersion(tx: Tx, modelId: string): Promise<{ version: number, definition: SiteModelDefinition } | null> {
  const [last] = await tx.select({ version: siteModelVersions.version, definition: siteModelVersions.definition }).from(siteModelVersions)
    .where(eq(siteModelVersions.modelId, modelId)).orderBy(desc(siteModelVersions.version)).limit(1)
  return last ?? null
}

/** A version identical to the one before it (reviewer flags in force included) says nothing new: 409. */
export function assertChangedSince(previous: { version: number, definition: SiteModelDefinition } | null, definition: SiteModelDefinition) {
  if (!previous || diffDefinitions(previous.definition, definition).length > 0) return
  throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Nothing changed since version ${previous.version}: change the draft before saving a new version.` })
}

/**
 * A fitted trend with R² < 0, or σ'p below σ'v0 or at or below 0 inside its stratum, is saved
 * only with the engineer's reason for keeping it (`trend.acceptedDespite`); else 422 naming it.
 */
export function assertTrendProblemsAnswered(def: SiteModelDefinition) {
  for (const s of runEngine(() => definitionTrendProblems(def))) {
    const stratum = def.strata[s.band]
    const open = stratum ? unacceptedProblems(stratum, s.problems) : []
    if (!open.length) continue
    throw unprocessableError(`The σ'p trend of ${s.code} needs a look before it is saved: ${open.map(p => trendProblemWords(p)).join('; ')}. Fit it again, or give the reason to keep it.`, { code: 'trend-problem', stratum: s.code, problems: open.map(p => p.code) })
  }
}
