import { timestamp } from 'drizzle-orm/pg-core'

/** created/updated stamps shared by every table that users edit. */
export const timestamps = {
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
  updatedAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow().$onUpdate(() => new Date()),
}
