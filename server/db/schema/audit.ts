import { bigint, index, jsonb, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { moment } from './columns'
import { projects } from './projects'
import { namedUser } from './users'

/** Append-only record of every write: who, when, what, and the row before and after. */
export const auditEvents = pgTable('audit_events', {
  id: bigint({ mode: 'number' }).primaryKey().generatedAlwaysAsIdentity(),
  actorId: namedUser(),
  projectId: uuid().references(() => projects.id, { onDelete: 'cascade' }),
  action: text().notNull(),
  entity: text().notNull(),
  entityId: text(),
  before: jsonb(),
  after: jsonb(),
  at: moment().notNull().defaultNow(),
}, t => [
  index('audit_events_project_idx').on(t.projectId, t.at),
  index('audit_events_entity_idx').on(t.entity, t.entityId),
])
