import { AttachmentFieldsSchema } from '#shared/schemas/attachments'
import { formatIssues } from '~~/server/utils/validation'
import { attachmentHttpError, attachmentView, readAttachmentUpload, requireAttachmentOwner, requireStorage, storeAttachment } from '~~/server/services/attachments'

/**
 * Attach a file (multipart: `file`, `ownerType`, `ownerId`, `caption`) to the
 * project or to one of its points, samples or oedometer tests. The type comes
 * from the content; photos get a thumbnail.
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  requireStorage()
  const { file, fields } = await readAttachmentUpload(event)
  if (!file) throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'Send the file as multipart form data in a field named "file".' })
  const parsed = AttachmentFieldsSchema.safeParse(fields)
  if (!parsed.success) {
    const issues = formatIssues(parsed.error)
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: `Invalid body: ${issues[0]!.path} ${issues[0]!.message}`, data: { issues } })
  }
  const { ownerType, ownerId, caption } = parsed.data
  await requireAttachmentOwner(project.id, ownerType, ownerId)
  try {
    const row = await storeAttachment({ projectId: project.id, ownerType, ownerId: ownerId ?? null, caption, file, uploadedBy: user.id })
    setResponseStatus(event, 201)
    return { attachment: attachmentView(row, { id: user.id, displayName: user.displayName }) }
  }
  catch (err) {
    throw attachmentHttpError(err)
  }
})
