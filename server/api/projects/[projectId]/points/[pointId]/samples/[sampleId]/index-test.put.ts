import { and, eq, sql } from 'drizzle-orm'
import { IndexTestSaveSchema, SampleParamsSchema } from '#shared/schemas/investigation'
import { indexTests, samples } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { requirePoint } from '~~/server/services/points'
import { notFound, versionedUpdate } from '~~/server/services/http-errors'
import { returnedRow } from '~~/server/db/rows'

const Body = IndexTestSaveSchema

/** Creates or replaces a sample's index tests (send the version read when replacing). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { pointId, sampleId } = validateParams(event, SampleParamsSchema)
  const { version, ...values } = await validateBody(event, Body)
  const indexTest = await useDb().transaction(async (tx) => {
    const point = await requirePoint(project.id, pointId, tx)
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
    await recordAudit({ actorId: user.id, projectId: project.id, action: before ? 'update' : 'create', entity: 'index-test', entityId: row.id, before: before ?? null, after: row }, tx)
    return row
  })
  return { indexTest }
})
