import type { Capability } from '#shared/auth/roles'
import { UpdateProjectSchema } from '#shared/schemas/projects'
import { updateProject } from '~~/server/services/projects'

/**
 * Edits the project's details (owner; a job number already used: 409) or names its design model
 * (owner or engineer; a model of another project: 422). Each field needs its own capability.
 */
export default defineEventHandler(async (event) => {
  const { user, project, role } = await requireProjectRole(event, 'project.read')
  const body = await validateBody(event, UpdateProjectSchema)
  const { designModelId, ...details } = body
  const needs = new Set<Capability>()
  if (designModelId !== undefined) needs.add('model.write')
  if (Object.values(details).some(v => v !== undefined)) needs.add('project.manage')
  requireRoleCan(role, needs)
  return { project: await updateProject(project, user.id, body) }
})
