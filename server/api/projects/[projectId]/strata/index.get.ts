import { asc, eq } from 'drizzle-orm'
import { strata } from '~~/server/db/schema'
import type { ServerStrataReply } from '#shared/types/investigation'

export default defineEventHandler(async (event): Promise<ServerStrataReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const rows = await useDb().select().from(strata).where(eq(strata.projectId, project.id)).orderBy(asc(strata.displayOrder), asc(strata.code))
  return { strata: rows }
})
