/**
 * Replies of the review routes. `Server…` is what a route returns, the plain
 * name what the page reads (dates as ISO strings).
 */
import type { reviewFlags, reviewReplies } from '~~/server/db/schema'
import type { Serialize } from './serialize'

/** A flag's row as stored. */
export type ServerFlagRecord = typeof reviewFlags.$inferSelect
export type FlagRecord = Serialize<ServerFlagRecord>

/** Open or resolved (the database's enum). */
export type FlagStatus = ServerFlagRecord['status']

/** A flagged log interval's hole and depths. */
export interface FlaggedInterval { id: string, top: number, bottom: number, uscs: string | null, description: string, pointId: string, pointIdentifier: string }

/** A flag with its author's name (GET …/flags/:flagId). */
export type ServerReviewFlagRow = ServerFlagRecord & { author: string | null }

/** A reviewer flag as the list route sends it. */
export type ServerReviewFlag = ServerReviewFlagRow & {
  replyCount: number
  /** For a flagged log interval: its hole and depths, null once the interval is gone. */
  interval?: FlaggedInterval | null
}
export type ReviewFlag = Serialize<ServerReviewFlag>

/** GET …/flags: one page. */
export interface ServerReviewFlagPage { flags: ServerReviewFlag[], limit: number, offset: number }
export type ReviewFlagPage = Serialize<ServerReviewFlagPage>

/** A reply in a flag's thread. */
export type ServerReviewReply = Pick<typeof reviewReplies.$inferSelect, 'id' | 'body' | 'createdAt'> & { author: string | null }
export type ReviewReply = Serialize<ServerReviewReply>

/** GET …/flags/:flagId: the flag with its thread. */
export interface ServerReviewThreadReply { flag: ServerReviewFlagRow, replies: ServerReviewReply[] }
export type ReviewThreadReply = Serialize<ServerReviewThreadReply>

/** POST …/flags (201): the new flag's row. */
export interface ServerFlagCreatedReply { flag: ServerFlagRecord }
export type FlagCreatedReply = Serialize<ServerFlagCreatedReply>
