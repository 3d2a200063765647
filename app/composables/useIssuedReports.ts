import type { IssuedReportList } from '#shared/types/reports'

/** The project's issued reports (key `reports-<projectId>`: refresh it after issuing one). */
export function useIssuedReports(projectId: MaybeRefOrGetter<string>) {
  return useApi<IssuedReportList>(
    () => `reports-${toValue(projectId)}`,
    () => `/api/projects/${toValue(projectId)}/reports`,
    () => ({ reports: [], total: 0 }),
  )
}
