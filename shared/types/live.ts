/** The kinds of change live pages listen for: ids only, never documents. */
export const LIVE_EVENT_TYPES = [
  'flag.changed',
  'flag.reply',
  'version.changed',
  'review.changed',
  'inbox.changed',
  'member.changed',
  'run.changed',
  'report.changed',
] as const
export type LiveEventType = (typeof LIVE_EVENT_TYPES)[number]

/**
 * One Server-Sent Event's data on `GET /api/projects/{projectId}/events`. The event's `id` is
 * the same number as `id` here; a reconnect with `Last-Event-ID` replays what came after it.
 * `resync` tells the page it missed more than can be replayed: refresh everything.
 */
export interface LiveEventMessage {
  id: number
  type: LiveEventType | 'resync'
  projectId: string | null
  entityId: string | null
  at: string
}
