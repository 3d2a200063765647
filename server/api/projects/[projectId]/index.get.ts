import type { ServerProjectReply } from '#shared/types/projects'

export default defineEventHandler(async (event): Promise<ServerProjectReply> => {
  const { project, role } = await requireProjectRole(event, 'project.read')
  return { project, role }
})
