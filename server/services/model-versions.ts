import { and, desc, eq } from 'drizzle-orm'
import { buildStressModel } from '#shared/geotech/stress'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { toStressInput } from '#shared/site-model/convert'
import type { ServerModelVersionRow, ServerModelVersionSummary, ServerSiteModelRecord } from '#shared/types/models'
import { type Tx, useDb } from '../db/client'
import { siteModels, siteModelVersions, users } from '../db/schema'
import { notFound } from './http-errors'

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

export async function nextVersionNumber(tx: Tx, modelId: string): Promise<number> {
  const [last] = await tx.select({ version: siteModelVersions.version }).from(siteModelVersions).where(eq(siteModelVersions.modelId, modelId)).orderBy(desc(siteModelVersions.version)).limit(1)
  return (last?.version ?? 0) + 1
}

/** A model whose stresses cannot be computed (σ'v0 ≤ 0 somewhere) is refused with the engine's 422. */
export function assertDefinitionComputable(def: SiteModelDefinition) {
  runEngine(() => buildStressModel(toStressInput(def)))
}
