import type { NitroFetchOptions } from 'nitropack'
import type { PageReader } from './listPages'
import { nextTask } from './nextTask'

/** `useRequestFetch()` (it forwards the page's cookies during SSR) or `$fetch` itself, which is one of its two types. */
export type ApiFetch = ReturnType<typeof useRequestFetch>

/**
 * `$fetch` with the URL typed as a plain string and the response type given by
 * the caller. Nuxt's typed-route inference on template-literal URLs of nested
 * project routes overflows the type checker; this keeps calls checked elsewhere.
 * Reads inside `useAsyncData` pass `useRequestFetch()` as `fetcher`.
 */
export async function api<T = unknown>(url: string, options?: NitroFetchOptions<string>, fetcher: ApiFetch = $fetch): Promise<T> {
  await afterThisTask()
  return fetcher<T>(url, options as never) as Promise<T>
}

/** A read through `fetcher` that `signal` may cancel (a newer read of the same key). */
export async function apiRead<T>(url: string, signal?: AbortSignal, fetcher: ApiFetch = $fetch): Promise<T> {
  await afterThisTask()
  return fetcher<T>(url, { signal } as never) as Promise<T>
}

/**
 * In the browser a request leaves in the task after the one that asked for it. A page or panel asks for its data
 * while it is being built, and building each request costs the page's thread a little: sent at once, they would
 * lengthen the task that builds the page; sent just after it, the page is drawn and answers input first. On the
 * server there is nothing to wait for.
 */
async function afterThisTask(): Promise<void> {
  if (import.meta.client) await nextTask()
}

/** Reads a list route's pages through `fetcher` (see readAllPages in app/utils/listPages.ts). */
export function pageReader(fetcher: ApiFetch = $fetch): PageReader {
  return (url, signal) => apiRead<unknown>(url, signal, fetcher)
}
