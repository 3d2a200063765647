import type { FlagTarget, FlagVerdict } from '#shared/review/flags'
import type { FlagStatus, ReviewFlag, ReviewFlagPage } from '#shared/types/review'

export interface FlagQuery {
  status?: FlagStatus
  targetType?: FlagTarget
  verdict?: FlagVerdict
  targetId?: string
}

/** The list route's largest page (shared/schemas/review.ts). */
const PAGE = 500

export function flagsUrl(projectId: string): string {
  return `/api/projects/${projectId}/flags`
}

const listPrefix = (projectId: string) => `review-flags-${projectId}`
const threadPrefix = (projectId: string) => `review-thread-${projectId}`

export function reviewThreadKey(projectId: string, flagId: string): string {
  return `${threadPrefix(projectId)}-${flagId}`
}

function queryString(q: FlagQuery): string {
  const parts = (['status', 'targetType', 'verdict', 'targetId'] as const)
    .filter(k => q[k])
    .map(k => `${k}=${encodeURIComponent(q[k]!)}`)
  return parts.join('&')
}

/**
 * A project's flags (all of them, or one target's, or those matching a filter),
 * read page by page, keyed by project and query so every list of the project
 * can be refreshed together after a change. `flagsByTarget` groups them by the
 * flagged record's id.
 */
export function useReviewFlags(projectId: MaybeRefOrGetter<string>, query: MaybeRefOrGetter<FlagQuery> = {}) {
  const fetcher = useRequestFetch() as unknown as (url: string) => Promise<ReviewFlagPage>
  const res = useAsyncData(
    () => `${listPrefix(toValue(projectId))}-${queryString(toValue(query)) || 'all'}`,
    async () => {
      const id = toValue(projectId)
      if (!id) return []
      const qs = queryString(toValue(query))
      const all: ReviewFlag[] = []
      for (let offset = 0; ; offset += PAGE) {
        const page = await fetcher(`${flagsUrl(id)}?${qs ? `${qs}&` : ''}limit=${PAGE}&offset=${offset}`)
        all.push(...page.flags)
        if (page.flags.length < PAGE) break
      }
      return all
    },
    { default: () => [] as ReviewFlag[] },
  )
  const flagsByTarget = computed(() => {
    const map = new Map<string, ReviewFlag[]>()
    for (const f of res.data.value) map.set(f.targetId, [...(map.get(f.targetId) ?? []), f])
    return map
  })
  return { ...res, flags: res.data, flagsByTarget }
}

/**
 * A function that refreshes every flag list and thread of the project on the
 * page (bound to this component's Nuxt app, so it can run after an await).
 */
export function useReviewFlagsRefresh(projectId: MaybeRefOrGetter<string>) {
  const nuxtApp = useNuxtApp()
  return async () => {
    const id = toValue(projectId)
    const known = new Set([...Object.keys(nuxtApp.payload.data), ...Object.keys(nuxtApp._asyncData)])
    const keys = [...known].filter(k => k.startsWith(listPrefix(id)) || k.startsWith(threadPrefix(id)))
    if (keys.length) await nuxtApp.runWithContext(() => refreshNuxtData(keys))
  }
}

/** One flag with its replies in order (refreshed with the project's lists). */
export function useReviewThread(projectId: MaybeRefOrGetter<string>, flagId: MaybeRefOrGetter<string>) {
  return useApi<ReviewThreadReply | null>(
    () => reviewThreadKey(toValue(projectId), toValue(flagId)),
    () => `${flagsUrl(toValue(projectId))}/${toValue(flagId)}`,
    () => null,
  )
}

/** Open flags only. */
export function openFlags(list: readonly ReviewFlag[] | undefined): ReviewFlag[] {
  return (list ?? []).filter(f => f.status === 'open')
}
