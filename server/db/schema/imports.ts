import { customType, index, integer, jsonb, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { timestamps } from './columns'
import { projects } from './projects'
import { users } from './users'

const bytea = customType<{ data: Buffer, driverData: Buffer }>({ dataType: () => 'bytea' })

/**
 * An uploaded file waiting for its column mapping and commit. Kept in the
 * database (not memory) so a preview survives a restart; removed on commit and
 * after a day.
 */
export const importFiles = pgTable('import_files', {
  id: uuid().primaryKey().defaultRandom(),
  projectId: uuid().notNull().references(() => projects.id, { onDelete: 'cascade' }),
  uploadedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  filename: text().notNull(),
  format: text().notNull(),
  size: integer().notNull(),
  content: bytea().notNull(),
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [index('import_files_project_idx').on(t.projectId, t.createdAt)])

/**
 * A saved column mapping for one import kind, so the next file of the same layout maps itself, with the
 * unit of each numeric column (`{ qc: 'MPa' }`; null for a mapping saved before units were kept).
 */
export const importMappings = pgTable('import_mappings', {
  id: uuid().primaryKey().defaultRandom(),
  projectId: uuid().notNull().references(() => projects.id, { onDelete: 'cascade' }),
  target: text().notNull(),
  mapping: jsonb().$type<Record<string, string>>().notNull(),
  units: jsonb().$type<Record<string, string>>(),
  savedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('import_mappings_project_target_idx').on(t.projectId, t.target)])
