import { AttachmentParamsSchema } from '#shared/schemas/attachments'
import { requireStorage, requireAttachment, sendStoredObject } from '~~/server/services/attachments'

/** A photo's thumbnail (JPEG, at most 320 px); other files have none (404). */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const { attachmentId } = validateParams(event, AttachmentParamsSchema)
  requireStorage()
  const row = await requireAttachment(project.id, attachmentId)
  if (!row.thumbnailKey) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'This attachment has no thumbnail (only photos have one).' })
  const stem = row.filename.replace(/\.[^.]*$/, '')
  return sendStoredObject(event, row.thumbnailKey, { contentType: 'image/jpeg', disposition: 'inline', filename: `${stem}-thumbnail.jpg`, etag: `${row.sha256}-t`, cache: 'private, max-age=3600' })
})
