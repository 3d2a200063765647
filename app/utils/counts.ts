// Counts on the pages: "12,345" (see shared/text/count.ts for why not Intl).
import { groupThousands } from '#shared/text/count'

/** A whole number with its thousands grouped as the pages show them: "12,345". */
export function formatCount(n: number): string {
  return groupThousands(n, ',')
}
