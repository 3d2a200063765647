import { VersionDecisionSchema, VersionParamsSchema } from '#shared/schemas/models'
import { decideVersion } from '~~/server/services/model-review'

/**
 * Approves or returns a submitted version (409 unless submitted). Whoever saved the version
 * cannot approve it (403); open exclude/questionable flags on what its fits use need an
 * override reason (409 `open-flags` otherwise).
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'review.write')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  const body = await validateBody(event, VersionDecisionSchema)
  return { version: await decideVersion(project.id, user.id, modelId, version, body) }
})
