import { and, asc, eq, sql } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import type { z } from 'zod'
import type { StratumInput, StratumUpdateSchema } from '#shared/schemas/investigation'
import { useDb } from '../db/client'
import { strata } from '../db/schema'
import { recordAudit } from './audit'
import { conflictOnDuplicate, notFound, versionedUpdate } from './http-errors'

/** The project's strata in display order. */
export async function listStrata(projectId: string) {
  return useDb().select().from(strata).where(eq(strata.projectId, projectId)).orderBy(asc(strata.displayOrder), asc(strata.code))
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

/** Deletes a stratum; intervals that named it stay, unassigned. */
export async function deleteStratum(projectId: string, actorId: string, stratumId: string) {
  await useDb().transaction(async (tx) => {
    const [before] = await tx.delete(strata).where(and(eq(strata.id, stratumId), eq(strata.projectId, projectId))).returning()
    if (!before) notFound('Stratum')
    await recordAudit({ actorId, projectId, action: 'delete', entity: 'stratum', entityId: stratumId, before }, tx)
  })
}
