import { and, eq } from 'drizzle-orm'
import { FlagParamsSchema, ReplySchema } from '#shared/schemas/review'
import { reviewFlags, reviewReplies } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { notFound } from '~~/server/services/http-errors'

/** A reply in a flag's thread (reviewers and the people whose work is flagged). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'review.reply')
  const { flagId } = validateParams(event, FlagParamsSchema)
  const { body } = await validateBody(event, ReplySchema)
  const reply = await useDb().transaction(async (tx) => {
    const [flag] = await tx.select({ id: reviewFlags.id }).from(reviewFlags).where(and(eq(reviewFlags.id, flagId), eq(reviewFlags.projectId, project.id)))
    if (!flag) notFound('Flag')
    const [row] = await tx.insert(reviewReplies).values({ flagId, body, createdBy: user.id }).returning()
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'review-reply', entityId: row!.id, after: row }, tx)
    return row!
  })
  setResponseStatus(event, 201)
  return { reply }
})
