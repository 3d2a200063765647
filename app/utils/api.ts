import type { NitroFetchOptions } from 'nitropack'
import type { PageReader } from './listPages'

/** `useRequestFetch()` (it forwards the page's cookies during SSR) or `$fetch` itself, which is one of its two types. */
export type ApiFetch = ReturnType<typeof useRequestFetch>

/**
 * `$fetch` with the URL typed as a plain string and the response type given by
 * the caller. Nuxt's typed-route inference on template-literal URLs of nested
 * project routes overflows the type checker; this keeps calls checked elsewhere.
 * Reads inside `useAsyncData` pass `useRequestFetch()` as `fetcher`.
 */
export function api<T = unknown>(url: string, options?: NitroFetchOptions<string>, fetcher: ApiFetch = $fetch): Promise<T> {
  return fetcher<T>(url, options as never) as Promise<T>
}

/** A read through `fetcher` that `signal` may cancel (a newer read of the same key). */
export function apiRead<T>(url: string, signal?: AbortSignal, fetcher: ApiFetch = $fetch): Promise<T> {
  return fetcher<T>(url, { signal } as never) as Promise<T>
}

/** Reads a list route's pages through `fetcher` (see readAllPages in app/utils/listPages.ts). */
export function pageReader(fetcher: ApiFetch = $fetch): PageReader {
  return (url, signal) => apiRead<unknown>(url, signal, fetcher)
}
