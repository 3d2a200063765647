import type { PointListItem, PointPage } from '#shared/types/investigation'

/** The API's largest page (shared/schemas/investigation.ts, PointListQuerySchema). */
const PAGE = 500

/**
 * Every point of a project for the plan and the list, read page by page so a
 * large investigation is complete; keyed by project (refresh after adding one).
 */
export function usePoints(projectId: MaybeRefOrGetter<string>) {
  const fetcher = useRequestFetch() as unknown as (url: string) => Promise<PointPage>
  return useAsyncData(
    () => `points-${toValue(projectId)}`,
    async () => {
      const all: PointListItem[] = []
      let total = 0
      for (let offset = 0; ; offset += PAGE) {
        const page = await fetcher(`/api/projects/${toValue(projectId)}/points?limit=${PAGE}&offset=${offset}`)
        all.push(...page.points)
        total = page.total
        if (page.points.length < PAGE || all.length >= total) break
      }
      return { points: all, total }
    },
    { default: () => ({ points: [] as PointListItem[], total: 0 }) },
  )
}
