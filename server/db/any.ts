import { type Column, type SQL, sql } from 'drizzle-orm'

/**
 * `column = ANY($1::uuid[])`: a list of ids sent as ONE array parameter.
 * Drizzle's `inArray` sends one parameter per id, and PostgreSQL's protocol
 * counts parameters in 16 bits: past 65 535 ids the query fails (and long
 * lists build deep SQL trees). Use this for every list that grows with the data.
 */
export function anyOf(column: Column | SQL, ids: readonly string[]): SQL {
  return sql`${column} = ANY(${sql.param([...ids])}::uuid[])`
}
