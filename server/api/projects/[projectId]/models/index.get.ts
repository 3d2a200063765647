import { listModels } from '~~/server/services/model-drafts'

/** The project's site models with their latest saved version. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  return { models: await listModels(project.id) }
})
