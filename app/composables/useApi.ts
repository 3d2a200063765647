import { pageReader } from '~/utils/api'
import { readAllPages, type ListRead } from '~/utils/listPages'

/**
 * Server state keyed by a reactive key (refresh by key after a mutation); the
 * URL is a plain string (see app/utils/api.ts). Cookies are forwarded in SSR;
 * a newer read of the same key cancels the older one.
 */
export function useApi<T>(key: MaybeRefOrGetter<string>, url: MaybeRefOrGetter<string>, defaultValue: () => T) {
  const fetcher = useRequestFetch()
  return useAsyncData(
    () => toValue(key),
    (_nuxtApp, { signal }) => apiRead<T>(toValue(url), signal, fetcher),
    { default: defaultValue },
  )
}

/** One record read with `useApi`: `null` until it is read, and when the read fails. */
export function useApiRecord<T>(key: MaybeRefOrGetter<string>, url: MaybeRefOrGetter<string>) {
  return useApi<T | null>(key, url, () => null)
}

/**
 * A whole list route read page by page (see app/utils/listPages.ts), keyed like
 * `useApi`; `data.cut` says when the cap stopped it, for the page to say so.
 */
export function useApiList<R, T>(key: MaybeRefOrGetter<string>, url: MaybeRefOrGetter<string>, pick: (reply: R) => T[], options: { server?: boolean } = {}) {
  const read = pageReader(useRequestFetch())
  return useAsyncData(
    () => toValue(key),
    (_nuxtApp, { signal }) => readAllPages(read, toValue(url), pick, { signal }),
    { default: (): ListRead<T> => ({ rows: [], total: 0, cut: false }), server: options.server },
  )
}
