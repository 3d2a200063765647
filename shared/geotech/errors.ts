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
    super(plainNumbers(message))
    this.name = 'GeotechError'
    this.code = code
    this.depth = options.depth
    this.detail = options.detail
  }
}

export function isGeotechError(value: unknown): value is GeotechError {
  return value instanceof GeotechError
}

/**
 * A message never shows `NaN` or `Infinity`: a value that is not a finite number
 * reads as a plain phrase instead, wherever a message template put it.
 */
export function plainNumbers(message: string): string {
  return message
    .replace(/\(got (?:-?Infinity|NaN)(?: [^)]*)?\)/g, '(got a value that is not a finite number)')
    .replace(/-Infinity\b/g, 'an infinitely large negative value')
    .replace(/\bInfinity\b/g, 'an infinitely large value')
    .replace(/\bNaN\b/g, 'a value that is not a number')
}
