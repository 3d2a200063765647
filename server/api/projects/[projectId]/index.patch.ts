import { UpdateProjectSchema } from '#shared/schemas/projects'
import { updateProject } from '~~/server/services/projects'

/** Edits the project's details (a job number already used: 409). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'project.manage')
  const body = await validateBody(event, UpdateProjectSchema)
  return { project: await updateProject(project, user.id, body) }
})
