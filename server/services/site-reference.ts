import { eq } from 'drizzle-orm'
import { siteReference, type SiteReference } from '#shared/investigation/reference'
import { useDb } from '../db/client'
import { groundwaterObservations, indexTests, investigationPoints, logIntervals, samples, strata } from '../db/schema'

/**
 * The stress workspace's reference layers for a whole project in four queries
 * (points, intervals with their stratum code, samples with a bulk unit weight,
 * groundwater), instead of one request per point.
 */
export async function projectSiteReference(projectId: string): Promise<SiteReference> {
  const db = useDb()
  const inProject = eq(investigationPoints.projectId, projectId)
  const [points, intervals, sampleRows, groundwater] = await Promise.all([
    db.select({ id: investigationPoints.id, identifier: investigationPoints.identifier, kind: investigationPoints.kind, finalDepth: investigationPoints.finalDepth })
      .from(investigationPoints).where(inProject),
    db.select({ pointId: logIntervals.pointId, top: logIntervals.top, stratumCode: strata.code })
      .from(logIntervals)
      .innerJoin(investigationPoints, eq(investigationPoints.id, logIntervals.pointId))
      .leftJoin(strata, eq(strata.id, logIntervals.stratumId))
      .where(inProject),
    db.select({ pointId: samples.pointId, identifier: samples.identifier, top: samples.top, bottom: samples.bottom, bulkUnitWeight: indexTests.bulkUnitWeight })
      .from(samples)
      .innerJoin(investigationPoints, eq(investigationPoints.id, samples.pointId))
      .innerJoin(indexTests, eq(indexTests.sampleId, samples.id))
      .where(inProject),
    db.select({ id: groundwaterObservations.id, pointId: groundwaterObservations.pointId, kind: groundwaterObservations.kind, observedAt: groundwaterObservations.observedAt, depth: groundwaterObservations.depth, pressure: groundwaterObservations.pressure })
      .from(groundwaterObservations)
      .innerJoin(investigationPoints, eq(investigationPoints.id, groundwaterObservations.pointId))
      .where(inProject),
  ])
  return siteReference({ points, intervals, samples: sampleRows, groundwater })
}
