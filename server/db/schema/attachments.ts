import { index, integer, pgEnum, pgTable, text, uuid } from 'drizzle-orm/pg-core'
import { createdAt, ownedRow } from './columns'
import { projects } from './projects'
import { namedUser } from './users'

export const attachmentOwner = pgEnum('attachment_owner', ['project', 'point', 'sample', 'test'])

/**
 * A file attached to a project or one of its records, stored in object storage
 * under a random key; downloads go only through an authorised route.
 */
export const attachments = pgTable('attachments', {
  ...ownedRow('projectId', () => projects.id),
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
  uploadedBy: namedUser(),
  createdAt: createdAt(),
}, t => [index('attachments_owner_idx').on(t.projectId, t.ownerType, t.ownerId)])
