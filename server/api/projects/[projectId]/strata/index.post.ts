import { StratumInputSchema } from '#shared/schemas/investigation'
import { strata } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { isUniqueViolation } from '~~/server/utils/db-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const body = await validateBody(event, StratumInputSchema)
  try {
    const stratum = await useDb().transaction(async (tx) => {
      const [row] = await tx.insert(strata).values({ ...body, projectId: project.id }).returning()
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'stratum', entityId: row!.id, after: row }, tx)
      return row!
    })
    setResponseStatus(event, 201)
    return { stratum }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `A stratum with code ${body.code} already exists.` })
    throw err
  }
})
