import type { ModelDetail, ModelDrawingReply, ModelList, ModelVersionReply, SiteModelRow } from '#shared/types/models'

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

/**
 * The saved draft drawn by the server, read while the server renders the page (a visit's first page); the browser
 * takes it from the page and never asks for it. Null where there is none: after an in-app navigation, or when the
 * draft cannot be drawn (the workspace then opens at once and says why).
 */
export function useModelDrawing(projectId: MaybeRefOrGetter<string>, modelId: MaybeRefOrGetter<string>) {
  const fetcher = useRequestFetch()
  return useAsyncData(
    () => `model-drawing-${toValue(projectId)}-${toValue(modelId)}`,
    (_nuxtApp, { signal }) => apiRead<ModelDrawingReply>(`${modelUrl(toValue(projectId), toValue(modelId))}/drawing`, signal, fetcher),
    { default: () => null, immediate: import.meta.server },
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
