import { CreateModelSchema } from '#shared/schemas/models'
import { createModel } from '~~/server/services/model-drafts'

/** A new site model: its draft starts from the project's logs, or from a saved version. */
export default projectCreateHandler('model.write', CreateModelSchema, async (projectId, actorId, body) => ({ model: await createModel(projectId, actorId, body) }))
