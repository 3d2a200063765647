import { and, asc, eq } from 'drizzle-orm'
import { FlagParamsSchema } from '#shared/schemas/review'
import { reviewFlags, reviewReplies, users } from '~~/server/db/schema'
import { notFound } from '~~/server/services/http-errors'
import type { ServerReviewThreadReply } from '#shared/types/review'

export default defineEventHandler(async (event): Promise<ServerReviewThreadReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { flagId } = validateParams(event, FlagParamsSchema)
  const db = useDb()
  const [flag] = await db.select({ flag: reviewFlags, author: users.displayName }).from(reviewFlags).leftJoin(users, eq(users.id, reviewFlags.createdBy))
    .where(and(eq(reviewFlags.id, flagId), eq(reviewFlags.projectId, project.id)))
  if (!flag) notFound('Flag')
  const replies = await db.select({ id: reviewReplies.id, body: reviewReplies.body, createdAt: reviewReplies.createdAt, author: users.displayName })
    .from(reviewReplies).leftJoin(users, eq(users.id, reviewReplies.createdBy))
    .where(eq(reviewReplies.flagId, flagId)).orderBy(asc(reviewReplies.createdAt))
  return { flag: { ...flag.flag, author: flag.author }, replies }
})
