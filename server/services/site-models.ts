import { and, asc, desc, eq, sql } from 'drizzle-orm'
import { alias } from 'drizzle-orm/pg-core'
import { SITE_MODEL_SCHEMA_VERSION, type SiteModelDefinition } from '#shared/site-model/definition'
import { type Database, type Tx, useDb } from '../db/client'
import { anyOf } from '../db/any'
import { groundwaterObservations, investigationPoints, logIntervals, projects, siteModels, siteModelVersions, strata, users } from '../db/schema'
import type { StressModelInfo } from '#shared/types/lab'
import type { ServerModelInForce } from '#shared/types/model-in-force'

/**
 * A starting model from the project's logs: one band per stratum in display
 * order, each as thick as its mean logged thickness, unit weights from the
 * strata list, and the water table at the median standing level.
 */
export async function definitionFromLogs(projectId: string, db: Database | Tx = useDb()): Promise<SiteModelDefinition> {
  const strataRows = await db.select().from(strata).where(eq(strata.projectId, projectId)).orderBy(asc(strata.displayOrder), asc(strata.code))
  const points = await db.select({ id: investigationPoints.id }).from(investigationPoints).where(eq(investigationPoints.projectId, projectId))
  const ids = points.map(p => p.id)
  const intervals = ids.length ? await db.select({ pointId: logIntervals.pointId, stratumId: logIntervals.stratumId, top: logIntervals.top, bottom: logIntervals.bottom }).from(logIntervals).where(anyOf(logIntervals.pointId, ids)) : []
  const standing = ids.length
    ? await db.select({ depth: groundwaterObservations.depth }).from(groundwaterObservations).where(and(anyOf(groundwaterObservations.pointId, ids), eq(groundwaterObservations.kind, 'standing')))
    : []
  // Thickness of each stratum per hole, then the mean over the holes that log it.
  const perHole = new Map<string, Map<string, number>>()
  for (const iv of intervals) {
    if (!iv.stratumId) continue
    const m = perHole.get(iv.stratumId) ?? new Map<string, number>()
    m.set(iv.pointId, (m.get(iv.pointId) ?? 0) + (iv.bottom - iv.top))
    perHole.set(iv.stratumId, m)
  }
  const bands = strataRows.map((s) => {
    const t = [...(perHole.get(s.id)?.values() ?? [])]
    const thickness = t.length ? t.reduce((a, b) => a + b, 0) / t.length : 1
    return {
      code: s.code,
      name: s.name,
      thickness: Math.round(thickness * 100) / 100,
      unitWeight: s.unitWeight,
      unitWeightSaturated: s.unitWeightSaturated,
      compressible: false,
      cptFactor: 0.33,
    }
  })
  const levels = standing.map(s => s.depth).filter((d): d is number => d !== null).sort((a, b) => a - b)
  const median = levels.length ? levels[Math.floor(levels.length / 2)]! : 1
  return {
    schemaVersion: SITE_MODEL_SCHEMA_VERSION,
    surcharge: 0,
    gammaW: 9.81,
    groundwater: { waterTableDepth: median, piezometers: [] },
    strata: bands.length ? bands : [{ code: 'GROUND', name: 'Ground', thickness: 10, unitWeight: 18, unitWeightSaturated: 19, compressible: false, cptFactor: 0.33 }],
    flagsInForce: [],
  }
}

/** A saved version of the design model as the pages use it: the version in force and its definition. */
export type VersionInForce = Extract<ServerModelInForce, { modelName: string }> & { definition: SiteModelDefinition }

/**
 * The version in force of the project's design model (the one place that decides it): the latest
 * approved version not superseded, else the latest saved version (not yet approved), else null (no
 * design model, or no saved version of it). Drafts never count: they are the canvas's working copy.
 */
export async function versionInForce(projectId: string, db: Database | Tx = useDb()): Promise<VersionInForce | null> {
  const approver = alias(users, 'approver')
  const inForceFirst = sql`case when ${siteModelVersions.status} = 'approved' and ${siteModelVersions.supersededAt} is null then 0 when ${siteModelVersions.status} = 'approved' then 1 else 2 end`
  const [row] = await db.select({
    modelId: siteModels.id,
    modelName: siteModels.name,
    version: siteModelVersions.version,
    status: siteModelVersions.status,
    decidedAt: siteModelVersions.decidedAt,
    approvedBy: approver.displayName,
    definition: siteModelVersions.definition,
  })
    .from(projects)
    .innerJoin(siteModels, and(eq(siteModels.id, projects.designModelId), eq(siteModels.projectId, projects.id)))
    .innerJoin(siteModelVersions, eq(siteModelVersions.modelId, siteModels.id))
    .leftJoin(approver, eq(approver.id, siteModelVersions.decidedBy))
    .where(eq(projects.id, projectId))
    .orderBy(inForceFirst, desc(siteModelVersions.version))
    .limit(1)
  if (!row) return null
  const approved = row.status === 'approved'
  return {
    modelId: row.modelId,
    modelName: row.modelName,
    version: row.version,
    status: row.status,
    approvedAt: approved ? row.decidedAt : null,
    approvedBy: approved ? row.approvedBy : null,
    definition: row.definition,
  }
}

/** GET …/model-in-force: the version in force without its definition, or `{ modelId: null }`. */
export async function modelInForce(projectId: string): Promise<ServerModelInForce> {
  const v = await versionInForce(projectId)
  if (!v) return { modelId: null }
  const { definition: _definition, ...rest } = v
  return rest
}

/** What σ'v0 comes from, in words for the pages. */
export function describeVersionInForce(v: Pick<VersionInForce, 'modelName' | 'version' | 'status'>): string {
  return v.status === 'approved'
    ? `Version ${v.version} of site model "${v.modelName}", approved.`
    : `Version ${v.version} of site model "${v.modelName}", not yet approved.`
}

/** Said when the design model has no saved version: values that need σ'v0 are unavailable. */
export const NO_VERSION_IN_FORCE = 'No saved version of the design model: values that need σ\'v0 are unavailable.'

/**
 * The stress model in force for the project's interpretation pages: the definition of the design
 * model's version in force with what it is, or no definition (σ'v0 unavailable) when there is none.
 */
export async function stressModelInForce(projectId: string): Promise<{ definition: SiteModelDefinition | null, info: StressModelInfo }> {
  const v = await versionInForce(projectId)
  if (!v) return { definition: null, info: { source: 'none', modelId: null, modelName: null, version: null, status: null, description: NO_VERSION_IN_FORCE } }
  return {
    definition: v.definition,
    info: { source: 'version', modelId: v.modelId, modelName: v.modelName, version: v.version, status: v.status, description: describeVersionInForce(v) },
  }
}

export async function latestVersion(modelId: string) {
  const [v] = await useDb().select().from(siteModelVersions).where(eq(siteModelVersions.modelId, modelId)).orderBy(desc(siteModelVersions.version)).limit(1)
  return v ?? null
}
