import { FlagParamsSchema, UpdateFlagSchema } from '#shared/schemas/review'
import { updateFlag } from '~~/server/services/review'

/** Change a flag's verdict or comment, or resolve / reopen it. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'review.write')
  const { flagId } = validateParams(event, FlagParamsSchema)
  const body = await validateBody(event, UpdateFlagSchema)
  return { flag: await updateFlag(project.id, user.id, flagId, body) }
})
