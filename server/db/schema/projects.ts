import type { AnyPgColumn } from 'drizzle-orm/pg-core'
import { index, pgEnum, pgTable, primaryKey, text, uniqueIndex, uuid } from 'drizzle-orm/pg-core'
import { PROJECT_ROLES, UNIT_SYSTEMS } from '#shared/auth/roles'
import { US_STRESS_UNITS } from '#shared/units/index'
import { rowKey, timestamps } from './columns'
import { siteModels } from './models'
import { namedUser, users } from './users'

export const projectRole = pgEnum('project_role', PROJECT_ROLES)
export const unitSystem = pgEnum('unit_system', UNIT_SYSTEMS)
export const usStressUnit = pgEnum('us_stress_unit', US_STRESS_UNITS)

export const projects = pgTable('projects', {
  id: rowKey(),
  jobNumber: text().notNull(),
  name: text().notNull(),
  client: text().notNull().default(''),
  unitSystem: unitSystem().notNull().default('SI'),
  /** How a US project shows stresses (psf or tsf); SI projects ignore it. */
  usStressUnit: usStressUnit().notNull().default('psf'),
  description: text().notNull().default(''),
  /** The project's design model: its latest approved version is the model in force. */
  designModelId: uuid().references((): AnyPgColumn => siteModels.id, { onDelete: 'set null' }),
  // A creator may leave; the project stays.
  createdBy: namedUser(),
  ...timestamps,
}, t => [uniqueIndex('projects_job_number_idx').on(t.jobNumber)])

export const projectMembers = pgTable('project_members', {
  projectId: uuid().notNull().references(() => projects.id, { onDelete: 'cascade' }),
  userId: uuid().notNull().references(() => users.id, { onDelete: 'cascade' }),
  role: projectRole().notNull(),
  ...timestamps,
}, t => [
  primaryKey({ name: 'project_members_pk', columns: [t.projectId, t.userId] }),
  index('project_members_user_idx').on(t.userId),
])
