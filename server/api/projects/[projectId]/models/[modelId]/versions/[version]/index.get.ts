import { VersionParamsSchema } from '#shared/schemas/models'
import { versionWithReview } from '~~/server/services/model-review'
import type { ServerModelVersionReply } from '#shared/types/models'

/** One saved version, read-only, with its review: reviewers, timeline, the flags that block approval. */
export default defineEventHandler(async (event): Promise<ServerModelVersionReply> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  return versionWithReview(project.id, modelId, version)
})
