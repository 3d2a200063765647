import type { CptSounding, PointDetail } from '#shared/types/investigation'

export function pointUrl(projectId: string, pointId: string): string {
  return `/api/projects/${projectId}/points/${pointId}`
}

/** One point with everything logged at it, keyed by project and point (refresh after a write). */
export function usePoint(projectId: MaybeRefOrGetter<string>, pointId: MaybeRefOrGetter<string>) {
  return useApiRecord<PointDetail>(
    () => `point-${toValue(projectId)}-${toValue(pointId)}`,
    () => pointUrl(toValue(projectId), toValue(pointId)),
  )
}

/** The CPT sounding's arrays; fetched in the browser only, and only when the point has one. */
export function useCptSounding(projectId: MaybeRefOrGetter<string>, pointId: MaybeRefOrGetter<string>, hasSounding: MaybeRefOrGetter<boolean>) {
  return useAsyncData<CptSounding | null>(
    () => `cpt-${toValue(projectId)}-${toValue(pointId)}`,
    async () => (toValue(hasSounding) ? api<CptSounding>(`${pointUrl(toValue(projectId), toValue(pointId))}/cpt`) : null),
    { server: false, default: () => null, watch: [() => toValue(hasSounding)] },
  )
}
