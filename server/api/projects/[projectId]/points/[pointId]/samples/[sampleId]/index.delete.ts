import { SampleParamsSchema } from '#shared/schemas/investigation'
import { deleteSample } from '~~/server/services/samples'

/** Deletes a sample with its tests (audited with the sample row); their files move to the project. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { pointId, sampleId } = validateParams(event, SampleParamsSchema)
  await deleteSample(project.id, user.id, pointId, sampleId)
  return { ok: true }
})
