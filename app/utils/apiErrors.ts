interface ApiIssue { path: string, message: string }

/** The message and field issues of a failed $fetch, as the server wrote them. */
export function apiErrorMessage(err: unknown): string {
  const data = (err as { data?: { message?: string } })?.data
  if (data?.message) return data.message
  if (err instanceof Error) return err.message
  return 'Something went wrong.'
}

export function apiErrorIssues(err: unknown): ApiIssue[] {
  const issues = (err as { data?: { data?: { issues?: ApiIssue[] } } })?.data?.data?.issues
  return Array.isArray(issues) ? issues : []
}

/** The HTTP status of a failed $fetch, when there is one. */
export function apiErrorStatus(err: unknown): number | undefined {
  const status = (err as { statusCode?: unknown })?.statusCode
  return typeof status === 'number' ? status : undefined
}

/** The row as the server now has it, when a versioned write was refused as stale (409 with `data.current`). */
export function apiConflictCurrent<T>(err: unknown): T | null {
  if (apiErrorStatus(err) !== 409) return null
  const current = (err as { data?: { data?: { current?: T } } })?.data?.data?.current
  return current ?? null
}
