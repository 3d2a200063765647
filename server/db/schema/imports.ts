import { customType, index, integer, jsonb, pgTable, text, uniqueIndex } from 'drizzle-orm/pg-core'
import { createdAt, ownedRow, timestamps } from './columns'
import { projects } from './projects'
import { namedUser } from './users'

const bytea = customType<{ data: Buffer, driverData: Buffer }>({ dataType: () => 'bytea' })

/**
 * An uploaded file waiting for its column mapping and commit. Kept in the
 * database (not memory) so a preview survives a restart; removed on commit and
 * after a day.
 */
export const importFiles = pgTable('import_files', {
  ...ownedRow('projectId', () => projects.id),
  uploadedBy: namedUser(),
  filename: text().notNull(),
  format: text().notNull(),
  size: integer().notNull(),
  content: bytea().notNull(),
  createdAt: createdAt(),
}, t => [index('import_files_project_idx').on(t.projectId, t.createdAt)])

/**
 * A saved column mapping for one import kind, so the next file of the same layout maps itself, with the
 * unit of each numeric column (`{ qc: 'MPa' }`; null for a mapping saved before units were kept).
 */
export const importMappings = pgTable('import_mappings', {
  ...ownedRow('projectId', () => projects.id),
  target: text().notNull(),
  mapping: jsonb().$type<Record<string, string>>().notNull(),
  units: jsonb().$type<Record<string, string>>(),
  savedBy: namedUser(),
  ...timestamps,
}, t => [uniqueIndex('import_mappings_project_target_idx').on(t.projectId, t.target)])
