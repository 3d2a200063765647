import { LiveStreamHeadersSchema, LiveStreamQuerySchema } from '#shared/schemas/live'
import { openProjectEventStream } from '~~/server/services/live-events'

/**
 * Live updates of one project as Server-Sent Events (ids, never documents). A browser's
 * EventSource reconnects with `Last-Event-ID`; a script may pass `?lastEventId=` instead.
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'project.read')
  const query = validateQuery(event, LiveStreamQuerySchema)
  const headers = validateHeaders(event, LiveStreamHeadersSchema)
  return openProjectEventStream(event, {
    projectId: project.id,
    userId: user.id,
    sessionId: event.context.authVia === 'session' ? (event.context.sessionId ?? null) : null,
    lastEventId: headers['last-event-id'] ?? query.lastEventId ?? null,
  })
})
