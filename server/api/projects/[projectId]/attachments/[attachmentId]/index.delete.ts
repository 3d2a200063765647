import { AttachmentParamsSchema } from '#shared/schemas/attachments'
import { attachmentHttpError, removeAttachment, requireStorage } from '~~/server/services/attachments'

/** Deletes an attachment and its stored objects (audited). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'logs.write')
  const { attachmentId } = validateParams(event, AttachmentParamsSchema)
  requireStorage()
  try {
    await removeAttachment(project.id, attachmentId, user.id)
  }
  catch (err) {
    throw attachmentHttpError(err)
  }
  return { ok: true }
})
