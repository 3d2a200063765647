import { LogReplaceSchema, PointParamsSchema } from '#shared/schemas/investigation'
import { replaceLog } from '~~/server/services/logs'
import type { ServerLogReply } from '#shared/types/investigation'

/**
 * Saves a hole's whole log at once, as the log table edits it: rows with an id
 * update (their version must match, else 409 with the current log), rows without
 * one are added, rows left out are deleted. All or nothing.
 */
export default defineEventHandler(async (event): Promise<ServerLogReply> => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const { intervals } = await validateBody(event, LogReplaceSchema)
  return replaceLog(project.id, user.id, pointId, intervals)
})
