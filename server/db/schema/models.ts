import { index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import type { SiteModelDefinition } from '#shared/site-model/definition'
import { timestamps } from './columns'
import { projects } from './projects'
import { users } from './users'

export const modelVersionStatus = pgEnum('model_version_status', ['saved', 'submitted', 'approved', 'returned'])

/** A site's stress model: an editable draft plus immutable saved versions. */
export const siteModels = pgTable('site_models', {
  id: uuid().primaryKey().defaultRandom(),
  projectId: uuid().notNull().references(() => projects.id, { onDelete: 'cascade' }),
  name: text().notNull(),
  description: text().notNull().default(''),
  draft: jsonb().$type<SiteModelDefinition>().notNull(),
  /** The draft's revision: optimistic concurrency of draft edits (not a saved version's number). */
  draftRevision: integer().notNull().default(1),
  /** The saved version the draft started from, if any. */
  basedOn: integer(),
  createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  ...timestamps,
}, t => [uniqueIndex('site_models_project_name_idx').on(t.projectId, t.name)])

/** An immutable snapshot of a model; a write to it is 409. */
export const siteModelVersions = pgTable('site_model_versions', {
  id: uuid().primaryKey().defaultRandom(),
  modelId: uuid().notNull().references(() => siteModels.id, { onDelete: 'cascade' }),
  version: integer().notNull(),
  definition: jsonb().$type<SiteModelDefinition>().notNull(),
  message: text().notNull(),
  status: modelVersionStatus().notNull().default('saved'),
  createdBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [
  uniqueIndex('site_model_versions_model_version_idx').on(t.modelId, t.version),
  index('site_model_versions_model_idx').on(t.modelId),
])
