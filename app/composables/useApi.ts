type PlainFetch = (url: string) => Promise<unknown>

/**
 * Server state keyed by a reactive key (refresh by key after a mutation); the
 * URL is a plain string (see app/utils/api.ts). Cookies are forwarded in SSR.
 */
export function useApi<T>(key: MaybeRefOrGetter<string>, url: MaybeRefOrGetter<string>, defaultValue: () => T) {
  const fetcher = useRequestFetch() as unknown as PlainFetch
  return useAsyncData(
    () => toValue(key),
    () => fetcher(toValue(url)) as Promise<T>,
    { default: defaultValue },
  )
}
