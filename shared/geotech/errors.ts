/**
 * A physically impossible or unusable input for the engine (for example a zero
 * or negative effective stress, a layer of zero thickness, e0 ≤ 0, a curve with
 * no yield). The HTTP layer maps it to 422 with `message` as the plain reason.
 */
export class GeotechError extends Error {
  /** Stable machine-readable code, e.g. `effective-stress-not-positive`. */
  readonly code: string
  /** Depth (m) the problem occurs at, when there is one. */
  readonly depth?: number
  /** Extra machine-readable detail for API clients. */
  readonly detail?: Record<string, unknown>

  constructor(code: string, message: string, options: { depth?: number, detail?: Record<string, unknown> } = {}) {
    super(message)
    this.name = 'GeotechError'
    this.code = code
    this.depth = options.depth
    this.detail = options.detail
  }
}

export function isGeotechError(value: unknown): value is GeotechError {
  return value instanceof GeotechError
}
