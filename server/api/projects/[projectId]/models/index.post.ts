import { CreateModelSchema } from '#shared/schemas/models'
import { siteModels } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { requireModel, requireVersion } from '~~/server/services/model-versions'
import { definitionFromLogs } from '~~/server/services/site-models'
import { isUniqueViolation } from '~~/server/utils/db-errors'

/** A new site model: its draft starts from the project's logs, or from a saved version. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const body = await validateBody(event, CreateModelSchema)
  let draft
  let basedOn: number | null = null
  if (body.from) {
    await requireModel(project.id, body.from.modelId)
    const v = await requireVersion(body.from.modelId, body.from.version)
    draft = v.definition
    basedOn = v.version
  }
  else {
    draft = await definitionFromLogs(project.id)
  }
  try {
    const model = await useDb().transaction(async (tx) => {
      const [row] = await tx.insert(siteModels).values({ projectId: project.id, name: body.name, description: body.description, draft, basedOn, createdBy: user.id }).returning()
      await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'site-model', entityId: row!.id, after: { name: row!.name, basedOn } }, tx)
      return row!
    })
    setResponseStatus(event, 201)
    return { model }
  }
  catch (err) {
    if (isUniqueViolation(err)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: `A model named "${body.name}" already exists in this project.` })
    throw err
  }
})
