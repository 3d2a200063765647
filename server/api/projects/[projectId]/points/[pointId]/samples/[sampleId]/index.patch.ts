import { and, eq, sql } from 'drizzle-orm'
import { SampleParamsSchema, SampleUpdateSchema } from '#shared/schemas/investigation'
import { samples } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { requirePoint } from '~~/server/services/points'
import { notFound, unprocessableError, versionedUpdate } from '~~/server/services/http-errors'
import { isUniqueViolation } from '~~/server/utils/db-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, sampleId } = validateParams(event, SampleParamsSchema)
  const { version, ...patch } = await validateBody(event, SampleUpdateSchema)
  try {
    const sample = await useDb().transaction(async (tx) => {
    const point = await requirePoint(project.id, pointId, tx)
    const scope = and(eq(samples.id, sampleId), eq(samples.pointId, point.id))
    const [before] = await tx.select().from(samples).where(scope)
    if (!before) notFound('Sample')
    const top = patch.top ?? before.top
    const bottom = patch.bottom ?? before.bottom
    if (bottom < top) throw unprocessableError('The sample\'s bottom must not be above its top.')
    if (bottom > point.finalDepth) throw unprocessableError(`The sample's bottom (${bottom} m) is below the hole's final depth (${point.finalDepth} m).`)
    const row = await versionedUpdate({
      entity: 'Sample',
      update: () => tx.update(samples).set({ ...patch, version: sql`${samples.version} + 1` }).where(and(scope, eq(samples.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'sample', entityId: sampleId, before, after: row }, tx)
    return row
  })
    return { sample }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `Sample ${patch.identifier} already exists at this point.`, data: { issues: [{ path: 'identifier', message: 'is already used by another sample at this point' }] } })
    throw err
  }
})
