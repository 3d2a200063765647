import { asc, desc, eq } from 'drizzle-orm'
import { anyOf } from '~~/server/db/any'
import { siteModels, siteModelVersions } from '~~/server/db/schema'
import type { ServerModelList } from '#shared/types/models'

/** The project's site models with their latest saved version. */
export default defineEventHandler(async (event): Promise<ServerModelList> => {
  const { project } = await requireProjectRole(event, 'project.read')
  const db = useDb()
  const models = await db.select({ id: siteModels.id, name: siteModels.name, description: siteModels.description, version: siteModels.version, basedOn: siteModels.basedOn, updatedAt: siteModels.updatedAt })
    .from(siteModels).where(eq(siteModels.projectId, project.id)).orderBy(asc(siteModels.name))
  const versions = models.length
    ? await db.select({ modelId: siteModelVersions.modelId, version: siteModelVersions.version, status: siteModelVersions.status, createdAt: siteModelVersions.createdAt, message: siteModelVersions.message })
      .from(siteModelVersions).where(anyOf(siteModelVersions.modelId, models.map(m => m.id))).orderBy(desc(siteModelVersions.version))
    : []
  return {
    models: models.map(m => ({ ...m, latest: versions.find(v => v.modelId === m.id) ?? null, versionCount: versions.filter(v => v.modelId === m.id).length })),
  }
})
