import { AttachmentParamsSchema } from '#shared/schemas/attachments'
import { requireStorage, requireAttachment, sendStoredObject } from '~~/server/services/attachments'

/** The file itself, always as a download with the content type decided at upload. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { attachmentId } = validateParams(event, AttachmentParamsSchema)
  requireStorage()
  const row = await requireAttachment(project.id, attachmentId)
  return sendStoredObject(event, row.objectKey, { contentType: row.contentType, disposition: 'attachment', filename: row.filename, etag: row.sha256, cache: 'private, no-store' })
})
