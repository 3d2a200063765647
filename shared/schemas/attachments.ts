import { z } from 'zod'
import { INT32_MAX, str, UuidSchema } from './common'

/** What an attachment can belong to: the project itself, a point, a sample or an oedometer test. */
export const ATTACHMENT_OWNER_TYPES = ['project', 'point', 'sample', 'test'] as const
export type AttachmentOwnerType = (typeof ATTACHMENT_OWNER_TYPES)[number]

/** Largest attachment, in bytes (25 MB). */
export const MAX_ATTACHMENT_BYTES = 25 * 1024 * 1024

/** Longest side of a photo's thumbnail, in pixels. */
export const THUMBNAIL_MAX_PX = 320

export type AttachmentKind = 'report' | 'photo' | 'sheet'

/** Every content type an attachment may have, decided from the file's bytes on upload. */
export const ATTACHMENT_TYPES = {
  'application/pdf': { kind: 'report', label: 'PDF' },
  'image/png': { kind: 'photo', label: 'PNG' },
  'image/jpeg': { kind: 'photo', label: 'JPEG' },
  'image/webp': { kind: 'photo', label: 'WebP' },
  'text/csv': { kind: 'sheet', label: 'CSV' },
  'text/plain': { kind: 'sheet', label: 'Text' },
  'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet': { kind: 'sheet', label: 'XLSX' },
} as const satisfies Record<string, { kind: AttachmentKind, label: string }>

export type AttachmentContentType = keyof typeof ATTACHMENT_TYPES

export function attachmentKind(contentType: string): AttachmentKind | null {
  return contentType in ATTACHMENT_TYPES ? ATTACHMENT_TYPES[contentType as AttachmentContentType].kind : null
}

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
