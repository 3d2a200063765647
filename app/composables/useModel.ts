import type { ModelDetail, ModelList, ModelVersionReply, SiteModelRow } from '#shared/types/models'

export function modelUrl(projectId: string, modelId: string): string {
  return `/api/projects/${projectId}/models/${modelId}`
}

/** The project's models, with the create call of the list page. */
export function useSiteModels(projectId: MaybeRefOrGetter<string>) {
  const base = () => `/api/projects/${toValue(projectId)}/models`
  const res = useApi<ModelList>(() => `models-${toValue(projectId)}`, base, () => ({ models: [] }))
  async function create(body: { name: string, description: string, from?: { modelId: string, version: number } }): Promise<SiteModelRow> {
    const { model } = await api<{ model: SiteModelRow }>(base(), { method: 'POST', body })
    await res.refresh()
    return model
  }
  return { ...res, create }
}

/** One model with its draft, saved versions and the caller's role, keyed by project and model. */
export function useSiteModel(projectId: MaybeRefOrGetter<string>, modelId: MaybeRefOrGetter<string>) {
  return useApiRecord<ModelDetail>(
    () => `model-${toValue(projectId)}-${toValue(modelId)}`,
    () => modelUrl(toValue(projectId), toValue(modelId)),
  )
}

/** One saved version, read-only, with its review (key `model-version:<modelId>:<version>`, refreshed by live version events). */
export function useSiteModelVersion(projectId: MaybeRefOrGetter<string>, modelId: MaybeRefOrGetter<string>, version: MaybeRefOrGetter<number>) {
  return useApiRecord<ModelVersionReply>(
    () => `model-version:${toValue(modelId)}:${toValue(version)}`,
    () => `${modelUrl(toValue(projectId), toValue(modelId))}/versions/${toValue(version)}`,
  )
}

/** Export links of a saved version (JSON for settlement tools, XLSX sublayer table). */
export function versionExportUrl(projectId: string, modelId: string, version: number, format: 'json' | 'xlsx'): string {
  return `${modelUrl(projectId, modelId)}/versions/${version}/export${format === 'xlsx' ? '?format=xlsx' : ''}`
}
