import { and, eq, sql } from 'drizzle-orm'
import { StratumParamsSchema, StratumUpdateSchema } from '#shared/schemas/investigation'
import { strata } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { versionedUpdate } from '~~/server/services/http-errors'
import { isUniqueViolation } from '~~/server/utils/db-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { stratumId } = validateParams(event, StratumParamsSchema)
  const { version, ...patch } = await validateBody(event, StratumUpdateSchema)
  const scope = and(eq(strata.id, stratumId), eq(strata.projectId, project.id))
  try {
    const stratum = await useDb().transaction(async (tx) => {
      const [before] = await tx.select().from(strata).where(scope)
      const row = await versionedUpdate({
        entity: 'Stratum',
        update: () => tx.update(strata).set({ ...patch, version: sql`${strata.version} + 1` }).where(and(scope, eq(strata.version, version))).returning(),
        current: () => before,
      })
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'stratum', entityId: stratumId, before, after: row }, tx)
      return row
    })
    return { stratum }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `A stratum with code ${patch.code} already exists.` })
    throw err
  }
})
