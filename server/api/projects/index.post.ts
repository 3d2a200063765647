import { CreateProjectSchema } from '#shared/schemas/projects'
import { createProject } from '~~/server/services/projects'

/** A site admin creates a project and becomes its first owner. */
export default defineEventHandler(async (event) => {
  const user = requireSiteAdmin(event)
  const body = await validateBody(event, CreateProjectSchema)
  const project = await createProject(user.id, body)
  setResponseStatus(event, 201)
  return { project }
})
