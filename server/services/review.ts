import { and, eq } from 'drizzle-orm'
import { parseFlagTarget, type FlagTarget } from '#shared/review/flags'
import { useDb } from '../db/client'
import { investigationPoints, logIntervals, oedometerTests, preconsolidationAdoptions, reviewFlags, samples, vaneReadings } from '../db/schema'
import { notFound } from './http-errors'

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
