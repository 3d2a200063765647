import { CreateFlagSchema } from '#shared/schemas/review'
import { reviewFlags } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { assertTargetInProject } from '~~/server/services/review'
import type { ServerFlagCreatedReply } from '#shared/types/review'

/** A reviewer flags a σ'p point, test or log interval as questionable, excluded from fits, or accepted. */
export default defineEventHandler(async (event): Promise<ServerFlagCreatedReply> => {
  const { user, project } = await requireProjectRole(event, 'review.write')
  const body = await validateBody(event, CreateFlagSchema)
  await assertTargetInProject(project.id, body.targetType, body.targetId)
  const flag = await useDb().transaction(async (tx) => {
    const [row] = await tx.insert(reviewFlags).values({ ...body, projectId: project.id, createdBy: user.id }).returning()
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'review-flag', entityId: row!.id, after: row }, tx)
    return row!
  })
  setResponseStatus(event, 201)
  return { flag }
})
