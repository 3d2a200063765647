import { CreateModelSchema } from '#shared/schemas/models'
import { createModel } from '~~/server/services/model-drafts'

/** A new site model: its draft starts from the project's logs, or from a saved version. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const body = await validateBody(event, CreateModelSchema)
  const model = await createModel(project.id, user.id, body)
  setResponseStatus(event, 201)
  return { model }
})
