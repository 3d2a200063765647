import { changeMemberRole } from '~~/server/services/members'
import { MemberParamsSchema } from '#shared/schemas/projects'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'members.manage')
  const { userId } = validateParams(event, MemberParamsSchema)
  await changeMemberRole({ actorId: user.id, projectId: project.id, userId, role: null })
  return { ok: true }
})
