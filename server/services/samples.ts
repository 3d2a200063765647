import { and, eq, sql } from 'drizzle-orm'
import { returnedRow } from '../db/rows'
import type { z } from 'zod'
import type { IndexTestSaveSchema, SampleInput, SampleUpdateSchema } from '#shared/schemas/investigation'
import { useDb } from '../db/client'
import { indexTests, samples } from '../db/schema'
import { rehomeAttachmentsOf } from './attachments'
import { recordAudit } from './audit'
import { conflictOnDuplicate, notFound, unprocessableError, versionedUpdate } from './http-errors'
import { requirePoint } from './points'
import { projectDepthWords } from './project-units'

/** The 422 of a sample reaching below its hole, in the project's units. */
async function bottomBelowHole(projectId: string, bottom: number, finalDepth: number, tx: Parameters<typeof projectDepthWords>[1]) {
  const words = await projectDepthWords(projectId, tx)
  return unprocessableError(`The sample's bottom (${words.depth(bottom)}) is below the hole's final depth (${words.depth(finalDepth)}).`)
}

/** A new sample at a point; its bottom must be within the hole (422), its identifier new at the point (409). */
export async function createSample(projectId: string, actorId: string, pointId: string, body: SampleInput) {
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    const point = await requirePoint(projectId, pointId, tx)
    if (body.bottom > point.finalDepth) throw await bottomBelowHole(projectId, body.bottom, point.finalDepth, tx)
    const row = returnedRow(await tx.insert(samples).values({ ...body, pointId: point.id }).returning())
    await recordAudit({ actorId, projectId, action: 'create', entity: 'sample', entityId: row.id, after: row }, tx)
    return row
  }), `Sample ${body.identifier} already exists at this point.`)
}

/** Edits a sample (stale version: 409 with the current row); the merged depths must stay ordered and within the hole. */
export async function updateSample(projectId: string, actorId: string, pointId: string, sampleId: string, { version, ...patch }: z.infer<typeof SampleUpdateSchema>) {
  return conflictOnDuplicate(() => useDb().transaction(async (tx) => {
    const point = await requirePoint(projectId, pointId, tx)
    const scope = and(eq(samples.id, sampleId), eq(samples.pointId, point.id))
    const [before] = await tx.select().from(samples).where(scope)
    if (!before) notFound('Sample')
    const top = patch.top ?? before.top
    const bottom = patch.bottom ?? before.bottom
    if (bottom < top) throw unprocessableError('The sample\'s bottom must not be above its top.')
    if (bottom > point.finalDepth) throw await bottomBelowHole(projectId, bottom, point.finalDepth, tx)
    const row = await versionedUpdate({
      entity: 'Sample',
      update: () => tx.update(samples).set({ ...patch, version: sql`${samples.version} + 1` }).where(and(scope, eq(samples.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId, projectId, action: 'update', entity: 'sample', entityId: sampleId, before, after: row }, tx)
    return row
  }), `Sample ${patch.identifier} already exists at this point.`, { issues: [{ path: 'identifier', message: 'is already used by another sample at this point' }] })
}

/** Deletes a sample with its tests (audited with the sample row); their files move to the project. */
export async function deleteSample(projectId: string, actorId: string, pointId: string, sampleId: string) {
  await useDb().transaction(async (tx) => {
    const point = await requirePoint(projectId, pointId, tx)
    const [found] = await tx.select().from(samples).where(and(eq(samples.id, sampleId), eq(samples.pointId, point.id))).for('update')
    if (!found) notFound('Sample')
    await rehomeAttachmentsOf(tx, { projectId, actorId, ownerType: 'sample', ownerId: sampleId, label: `sample ${found.identifier} of ${point.identifier}` })
    const [before] = await tx.delete(samples).where(and(eq(samples.id, sampleId), eq(samples.pointId, point.id))).returning()
    await recordAudit({ actorId, projectId, action: 'delete', entity: 'sample', entityId: sampleId, before }, tx)
  })
}

/** Creates or replaces a sample's index tests (the version read is needed to replace them: 409 otherwise). */
export async function saveIndexTests(projectId: string, actorId: string, pointId: string, sampleId: string, { version, ...values }: z.infer<typeof IndexTestSaveSchema>) {
  return useDb().transaction(async (tx) => {
    const point = await requirePoint(projectId, pointId, tx)
    const [sample] = await tx.select({ id: samples.id }).from(samples).where(and(eq(samples.id, sampleId), eq(samples.pointId, point.id)))
    if (!sample) notFound('Sample')
    const [before] = await tx.select().from(indexTests).where(eq(indexTests.sampleId, sampleId)).for('update')
    let row
    if (!before) {
      row = returnedRow(await tx.insert(indexTests).values({ ...values, sampleId }).returning())
    }
    else {
      if (version === undefined) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This sample already has index tests: send the version you read to replace them.', data: { current: before } })
      row = await versionedUpdate({
        entity: 'Index test',
        update: () => tx.update(indexTests).set({ ...values, version: sql`${indexTests.version} + 1` }).where(and(eq(indexTests.sampleId, sampleId), eq(indexTests.version, version))).returning(),
        current: () => before,
      })
    }
    await recordAudit({ actorId, projectId, action: before ? 'update' : 'create', entity: 'index-test', entityId: row.id, before: before ?? null, after: row }, tx)
    return row
  })
}
