import { eq, sql } from 'drizzle-orm'
import { float8ArrayParam, type NumberList, preferFastCompression } from '../db/binary'
import { type Tx, useDb } from '../db/client'
import { cptSoundings } from '../db/schema'
import { returnedRow } from '../db/rows'
import { recordAudit } from './audit'
import { requirePoint } from './points'
import { unprocessableError } from './http-errors'
import { projectDepthWords } from './project-units'

export interface CptArrays {
  areaRatio: number
  depth: NumberList
  qc: NumberList
  fs: NumberList
  u2: NumberList
}

/** Depths must increase and stay within the hole; the sounding is replaced whole. `depth` writes a depth in the project's units (`projectDepthWords`). */
export function assertCptValid(c: CptArrays, finalDepth: number, depth: (metres: number) => string = m => `${m} m`) {
  const depths = Array.from(c.depth)
  depths.forEach((d, i) => {
    const above = depths[i - 1]
    if (above !== undefined && !(d > above)) throw unprocessableError(`CPT row ${i + 1}: depth ${depth(d)} does not increase from ${depth(above)}.`)
  })
  const [first = 0] = depths
  const last = depths.at(-1) ?? first
  if (first < 0) throw unprocessableError(`CPT depths must not be negative (the first is ${depth(first)}).`)
  if (last > finalDepth + 1e-6) throw unprocessableError(`The sounding reaches ${depth(last)}, below the point's final depth (${depth(finalDepth)}).`)
}

export async function replaceCptSounding(ctx: { actorId: string, projectId: string, pointId: string }, c: CptArrays & { version?: number }, txIn?: Tx) {
  const run = async (tx: Tx) => {
    const point = await requirePoint(ctx.projectId, ctx.pointId, tx, { lock: true })
    assertCptValid(c, point.finalDepth, (await projectDepthWords(ctx.projectId, tx)).depth)
    const [before] = await tx.select({ id: cptSoundings.id, version: cptSoundings.version, count: cptSoundings.count, areaRatio: cptSoundings.areaRatio }).from(cptSoundings).where(eq(cptSoundings.pointId, point.id))
    if (before && c.version !== undefined && c.version !== before.version) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This sounding was replaced by someone else since you opened it.', data: { current: before } })
    }
    // The arrays go in binary (a 200 000-row sounding is 800 000 values), compressed with lz4 where available.
    await preferFastCompression(tx)
    const values = { areaRatio: c.areaRatio, count: c.depth.length, depth: float8ArrayParam(c.depth), qc: float8ArrayParam(c.qc), fs: float8ArrayParam(c.fs), u2: float8ArrayParam(c.u2) }
    const row = returnedRow(before
      ? await tx.update(cptSoundings).set({ ...values, version: sql`${cptSoundings.version} + 1` }).where(eq(cptSoundings.id, before.id)).returning({ id: cptSoundings.id, version: cptSoundings.version, count: cptSoundings.count, areaRatio: cptSoundings.areaRatio })
      : await tx.insert(cptSoundings).values({ ...values, pointId: point.id }).returning({ id: cptSoundings.id, version: cptSoundings.version, count: cptSoundings.count, areaRatio: cptSoundings.areaRatio }))
    await recordAudit({ actorId: ctx.actorId, projectId: ctx.projectId, action: before ? 'update' : 'create', entity: 'cpt', entityId: row.id, before: before ?? null, after: row }, tx)
    return row
  }
  return txIn ? run(txIn) : useDb().transaction(run)
}
