import type { ProjectRole } from '#shared/auth/roles'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import type { ProfilePoint } from '~/utils/stressHistory'

/** Rows of the models API as they arrive in JSON (dates as strings). */
export interface SiteModelRow {
  id: string
  projectId: string
  name: string
  description: string
  draft: SiteModelDefinition
  /** Draft revision (optimistic concurrency). */
  version: number
  basedOn: number | null
  createdBy: string | null
  createdAt: string
  updatedAt: string
}

export type VersionStatus = 'saved' | 'submitted' | 'approved' | 'returned'

export interface ModelVersionSummary {
  version: number
  message: string
  status: VersionStatus
  createdAt: string
  author: string | null
}

export interface ModelVersionRow extends ModelVersionSummary {
  id: string
  modelId: string
  definition: SiteModelDefinition
  createdBy: string | null
}

export interface ModelListItem {
  id: string
  name: string
  description: string
  version: number
  basedOn: number | null
  updatedAt: string
  latest: { version: number, status: VersionStatus, createdAt: string, message: string } | null
  versionCount: number
}

export interface ModelDetail { model: SiteModelRow, versions: ModelVersionSummary[], role: ProjectRole }

export interface CompareAnswer {
  a: { version: number, message: string, savedAt: string, author: string | null }
  b: { version: number, message: string, savedAt: string, author: string | null }
  changes: { path: string, a: unknown, b: unknown }[]
  flagsChanged: boolean
  profiles: { a: ProfilePoint[], b: ProfilePoint[] }
}

export function modelUrl(projectId: string, modelId: string): string {
  return `/api/projects/${projectId}/models/${modelId}`
}

/** The project's models, with the create call of the list page. */
export function useSiteModels(projectId: MaybeRefOrGetter<string>) {
  const base = () => `/api/projects/${toValue(projectId)}/models`
  const res = useApi<{ models: ModelListItem[] }>(() => `models-${toValue(projectId)}`, base, () => ({ models: [] }))
  async function create(body: { name: string, description: string, from?: { modelId: string, version: number } }): Promise<SiteModelRow> {
    const { model } = await api<{ model: SiteModelRow }>(base(), { method: 'POST', body })
    await res.refresh()
    return model
  }
  return { ...res, create }
}

/** One model with its draft, saved versions and the caller's role, keyed by project and model. */
export function useSiteModel(projectId: MaybeRefOrGetter<string>, modelId: MaybeRefOrGetter<string>) {
  return useApi<ModelDetail | null>(
    () => `model-${toValue(projectId)}-${toValue(modelId)}`,
    () => modelUrl(toValue(projectId), toValue(modelId)),
    () => null,
  )
}

/** One saved version, read-only. */
export function useSiteModelVersion(projectId: MaybeRefOrGetter<string>, modelId: MaybeRefOrGetter<string>, version: MaybeRefOrGetter<number>) {
  return useApi<{ model: { id: string, name: string }, version: ModelVersionRow } | null>(
    () => `model-version-${toValue(projectId)}-${toValue(modelId)}-${toValue(version)}`,
    () => `${modelUrl(toValue(projectId), toValue(modelId))}/versions/${toValue(version)}`,
    () => null,
  )
}

/** Export links of a saved version (JSON for settlement tools, XLSX sublayer table). */
export function versionExportUrl(projectId: string, modelId: string, version: number, format: 'json' | 'xlsx'): string {
  return `${modelUrl(projectId, modelId)}/versions/${version}/export${format === 'xlsx' ? '?format=xlsx' : ''}`
}
