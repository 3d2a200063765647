import type { PointListItem } from '#shared/types/investigation'
import { pageReader } from '~/utils/api'
import { readAllPages } from '~/utils/listPages'

/**
 * Every point of a project for the plan and the list, read page by page so a
 * large investigation is complete; keyed by project (refresh after adding one).
 */
export function usePoints(projectId: MaybeRefOrGetter<string>) {
  const read = pageReader(useRequestFetch())
  return useAsyncData(
    () => `points-${toValue(projectId)}`,
    async (_nuxtApp, { signal }) => {
      const list = await readAllPages(read, `/api/projects/${toValue(projectId)}/points`, (r: { points: PointListItem[] }) => r.points, { signal })
      return { points: list.rows, total: list.total ?? list.rows.length, cut: list.cut }
    },
    { default: () => ({ points: [] as PointListItem[], total: 0, cut: false }) },
  )
}
