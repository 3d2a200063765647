// What an attachment may be and belong to: plain values the upload form and the server share (no zod here,
// so the form's page does not load the schema library to show its limits).

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
