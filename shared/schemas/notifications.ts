import { z } from 'zod'
import { NOTIFICATION_MODES, OPTIONAL_NOTIFICATION_KINDS } from '#shared/notifications/kinds'
import { INT32_MAX, PageQuerySchema, UuidSchema } from './common'

/** PUT /api/account/notifications: the modes to change, by optional kind (kinds left out keep theirs). */
export const NotificationPreferencesSchema = z.object({
  preferences: z.partialRecord(z.enum(OPTIONAL_NOTIFICATION_KINDS), z.enum(NOTIFICATION_MODES))
    .refine(p => Object.keys(p).length > 0, { message: 'must name at least one kind' }),
}).strict()

/** GET /api/account/inbox: newest first, paged; `unread=1` lists unread entries only. */
export const InboxQuerySchema = PageQuerySchema.extend({
  unread: z.enum(['0', '1', 'true', 'false']).optional().transform(v => v === '1' || v === 'true'),
})

export const InboxEntryParamsSchema = z.object({ notificationId: UuidSchema })

/** GET /api/admin/mail: the outbox for site admins (never the bodies). */
export const OutboxQuerySchema = PageQuerySchema.extend({
  status: z.enum(['pending', 'failed', 'sent']).optional(),
})

/** An outbox id (a bigint column; ids beyond int32 are years of mail away, and name nothing until then). */
export const OutboxMessageParamsSchema = z.object({ messageId: z.coerce.number().int().min(1).max(INT32_MAX) })
