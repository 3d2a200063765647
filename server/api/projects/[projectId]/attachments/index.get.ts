import { AttachmentListQuerySchema } from '#shared/schemas/attachments'
import { attachmentHttpError, listAttachments, requireStorage } from '~~/server/services/attachments'
import { assertStorageReachable } from '~~/server/services/storage'

/** The project's attachments, newest first, paged; filter by `ownerType` and `ownerId`. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'project.read')
  const query = validateQuery(event, AttachmentListQuerySchema)
  requireStorage()
  // A list whose files cannot be opened helps no one: say plainly that storage is down instead.
  await assertStorageReachable().catch((err: unknown) => { throw attachmentHttpError(err) })
  const { attachments, total } = await listAttachments(project.id, query)
  return { attachments, total, limit: query.limit, offset: query.offset }
})
