import { IndexTestSaveSchema, SampleParamsSchema } from '#shared/schemas/investigation'
import { saveIndexTests } from '~~/server/services/samples'

/** Creates or replaces a sample's index tests (send the version read when replacing). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { pointId, sampleId } = validateParams(event, SampleParamsSchema)
  const body = await validateBody(event, IndexTestSaveSchema)
  return { indexTest: await saveIndexTests(project.id, user.id, pointId, sampleId, body) }
})
