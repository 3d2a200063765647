import { sptFromInput, sptStored, type SptStored } from '#shared/investigation/spt-blows'
import { unprocessableError } from './http-errors'

/**
 * The columns of an SPT row from the route's body: the blows read into increments
 * (shared/investigation/spt-blows.ts), how many belong to the seating drive, the test
 * drive's blows and, when it stopped short, its penetration.
 */
export function sptValues(body: { depth: number, blows: string | readonly number[], penetration: number | null }): Record<string, unknown> & SptStored & { depth: number } {
  const read = sptFromInput(body.blows, body.penetration)
  // The schema has read the blows already; this only guards a caller that skipped it.
  if (!read.ok) throw unprocessableError(read.error)
  return { depth: body.depth, ...sptStored(read.value) }
}
