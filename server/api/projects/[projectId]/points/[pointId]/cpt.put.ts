import { CptSaveSchema } from '#shared/schemas/investigation'
import { replaceCptSounding } from '../../../../../services/cpt'

/** Replaces the point's CPT sounding (send `version` when one exists). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'tests.write')
  const { pointId } = validateParams(event, PointParams)
  const body = await validateBody(event, CptSaveSchema)
  const sounding = await replaceCptSounding({ actorId: user.id, projectId: project.id, pointId }, body)
  return { sounding }
})
