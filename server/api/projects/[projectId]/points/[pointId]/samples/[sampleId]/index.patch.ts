import { SampleParamsSchema, SampleUpdateSchema } from '#shared/schemas/investigation'
import { updateSample } from '~~/server/services/samples'

/** Edits a sample (stale version or an identifier already used: 409; depths out of order or below the hole: 422). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, sampleId } = validateParams(event, SampleParamsSchema)
  const body = await validateBody(event, SampleUpdateSchema)
  return { sample: await updateSample(project.id, user.id, pointId, sampleId, body) }
})
