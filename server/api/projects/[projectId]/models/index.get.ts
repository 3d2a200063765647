import { listModels } from '~~/server/services/model-drafts'
import type { ServerModelList } from '#shared/types/models'

/** The project's site models with their latest saved version. */
export default defineEventHandler(async (event): Promise<ServerModelList> => {
  const { project } = await requireProjectRole(event, 'project.read')
  return { models: await listModels(project.id) }
})
