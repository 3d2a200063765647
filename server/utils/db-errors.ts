/** PostgreSQL's unique_violation (23505), as raised through pg and Drizzle. */
export function isUniqueViolation(err: unknown): boolean {
  return pgCode(err) === '23505'
}

export function pgCode(err: unknown): string | undefined {
  let e: unknown = err
  for (let i = 0; i < 3 && e && typeof e === 'object'; i++) {
    const code = (e as { code?: unknown }).code
    if (typeof code === 'string') return code
    e = (e as { cause?: unknown }).cause
  }
  return undefined
}
