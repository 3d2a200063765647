import type { NitroFetchOptions } from 'nitropack'

/**
 * `$fetch` with the URL typed as a plain string and the response type given by
 * the caller. Nuxt's typed-route inference on template-literal URLs of nested
 * project routes overflows the type checker; this keeps calls checked elsewhere.
 */
export function api<T = unknown>(url: string, options?: NitroFetchOptions<string>): Promise<T> {
  return $fetch<T>(url, options as never) as Promise<T>
}
