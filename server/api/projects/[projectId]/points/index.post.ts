import { PointInputSchema } from '#shared/schemas/investigation'
import { investigationPoints } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { isUniqueViolation } from '~~/server/utils/db-errors'
import { holdPointLimit } from '~~/server/services/imports/commit'
import { formatCount, ImportLimitError, PROJECT_POINT_LIMIT } from '#shared/imports/limits'
import { unprocessableError } from '~~/server/services/http-errors'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const body = await validateBody(event, PointInputSchema)
  try {
    const point = await useDb().transaction(async (tx) => {
      await holdPointLimit(tx, project.id, 1)
      const [row] = await tx.insert(investigationPoints).values({ ...body, projectId: project.id }).returning()
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'point', entityId: row!.id, after: row }, tx)
      return row!
    })
    setResponseStatus(event, 201)
    return { point }
  }
  catch (err) {
    if (err instanceof ImportLimitError) throw unprocessableError(`A project holds at most ${formatCount(PROJECT_POINT_LIMIT)} points and this one is full; ${body.identifier} was not added.`, { code: err.code })
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `${body.identifier} already exists in this project.` })
    throw err
  }
})
