import { z } from 'zod'

/** An earlier event's id, as the stream sent it. */
const EventId = z.coerce.number().int('must be a whole number').positive('must be positive').max(Number.MAX_SAFE_INTEGER)

/** `?lastEventId=` for scripts that cannot send the header. */
export const LiveStreamQuerySchema = z.object({ lastEventId: EventId.optional() })

/** A browser's EventSource sends `Last-Event-ID` when it reconnects. */
export const LiveStreamHeadersSchema = z.object({ 'last-event-id': EventId.optional() })
