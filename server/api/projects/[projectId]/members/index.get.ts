import { asc, eq } from 'drizzle-orm'
import { projectMembers, users } from '~~/server/db/schema'
import type { ServerMemberList } from '#shared/types/projects'

export default defineEventHandler(async (event): Promise<ServerMemberList> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const members = await useDb()
    .select({ userId: users.id, email: users.email, displayName: users.displayName, role: projectMembers.role, since: projectMembers.createdAt })
    .from(projectMembers)
    .innerJoin(users, eq(users.id, projectMembers.userId))
    .where(eq(projectMembers.projectId, project.id))
    .orderBy(asc(users.displayName))
  return { members }
})
