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
