import { MemberParamsSchema, UpdateMemberSchema } from '#shared/schemas/projects'
import { changeMemberRole } from '~~/server/services/members'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'members.manage')
  const { userId } = validateParams(event, MemberParamsSchema)
  const { role } = await validateBody(event, UpdateMemberSchema)
  const member = await changeMemberRole({ actorId: user.id, projectId: project.id, userId, role })
  return { member }
})
