import { and, eq, sql } from 'drizzle-orm'
import { VersionParamsSchema } from '#shared/schemas/models'
import { siteModels } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { requireModel, requireVersion } from '~~/server/services/model-versions'

/** Starts a new draft from a saved version (the old draft is kept in the audit log). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const { modelId, version } = validateParams(event, VersionParamsSchema)
  const v = await requireVersion(modelId, version)
  const model = await useDb().transaction(async (tx) => {
    const before = await requireModel(project.id, modelId, tx)
    const [row] = await tx.update(siteModels).set({ draft: { ...v.definition, flagsInForce: [] }, basedOn: version, version: sql`${siteModels.version} + 1` })
      .where(and(eq(siteModels.id, modelId), eq(siteModels.projectId, project.id))).returning()
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'site-model-draft', entityId: modelId, before: before.draft, after: { checkedOut: version } }, tx)
    return row!
  })
  return { model }
})
