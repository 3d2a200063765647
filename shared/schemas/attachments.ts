import { z } from 'zod'
import { ATTACHMENT_OWNER_TYPES, type AttachmentKind, type AttachmentOwnerType } from '../attachments/content-types'
import { INT32_MAX, str, UuidSchema } from './common'

export { ATTACHMENT_OWNER_TYPES, ATTACHMENT_TYPES, attachmentKind, MAX_ATTACHMENT_BYTES, THUMBNAIL_MAX_PX } from '../attachments/content-types'
export type { AttachmentContentType, AttachmentKind, AttachmentOwnerType } from '../attachments/content-types'

/** The text fields of an upload (multipart, beside the `file` part). */
export const AttachmentFieldsSchema = z.object({
  ownerType: z.enum(ATTACHMENT_OWNER_TYPES).default('project'),
  ownerId: z.preprocess(v => (v === '' ? undefined : v), UuidSchema.optional()),
  caption: str().trim().max(500, { message: 'must be at most 500 characters' }).default(''),
}).refine(v => (v.ownerType === 'project') === (v.ownerId === undefined), {
  path: ['ownerId'],
  message: 'is required for a point, sample or test, and must be left out for the project itself',
})

export const AttachmentListQuerySchema = z.object({
  ownerType: z.enum(ATTACHMENT_OWNER_TYPES).optional(),
  ownerId: UuidSchema.optional(),
  limit: z.coerce.number().int().min(1).max(100).default(50),
  offset: z.coerce.number().int().min(0).max(INT32_MAX).default(0),
})

export const AttachmentParamsSchema = z.object({ projectId: UuidSchema, attachmentId: UuidSchema })

/** One attachment as the API returns it (never the storage key). */
export interface AttachmentView {
  id: string
  ownerType: AttachmentOwnerType
  ownerId: string | null
  filename: string
  contentType: string
  kind: AttachmentKind | null
  size: number
  sha256: string
  caption: string
  uploadedBy: { id: string, displayName: string } | null
  createdAt: string
  downloadUrl: string
  thumbnailUrl: string | null
}
