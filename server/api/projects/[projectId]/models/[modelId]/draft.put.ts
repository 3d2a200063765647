import { and, eq, sql } from 'drizzle-orm'
import { ModelParamsSchema, SaveDraftSchema } from '#shared/schemas/models'
import { siteModels } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { assertDefinitionComputable, requireModel } from '~~/server/services/model-versions'
import { versionedUpdate } from '~~/server/services/http-errors'

/** Saves the editable draft (not a version); a stale revision is 409 with the current draft. */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const { draft, version } = await validateBody(event, SaveDraftSchema)
  assertDefinitionComputable(draft)
  const model = await useDb().transaction(async (tx) => {
    const before = await requireModel(project.id, modelId, tx)
    const row = await versionedUpdate({
      entity: 'Model draft',
      update: () => tx.update(siteModels).set({ draft, version: sql`${siteModels.version} + 1` })
        .where(and(eq(siteModels.id, modelId), eq(siteModels.projectId, project.id), eq(siteModels.version, version))).returning(),
      current: () => before,
    })
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'update', entity: 'site-model-draft', entityId: modelId, before: before.draft, after: draft }, tx)
    return row
  })
  return { model }
})
