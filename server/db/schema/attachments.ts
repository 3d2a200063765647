import { index, integer, pgEnum, pgTable, text, timestamp, uuid } from 'drizzle-orm/pg-core'
import { projects } from './projects'
import { users } from './users'

export const attachmentOwner = pgEnum('attachment_owner', ['project', 'point', 'sample', 'test'])

/**
 * A file attached to a project or one of its records, stored in object storage
 * under a random key; downloads go only through an authorised route.
 */
export const attachments = pgTable('attachments', {
  id: uuid().primaryKey().defaultRandom(),
  projectId: uuid().notNull().references(() => projects.id, { onDelete: 'cascade' }),
  ownerType: attachmentOwner().notNull(),
  /** The point, sample or test id (null for the project itself). */
  ownerId: uuid(),
  filename: text().notNull(),
  contentType: text().notNull(),
  size: integer().notNull(),
  sha256: text().notNull(),
  objectKey: text().notNull(),
  thumbnailKey: text(),
  caption: text().notNull().default(''),
  uploadedBy: uuid().references(() => users.id, { onDelete: 'set null' }),
  createdAt: timestamp({ withTimezone: true, mode: 'date' }).notNull().defaultNow(),
}, t => [index('attachments_owner_idx').on(t.projectId, t.ownerType, t.ownerId)])
