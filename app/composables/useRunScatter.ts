import type { RunScatterReply } from '#shared/types/settlement-runs'

/**
 * The COVs "from the data" of a model version's compressible strata (`GET …/settlement-runs/scatter`),
 * read on the client once the run editor's probability inputs are switched on for that version.
 */
export function useRunScatter(
  projectId: MaybeRefOrGetter<string>,
  model: MaybeRefOrGetter<{ modelId: string, version: number } | null>,
  active: MaybeRefOrGetter<boolean>,
) {
  const key = computed(() => {
    const m = toValue(model)
    return m && toValue(active) ? `run-scatter:${m.modelId}:${m.version}` : 'run-scatter:none'
  })
  return useAsyncData<RunScatterReply | null>(
    () => key.value,
    async (_app, { signal }) => {
      const m = toValue(model)
      if (!m || !toValue(active)) return null
      const q = new URLSearchParams({ modelId: m.modelId, version: String(m.version) })
      return apiRead<RunScatterReply>(`/api/projects/${toValue(projectId)}/settlement-runs/scatter?${q}`, signal)
    },
    { server: false, default: () => null },
  )
}
