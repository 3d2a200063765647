import { CptSaveSchema, PointParamsSchema } from '#shared/schemas/investigation'
import { replaceCptSounding } from '~~/server/services/cpt'

/** Replaces the point's CPT sounding (send `version` when one exists). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { pointId } = validateParams(event, PointParamsSchema)
  const body = await validateBody(event, CptSaveSchema)
  const sounding = await replaceCptSounding({ actorId: user.id, projectId: project.id, pointId }, body)
  return { sounding }
})
