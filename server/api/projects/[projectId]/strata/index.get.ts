import { listStrata } from '~~/server/services/strata'

/** The project's strata in display order. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  return { strata: await listStrata(project.id) }
})
