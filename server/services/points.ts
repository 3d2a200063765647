import { and, asc, eq } from 'drizzle-orm'
import { checkIntervals, type IntervalWords } from '#shared/investigation/intervals'
import { type Tx, useDb } from '../db/client'
import { cptSoundings, groundwaterObservations, indexTests, investigationPoints, logIntervals, samples, sptResults, vaneReadings } from '../db/schema'
import { notFound, unprocessableError } from './http-errors'

import type { ServerPointContents, ServerPointRow } from '#shared/types/investigation'

/**
 * The point in the route, scoped to the project in the WHERE clause (another
 * project's point is 404). `lock` takes a row lock so concurrent edits of one
 * hole's log are serialised.
 */
export async function requirePoint(projectId: string, pointId: string, tx?: Tx, opts: { lock?: boolean } = {}): Promise<ServerPointRow> {
  const db = tx ?? useDb()
  const q = db.select().from(investigationPoints).where(and(eq(investigationPoints.id, pointId), eq(investigationPoints.projectId, projectId)))
  const [row] = opts.lock ? await q.for('update') : await q
  if (!row) notFound('Point')
  return row
}

/** Everything logged at one point except the CPT arrays (which come on their own route). */
export async function pointDetail(point: ServerPointRow): Promise<ServerPointContents> {
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
export function assertLogValid(intervals: { top: number, bottom: number }[], finalDepth: number, words: IntervalWords = {}) {
  const { issues } = checkIntervals(intervals, finalDepth, words)
  const [first] = issues
  if (first) {
    throw unprocessableError(
      `Row ${first.index + 1}: ${first.message}${issues.length > 1 ? ` (and ${issues.length - 1} more)` : ''}`,
      { issues: issues.map(i => ({ path: `intervals.${i.index}.${i.field}`, message: i.message, index: i.index, field: i.field })) },
    )
  }
}

/**
 * 422 on the `finalDepth` field when a new final depth would leave anything
 * logged at the point below the bottom of the hole (log intervals, samples,
 * SPT, vane readings, groundwater depths), naming the deepest one.
 */
export async function assertFinalDepthHolds(tx: Tx, pointId: string, finalDepth: number) {
  const deepest = (rows: { d: number | null }[]) => rows.reduce((m, r) => (r.d !== null && r.d > m ? r.d : m), Number.NEGATIVE_INFINITY)
  const [log, sampleRows, spt, vane, water] = await Promise.all([
    tx.select({ d: logIntervals.bottom }).from(logIntervals).where(eq(logIntervals.pointId, pointId)),
    tx.select({ d: samples.bottom }).from(samples).where(eq(samples.pointId, pointId)),
    tx.select({ d: sptResults.depth }).from(sptResults).where(eq(sptResults.pointId, pointId)),
    tx.select({ d: vaneReadings.depth }).from(vaneReadings).where(eq(vaneReadings.pointId, pointId)),
    tx.select({ d: groundwaterObservations.depth }).from(groundwaterObservations).where(eq(groundwaterObservations.pointId, pointId)),
  ])
  const checks = [
    { what: 'the bottom of the deepest log interval', depth: deepest(log) },
    { what: 'the bottom of the deepest sample', depth: deepest(sampleRows) },
    { what: 'the deepest SPT', depth: deepest(spt) },
    { what: 'the deepest vane reading', depth: deepest(vane) },
    { what: 'the deepest groundwater observation', depth: deepest(water) },
  ]
  const worst = checks.filter(c => c.depth > finalDepth).sort((a, b) => b.depth - a.depth)[0]
  if (!worst) return
  const message = `must be at least ${worst.depth} m: ${worst.what} is at ${worst.depth} m.`
  throw unprocessableError(
    `The final depth (${finalDepth} m) is above ${worst.what} (${worst.depth} m).`,
    { issues: [{ path: 'finalDepth', message }] },
  )
}
