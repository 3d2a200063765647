/** Methods a read-only token may use anywhere; the compute routes write nothing, so it may POST there too. */
const READ_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])
const COMPUTE_PREFIX = '/api/calc/'

/** True when a read-only API token may make this request (`path` as sent, query included). */
export function readOnlyTokenMayCall(method: string, path: string): boolean {
  if (READ_METHODS.has(method.toUpperCase())) return true
  const raw = path.split('?')[0] ?? ''
  // Only a plain compute path: nothing that normalises to somewhere else ("..", "%2e", "//").
  const normalised = new URL(raw, 'http://localhost').pathname
  return normalised === raw && !raw.includes('//') && raw.startsWith(COMPUTE_PREFIX)
}
