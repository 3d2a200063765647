/**
 * Revision letters of issued reports: A, B, … Z, then AA, AB, … (as columns are lettered), counted per
 * project, report kind and record.
 */
export function revisionLetter(index: number): string {
  let n = Math.max(0, Math.floor(index))
  let out = ''
  do {
    out = String.fromCharCode(65 + (n % 26)) + out
    n = Math.floor(n / 26) - 1
  } while (n >= 0)
  return out
}

/** The position of a letter (A → 0), or -1 for something that is not one. */
export function revisionIndex(letter: string): number {
  if (!/^[A-Z]{1,3}$/.test(letter)) return -1
  let n = 0
  for (const c of letter) n = n * 26 + (c.charCodeAt(0) - 64)
  return n - 1
}

/** The record the letters count on: the source id, with the version for a model version. */
export function reportSourceKey(source: { id: string, version?: number | null }): string {
  return source.version === undefined || source.version === null ? source.id : `${source.id}@v${source.version}`
}

/**
 * The letter the next issue of a record gets, from the letters it already holds: one past the highest, except
 * that a failed report made on the job queue (its PDF never stored) is retried under its own letter, so no
 * letter is handed out twice and none is skipped.
 */
export function nextRevisionOf(held: readonly { revision: string, status: string }[]): { revision: string, retry: boolean } {
  let top: { index: number, status: string } | null = null
  for (const h of held) {
    const index = revisionIndex(h.revision)
    if (!top || index > top.index) top = { index, status: h.status }
  }
  if (top && top.index >= 0 && top.status === 'failed') return { revision: revisionLetter(top.index), retry: true }
  return { revision: revisionLetter((top?.index ?? -1) + 1), retry: false }
}
