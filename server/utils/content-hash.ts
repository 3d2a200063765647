import { createHash } from 'node:crypto'
import { stringify } from 'safe-stable-stringify'

/**
 * SHA-256 (hex) of a value's canonical JSON: keys sorted at every level, so the same
 * content always gives the same hash whatever order its keys were written in.
 * An approval records this hash of the version's definition.
 */
export function contentHash(value: unknown): string {
  return createHash('sha256').update(stringify(value) ?? 'null').digest('hex')
}
