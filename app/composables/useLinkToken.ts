/**
 * The one-time link a page was opened with (`/invitations/[token]`, `/reset-password/[token]`):
 * the token, what the server says it is for, and — for an unknown, used, withdrawn or
 * expired link — the server's plain words why it no longer works (`linkProblem`).
 */
export async function useLinkToken<T>(key: string, url: (token: string) => string) {
  const route = useRoute()
  const token = computed(() => String(route.params.token ?? ''))
  const res = await useAsyncData(key, () => api<T>(url(encodeURIComponent(token.value)), undefined, useRequestFetch()))
  const linkProblem = computed(() => res.error.value ? apiErrorMessage(res.error.value) : '')
  return { ...res, token, linkProblem }
}
