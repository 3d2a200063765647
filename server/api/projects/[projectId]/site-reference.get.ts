import { projectSiteReference } from '~~/server/services/site-reference'

/** Logged stratum changes per hole, bulk unit weights and groundwater observations: the stress workspace's reference marks. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  return projectSiteReference(project.id)
})
