import { changeMemberRole } from '../../../../services/members'

export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'members.manage')
  const { userId } = validateParams(event, MemberUserParams)
  await changeMemberRole({ actorId: user.id, projectId: project.id, userId, role: null })
  return { ok: true }
})
