import { and, asc, eq } from 'drizzle-orm'
import { checkIntervals } from '#shared/investigation/intervals'
import { useDb } from '../db/client'
import { cptSoundings, groundwaterObservations, indexTests, investigationPoints, logIntervals, samples, sptResults, vaneReadings } from '../db/schema'
import type { Tx } from './audit'
import { notFound } from './versioned'

export type PointRow = typeof investigationPoints.$inferSelect

/**
 * The point in the route, scoped to the project in the WHERE clause (another
 * project's point is 404). `lock` takes a row lock so concurrent edits of one
 * hole's log are serialised.
 */
export async function requirePoint(projectId: string, pointId: string, tx?: Tx, opts: { lock?: boolean } = {}): Promise<PointRow> {
  const db = tx ?? useDb()
  const q = db.select().from(investigationPoints).where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, projectId)))
  const [row] = opts.lock ? await q.for('update') : await q
  if (!row) notFound('Point')
  return row
}

/** Everything logged at one point except the CPT arrays (which come on their own route). */
export async function pointDetail(point: PointRow) {
  const db = useDb()
  const [intervals, sampleRows, spt, groundwater, vane, cpt] = await Promise.all([
    db.select().from(logIntervals).where(eq(logIntervals.pointId, point.id)).orderBy(asc(logIntervals.top)),
    db.select({ sample: samples, index: indexTests }).from(samples).leftJoin(indexTests, eq(indexTests.sampleId, samples.id)).where(eq(samples.pointId, point.id)).orderBy(asc(samples.top)),
    db.select().from(sptResults).where(eq(sptResults.pointId, point.id)).orderBy(asc(sptResults.depth)),
    db.select().from(groundwaterObservations).where(eq(groundwaterObservations.pointId, point.id)).orderBy(asc(groundwaterObservations.observedAt)),
    db.select().from(vaneReadings).where(eq(vaneReadings.pointId, point.id)).orderBy(asc(vaneReadings.depth)),
    db.select({ id: cptSoundings.id, areaRatio: cptSoundings.areaRatio, count: cptSoundings.count, version: cptSoundings.version }).from(cptSoundings).where(eq(cptSoundings.pointId, point.id)),
  ])
  return {
    point,
    intervals,
    gaps: checkIntervals(intervals, point.finalDepth).gaps,
    samples: sampleRows.map(r => ({ ...r.sample, index: r.index })),
    spt,
    groundwater,
    vane,
    cpt: cpt[0] ?? null,
  }
}

/** 422 with per-row issues when a log breaks the interval rules (shared/investigation/intervals.ts). */
export function assertLogValid(intervals: { top: number, bottom: number }[], finalDepth: number) {
  const { issues } = checkIntervals(intervals, finalDepth)
  if (issues.length) {
    const first = issues[0]!
    throw createError({
      statusCode: 422,
      statusMessage: 'Unprocessable Entity',
      message: `Row ${first.index + 1}: ${first.message}${issues.length > 1 ? ` (and ${issues.length - 1} more)` : ''}`,
      data: { issues: issues.map(i => ({ path: `intervals.${i.index}.${i.field}`, message: i.message, index: i.index, field: i.field })) },
    })
  }
}
