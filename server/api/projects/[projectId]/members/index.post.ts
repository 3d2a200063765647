import { AddMemberSchema } from '#shared/schemas/projects'
import { addMember } from '~~/server/services/members'

/** An owner adds an existing user, found by e-mail, with a role. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'members.manage')
  const { email, role } = await validateBody(event, AddMemberSchema)
  const member = await addMember({ actorId: user.id, projectId: project.id, email, role })
  setResponseStatus(event, 201)
  return { member }
})
