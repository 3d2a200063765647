/**
 * Facts the code's own writes guarantee, checked instead of asserted: a miss is a
 * server fault (500), never a user's mistake, so a plain Error is the right answer.
 */

/** The one row an INSERT/UPDATE … RETURNING of a single row gives back. */
export function returnedRow<Row>(rows: readonly Row[]): Row {
  const row = rows[0]
  if (row === undefined) throw new Error('The database returned no row for a single-row write.')
  return row
}

/** A value the caller put in the map itself (e.g. the ids of rows it just inserted). */
export function knownEntry<K, V>(map: ReadonlyMap<K, V>, key: K): V {
  const value = map.get(key)
  if (value === undefined) throw new Error('A row written in this transaction has no id.')
  return value
}

/** A value the server's own fixed data is known to hold (e.g. a demo person by role). */
export function present<T>(value: T | undefined | null, what: string): T {
  if (value === undefined || value === null) throw new Error(`${what} is missing.`)
  return value
}
