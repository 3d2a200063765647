import { asc, eq } from 'drizzle-orm'
import { projectMembers, projects } from '~~/server/db/schema'
import type { ServerProjectList } from '#shared/types/projects'

/** Projects the caller is a member of, with the caller's role in each. */
export default defineEventHandler(async (event): Promise<ServerProjectList> => {
  const user = requireUser(event)
  const rows = await useDb()
    .select({
      id: projects.id,
      jobNumber: projects.jobNumber,
      name: projects.name,
      client: projects.client,
      unitSystem: projects.unitSystem,
      updatedAt: projects.updatedAt,
      role: projectMembers.role,
    })
    .from(projectMembers)
    .innerJoin(projects, eq(projects.id, projectMembers.projectId))
    .where(eq(projectMembers.userId, user.id))
    .orderBy(asc(projects.jobNumber))
  return { projects: rows }
})
