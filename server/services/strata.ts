import { and, asc, eq, sql } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import type { z } from 'zod'
import type { StratumCptDerivationSchema, StratumInput, StratumUpdateSchema } from '#shared/schemas/investigation'
import { cptDerivationDefault, cptDerivationOn } from '#shared/strata/cpt-derivation'
import type { ServerStrataReply, StratumCptDerivation } from '#shared/types/investigation'
import { type Database, useDb } from '../db/client'
import { investigationPoints, logIntervals, strata } from '../db/schema'
import { recordAudit } from './audit'
import { conflictOnDuplicate, notFound, versionedUpdate } from './http-errors'

/** The project's strata in display order. */
export async function listStrata(projectId: string) {
  return useDb().select().from(strata).where(eq(strata.projectId, projectId)).orderBy(asc(strata.displayOrder), asc(strata.code))
}

/**
 * Each stratum's "derive σ'p from CPT and vane" switch: the default from the USCS symbols logged in
 * its intervals across the project's holes (logged thickness per symbol), and the stored override.
 */
export async function strataCptDerivation(projectId: string, db: Database = useDb()): Promise<StratumCptDerivation[]> {
  const [rows, logged] = await Promise.all([
    db.select({ id: strata.id, code: strata.code, override: strata.cptDerivation }).from(strata).where(eq(strata.projectId, projectId)).orderBy(asc(strata.displayOrder), asc(strata.code)),
    db.select({ stratumId: logIntervals.stratumId, uscs: logIntervals.uscs, thickness: sql<number>`sum(${logIntervals.bottom} - ${logIntervals.top})`.mapWith(Number) })
      .from(logIntervals)
      .innerJoin(investigationPoints, eq(investigationPoints.id, logIntervals.pointId))
      .where(eq(investigationPoints.projectId, projectId))
      .groupBy(logIntervals.stratumId, logIntervals.uscs),
  ])
  return rows.map((r) => {
    const fallback = cptDerivationDefault(logged.filter(l => l.stratumId === r.id))
    return { stratumId: r.id, code: r.code, default: fallback, override: r.override, on: cptDerivationOn(r.override, fallback) }
  })
}

/** GET …/strata: the strata in display order with their switches. */
export async function strataReply(projectId: string): Promise<ServerStrataReply> {
  const [rows, cptDerivation] = await Promise.all([listStrata(projectId), strataCptDerivation(projectId)])
  return { strata: rows, cptDerivation }
}

/** Stratum codes where σ'p is not derived from CPT and vane. */
export async function cptDerivationOff(projectId: string, db?: Database): Promise<Set<string>> {
  return new Set((await strataCptDerivation(projectId, db)).filter(s => !s.on).map(s => s.code))
}

/** A new stratum (a code already used in the project is 409). */
export async function createStratum(projectId: string, actorId: string, body: StratumInput) {
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    const row = returnedRow(await tx.insert(strata).values({ ...body, projectId }).returning())
    await recordAudit({ actorId, projectId, action: 'create', entity: 'stratum', entityId: row.id, after: row }, tx)
    return row
  }), `A stratum with code ${body.code} already exists.`)
}

/** Edits a stratum (stale version: 409 with the current row; a code already used: 409). */
export async function updateStratum(projectId: string, actorId: string, stratumId: string, { version, ...patch }: z.infer<typeof StratumUpdateSchema>) {
  const scope = and(eq(strata.id, stratumId), eq(strata.projectId, projectId))
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(strata).where(scope)
    const row = await versionedUpdate({
      entity: 'Stratum',
      update: () => tx.update(strata).set({ ...patch, version: sql`${strata.version} + 1` }).where(and(scope, eq(strata.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId, projectId, action: 'update', entity: 'stratum', entityId: stratumId, before, after: row }, tx)
    return row
  }), `A stratum with code ${patch.code} already exists.`)
}

/** Sets or clears a stratum's "derive σ'p from CPT and vane" override (stale version: 409). */
export async function setStratumCptDerivation(projectId: string, actorId: string, stratumId: string, { version, cptDerivation }: z.infer<typeof StratumCptDerivationSchema>) {
  const scope = and(eq(strata.id, stratumId), eq(strata.projectId, projectId))
  return useDb().transaction(async (tx) => {
    const [before] = await tx.select().from(strata).where(scope)
    const row = await versionedUpdate({
      entity: 'Stratum',
      update: () => tx.update(strata).set({ cptDerivation, version: sql`${strata.version} + 1` }).where(and(scope, eq(strata.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId, projectId, action: 'update', entity: 'stratum', entityId: stratumId, before, after: row }, tx)
    return row
  })
}

/** Deletes a stratum; intervals that named it stay, unassigned. */
export async function deleteStratum(projectId: string, actorId: string, stratumId: string) {
  await useDb().transaction(async (tx) => {
    const [before] = await tx.delete(strata).where(and(eq(strata.id, stratumId), eq(strata.projectId, projectId))).returning()
    if (!before) notFound('Stratum')
    await recordAudit({ actorId, projectId, action: 'delete', entity: 'stratum', entityId: stratumId, before }, tx)
  })
}
