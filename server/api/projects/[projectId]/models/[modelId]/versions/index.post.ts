import { and, eq, sql } from 'drizzle-orm'
import { ModelParamsSchema, SaveVersionSchema } from '#shared/schemas/models'
import { siteModels, siteModelVersions } from '~~/server/db/schema'
import { recordAudit } from '~~/server/services/audit'
import { assertDefinitionComputable, nextVersionNumber, requireModel } from '~~/server/services/model-versions'
import { flagsInForce } from '~~/server/services/review'

/**
 * Saves the current draft as the next immutable version, with the reviewer
 * flags in force at that moment. The client sends the draft revision it has
 * seen, so it never saves a draft it has not looked at (409 otherwise).
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'model.write')
  const { modelId } = validateParams(event, ModelParamsSchema)
  const { message, version } = await validateBody(event, SaveVersionSchema)
  const saved = await useDb().transaction(async (tx) => {
    const [model] = await tx.select().from(siteModels).where(and(eq(siteModels.id, modelId), eq(siteModels.projectId, project.id))).for('update')
    if (!model) await requireModel(project.id, modelId, tx)
    if (model!.version !== version) {
      throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'The draft changed since you opened it; review it before saving a version.', data: { current: model } })
    }
    const definition = { ...model!.draft, flagsInForce: await flagsInForce(project.id) }
    assertDefinitionComputable(definition)
    const number = await nextVersionNumber(tx, modelId)
    const [row] = await tx.insert(siteModelVersions).values({ modelId, version: number, definition, message, createdBy: user.id }).returning()
    await tx.update(siteModels).set({ basedOn: number, version: sql`${siteModels.version} + 1` }).where(eq(siteModels.id, modelId))
    await recordAudit({ actorId: user.id, projectId: project.id, action: 'create', entity: 'site-model-version', entityId: row!.id, after: { modelId, version: number, message } }, tx)
    return row!
  })
  setResponseStatus(event, 201)
  return { version: saved }
})
