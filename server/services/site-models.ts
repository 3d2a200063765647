import { and, asc, desc, eq } from 'drizzle-orm'
import { SITE_MODEL_SCHEMA_VERSION, type SiteModelDefinition } from '#shared/site-model/definition'
import { type Database, type Tx, useDb } from '../db/client'
import { anyOf } from '../db/any'
import { groundwaterObservations, investigationPoints, logIntervals, siteModels, siteModelVersions, strata } from '../db/schema'

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

export interface StressModelInfo {
  /** The latest saved draft, the logs (no model yet), or a definition sent with the request. */
  source: 'draft' | 'logs' | 'given'
  modelId: string | null
  modelName: string | null
  /** How σ'v0 was obtained, in words for the page. */
  description: string
}

/**
 * The stress model in force for the project's interpretation pages (the one
 * place that decides it): the most recently edited model's draft, or a model
 * built from the logs when there is none yet, with what it is in words.
 */
export async function stressModelInForce(projectId: string): Promise<{ definition: SiteModelDefinition, info: StressModelInfo }> {
  const [model] = await useDb().select({ id: siteModels.id, name: siteModels.name, draft: siteModels.draft }).from(siteModels).where(eq(siteModels.projectId, projectId)).orderBy(desc(siteModels.updatedAt)).limit(1)
  if (model) {
    return { definition: model.draft, info: { source: 'draft', modelId: model.id, modelName: model.name, description: `Site model "${model.name}" (its current draft).` } }
  }
  const definition = await definitionFromLogs(projectId)
  const description = `No site model yet: strata at their mean logged thickness, hydrostatic pore pressure below the median standing level (${definition.groundwater.waterTableDepth} m).`
  return { definition, info: { source: 'logs', modelId: null, modelName: null, description } }
}

export async function latestVersion(modelId: string) {
  const [v] = await useDb().select().from(siteModelVersions).where(eq(siteModelVersions.modelId, modelId)).orderBy(desc(siteModelVersions.version)).limit(1)
  return v ?? null
}
