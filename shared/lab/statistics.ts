import { median as medianOf } from 'd3'

/**
 * The median of a set of lab results (the mean of the middle two for an even
 * count); null when there are none.
 */
export function median(values: Iterable<number>): number | null {
  return medianOf(values) ?? null
}
