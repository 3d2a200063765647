import type { FlagTarget, FlagVerdict } from '#shared/review/flags'
import type { FlagStatus, ReviewFlag, ReviewThreadReply } from '#shared/types/review'
import { pageReader } from '~/utils/api'
import { cutNote, readAllPages, type ListRead } from '~/utils/listPages'

export interface FlagQuery {
  status?: FlagStatus
  targetType?: FlagTarget
  verdict?: FlagVerdict
  targetId?: string
}

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

/** The keys of the flag lists and threads read on this page, so a change refreshes them all by key. */
function useFlagKeys() {
  return useState<string[]>('review-flag-keys', () => [])
}

/** Remembers each key `key()` takes while the calling component lives. */
function rememberFlagKey(key: () => string) {
  const keys = useFlagKeys()
  watch(key, (k) => {
    if (k && !keys.value.includes(k)) keys.value = [...keys.value, k]
  }, { immediate: true })
}

/**
 * A project's flags (all of them, or one target's, or those matching a filter),
 * read page by page, keyed by project and query so every list of the project
 * can be refreshed together after a change. `flagsByTarget` groups them by the
 * flagged record's id; `listNote` says so when the list stopped at its cap.
 */
export function useReviewFlags(projectId: MaybeRefOrGetter<string>, query: MaybeRefOrGetter<FlagQuery> = {}) {
  const read = pageReader(useRequestFetch())
  const key = () => `${listPrefix(toValue(projectId))}-${queryString(toValue(query)) || 'all'}`
  rememberFlagKey(key)
  const res = useAsyncData(
    key,
    async (_nuxtApp, { signal }): Promise<ListRead<ReviewFlag>> => {
      const id = toValue(projectId)
      if (!id) return { rows: [], total: 0, cut: false }
      const qs = queryString(toValue(query))
      return readAllPages(read, `${flagsUrl(id)}${qs ? `?${qs}` : ''}`, (r: { flags: ReviewFlag[] }) => r.flags, { signal })
    },
    { default: (): ListRead<ReviewFlag> => ({ rows: [], total: 0, cut: false }) },
  )
  const flags = computed(() => res.data.value.rows)
  const flagsByTarget = computed(() => {
    const map = new Map<string, ReviewFlag[]>()
    for (const f of flags.value) map.set(f.targetId, [...(map.get(f.targetId) ?? []), f])
    return map
  })
  return { ...res, flags, flagsByTarget, listNote: computed(() => cutNote(res.data.value, 'flags')) }
}

/**
 * A function that refreshes every flag list and thread of the project on the
 * page (bound to this component's Nuxt app, so it can run after an await).
 */
export function useReviewFlagsRefresh(projectId: MaybeRefOrGetter<string>) {
  const nuxtApp = useNuxtApp()
  const keys = useFlagKeys()
  return async () => {
    const id = toValue(projectId)
    const mine = keys.value.filter(k => k.startsWith(listPrefix(id)) || k.startsWith(threadPrefix(id)))
    if (mine.length) await nuxtApp.runWithContext(() => refreshNuxtData(mine))
  }
}

/** One flag with its replies in order (refreshed with the project's lists). */
export function useReviewThread(projectId: MaybeRefOrGetter<string>, flagId: MaybeRefOrGetter<string>) {
  const key = () => reviewThreadKey(toValue(projectId), toValue(flagId))
  rememberFlagKey(key)
  return useApi<ReviewThreadReply | null>(
    key,
    () => `${flagsUrl(toValue(projectId))}/${toValue(flagId)}`,
    () => null,
  )
}

/** Open flags only. */
export function openFlags(list: readonly ReviewFlag[] | undefined): ReviewFlag[] {
  return (list ?? []).filter(f => f.status === 'open')
}
