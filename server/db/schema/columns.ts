import type { AnyPgColumn } from 'drizzle-orm/pg-core'
import { integer, timestamp, uuid } from 'drizzle-orm/pg-core'

/** A moment with its time zone, read as a `Date`: every stamp the tables keep (null until set, unless chained). */
export const moment = () => timestamp({ withTimezone: true, mode: 'date' })

/** When the row was written. */
export const createdAt = () => moment().notNull().defaultNow()

/** created/updated stamps shared by every table that users edit. */
export const timestamps = {
  createdAt: createdAt(),
  updatedAt: moment().notNull().defaultNow().$onUpdate(() => new Date()),
}

/** A row's own key: a random UUID. */
export const rowKey = () => uuid().primaryKey().defaultRandom()

/** Optimistic concurrency: every write sends the version it read; a stale one is 409. */
export const versioned = { version: integer().notNull().default(1) }

/**
 * The columns a row of a parent record opens with: its own random UUID key (`id`), and the parent's id under
 * `parentKey`, the row deleted with its parent.
 */
export function ownedRow<K extends string>(parentKey: K, parent: () => AnyPgColumn) {
  const parentId = uuid().notNull().references(parent, { onDelete: 'cascade' })
  return { id: rowKey(), [parentKey]: parentId } as { id: ReturnType<typeof rowKey> } & Record<K, typeof parentId>
}
