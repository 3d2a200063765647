import type { RunPointDetail, SettlementRun, SettlementRunList, SettlementRunView } from '#shared/types/settlement-runs'

/**
 * A project's settlement runs as the results pages read them, keyed so the parent page's live
 * `run.changed` handler refreshes them by prefix (`settlement-runs-<projectId>`, `settlement-run:<runId>`).
 */
export function settlementRunsUrl(projectId: string): string {
  return `/api/projects/${projectId}/settlement-runs`
}

export function settlementRunUrl(projectId: string, runId: string): string {
  return `${settlementRunsUrl(projectId)}/${runId}`
}

/** The project's runs, newest first, with their headline figures. */
export function useSettlementRunList(projectId: MaybeRefOrGetter<string>) {
  return useApi<SettlementRunList>(
    () => `settlement-runs-${toValue(projectId)}`,
    () => `${settlementRunsUrl(toValue(projectId))}?limit=200`,
    () => ({ runs: [], total: 0 }),
  )
}

/** One run with its inputs and, once finished, its results. */
export function useSettlementRunDetail(projectId: MaybeRefOrGetter<string>, runId: MaybeRefOrGetter<string>) {
  return useApiRecord<{ run: SettlementRun }>(
    () => `settlement-run:${toValue(runId)}`,
    () => settlementRunUrl(toValue(projectId), toValue(runId)),
  )
}

/**
 * One run as its results page shows it: the points' time curves (about nine tenths of a finished run's reply) are
 * left out of what the server reads and sends (`?curves=none`), and so of what the page keeps and sends with its HTML; the page reads the curves of the point it shows with that
 * point's detail (`useSettlementRunPoint`). Keyed under the run's own key, so a `run.changed` refresh reaches it.
 */
export function useSettlementRunView(projectId: MaybeRefOrGetter<string>, runId: MaybeRefOrGetter<string>) {
  const fetcher = useRequestFetch()
  return useAsyncData(
    () => `settlement-run:${toValue(runId)}:view`,
    async (_nuxtApp, { signal }): Promise<{ run: SettlementRunView }> => {
      return apiRead<{ run: SettlementRunView }>(`${settlementRunUrl(toValue(projectId), toValue(runId))}?curves=none`, signal, fetcher)
    },
    { default: () => null },
  )
}

/** A named point's sublayer table and curves (read on the client when its tab opens). */
export function useSettlementRunPoint(projectId: MaybeRefOrGetter<string>, runId: MaybeRefOrGetter<string>, index: MaybeRefOrGetter<number | null>) {
  const fetcher = useRequestFetch()
  return useAsyncData(
    () => `settlement-run-point:${toValue(runId)}:${toValue(index) ?? 'none'}`,
    async (_nuxtApp, { signal }) => {
      const i = toValue(index)
      if (i === null) return null
      const { point } = await apiRead<{ point: RunPointDetail }>(`${settlementRunUrl(toValue(projectId), toValue(runId))}/points/${i}`, signal, fetcher)
      return point
    },
    { default: () => null, server: false },
  )
}

/**
 * While a run is queued or running, reads it again every `ms` (the live stream's fallback: a page
 * whose stream is down still sees the run finish). Stops once it is finished or failed.
 */
export function useSettlementRunPolling(active: MaybeRefOrGetter<boolean>, refresh: () => Promise<unknown>, ms = 2000) {
  if (import.meta.server) return
  let timer: ReturnType<typeof setInterval> | null = null
  let busy = false
  const stop = () => {
    if (timer) clearInterval(timer)
    timer = null
  }
  const start = () => {
    if (timer) return
    timer = setInterval(() => {
      if (busy) return
      busy = true
      void refresh().finally(() => {
        busy = false
      })
    }, ms)
  }
  onMounted(() => {
    watch(() => toValue(active), on => (on ? start() : stop()), { immediate: true })
  })
  onBeforeUnmount(stop)
}
