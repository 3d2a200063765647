/**
 * Replies of a saved version's review: who it was sent to, its timeline, the
 * flags that stand in the way of approving it. `Server…` is what a service or
 * route returns, the plain name what the page reads (dates as ISO strings).
 */
import type { ApprovalFlagRecord, siteModelVersionEvents } from '~~/server/db/schema'
import type { Serialize } from './serialize'

/** One step of a version's review history. */
export interface ServerVersionEvent {
  id: string
  kind: (typeof siteModelVersionEvents.$inferSelect)['kind']
  actor: string | null
  comment: string
  at: Date
}
export type VersionEvent = Serialize<ServerVersionEvent>

/** A reviewer a version was sent to. */
export interface VersionReviewer { userId: string, displayName: string }

/**
 * An open flag (verdict exclude or questionable) on a point, test or reading that the
 * version's fits use: approving needs an override reason while one stands.
 */
export interface ServerBlockingFlag extends ApprovalFlagRecord {
  author: string | null
  createdAt: Date
}
export type BlockingFlag = Serialize<ServerBlockingFlag>

/** The review side of GET …/versions/:version. */
export interface ServerVersionReview {
  superseded: boolean
  submittedBy: string | null
  decidedBy: string | null
  reviewers: VersionReviewer[]
  timeline: ServerVersionEvent[]
  /** While the version is submitted: the open flags that block approval without an override. */
  blockingFlags: ServerBlockingFlag[]
}
export type VersionReview = Serialize<ServerVersionReview>

/** The approval a version's export carries (null unless approved). */
export interface VersionApproval { by: string | null, at: string, hash: string }
