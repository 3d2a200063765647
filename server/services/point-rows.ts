import { and, eq, sql } from 'drizzle-orm'
import { useDb } from '../db/client'
import { groundwaterObservations, sptResults, vaneReadings } from '../db/schema'
import { returnedRow } from '../db/rows'
import { recordAudit } from './audit'
import { requirePoint } from './points'
import { notFound, unprocessableError, versionedUpdate } from './http-errors'
import { projectDepthWords } from './project-units'

/**
 * Create, update and delete for the simple rows that hang off a point (SPT,
 * groundwater observations, vane readings): scoped to the point and project,
 * depth-checked against the hole, versioned and audited in one transaction.
 */
const TABLES = {
  'spt': sptResults,
  'groundwater': groundwaterObservations,
  'vane': vaneReadings,
} as const
export type PointRowKind = keyof typeof TABLES
type Row = { id: string, pointId: string, version: number, depth: number | null }

async function checkDepth(depth: number | null | undefined, finalDepth: number, projectId: string, tx: Parameters<typeof projectDepthWords>[1]) {
  if (depth === null || depth === undefined || depth <= finalDepth) return
  // In the project's units (ft on a US project).
  const words = await projectDepthWords(projectId, tx)
  throw unprocessableError(`The depth (${words.depth(depth)}) is below the hole's final depth (${words.depth(finalDepth)}).`)
}

interface Ctx { actorId: string, projectId: string, pointId: string }

export async function createPointRow(kind: PointRowKind, ctx: Ctx, values: Record<string, unknown> & { depth?: number | null }) {
  const table = TABLES[kind]
  return useDb().transaction(async (tx) => {
    const point = await requirePoint(ctx.projectId, ctx.pointId, tx)
    await checkDepth(values.depth, point.finalDepth, ctx.projectId, tx)
    const row = returnedRow(await tx.insert(table).values({ ...values, pointId: point.id } as never).returning() as Row[])
    await recordAudit({ actorId: ctx.actorId, projectId: ctx.projectId, action: 'create', entity: kind, entityId: row.id, after: row }, tx)
    return row
  })
}

export async function updatePointRow(kind: PointRowKind, ctx: Ctx, rowId: string, version: number, patch: Record<string, unknown> & { depth?: number | null }) {
  const table = TABLES[kind]
  return useDb().transaction(async (tx) => {
    const point = await requirePoint(ctx.projectId, ctx.pointId, tx)
    await checkDepth(patch.depth, point.finalDepth, ctx.projectId, tx)
    const scope = and(eq(table.id, rowId), eq(table.pointId, point.id))
    const [before] = await tx.select().from(table).where(scope) as Row[]
    const row = await versionedUpdate({
      entity: kind === 'spt' ? 'SPT result' : kind === 'vane' ? 'Vane reading' : 'Groundwater observation',
      update: () => tx.update(table).set({ ...patch, version: sql`${table.version} + 1` }).where(and(scope, eq(table.version, version))).returning() as Promise<Row[]>,
      current: () => before,
    })
    await recordAudit({ actorId: ctx.actorId, projectId: ctx.projectId, action: 'update', entity: kind, entityId: rowId, before, after: row }, tx)
    return row
  })
}

export async function deletePointRow(kind: PointRowKind, ctx: Ctx, rowId: string) {
  const table = TABLES[kind]
  await useDb().transaction(async (tx) => {
    const point = await requirePoint(ctx.projectId, ctx.pointId, tx)
    const [before] = await tx.delete(table).where(and(eq(table.id, rowId), eq(table.pointId, point.id))).returning()
    if (!before) notFound('Row')
    await recordAudit({ actorId: ctx.actorId, projectId: ctx.projectId, action: 'delete', entity: kind, entityId: rowId, before }, tx)
  })
}
