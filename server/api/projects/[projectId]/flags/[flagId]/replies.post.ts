import { FlagParamsSchema, ReplySchema } from '#shared/schemas/review'
import { replyToFlag } from '~~/server/services/review'

/** A reply in a flag's thread (reviewers and the people whose work is flagged). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'review.reply')
  const { flagId } = validateParams(event, FlagParamsSchema)
  const { body } = await validateBody(event, ReplySchema)
  const reply = await replyToFlag(project.id, user.id, flagId, body)
  setResponseStatus(event, 201)
  return { reply }
})
