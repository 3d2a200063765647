/**
 * Replies of the site model routes. `Server…` is what a service or route
 * returns, the plain name what the page reads (dates as ISO strings).
 */
import type { ProjectRole } from '#shared/auth/roles'
import type { StressProfilePoint } from '#shared/geotech/stress'
import type { siteModels, siteModelVersions } from '~~/server/db/schema'
import type { DefinitionChange } from '../site-model/diff'
import type { ServerVersionReview } from './review-lifecycle'
import type { Serialize } from './serialize'

/** A site model's database row (`draftRevision` counts the draft's saves). */
export type ServerSiteModelRecord = typeof siteModels.$inferSelect
/** A site model as the API sends it: the draft revision goes out as `version`, the token a draft save sends back. */
export type ServerSiteModelRow = Omit<ServerSiteModelRecord, 'draftRevision'> & { version: number }
export type SiteModelRow = Serialize<ServerSiteModelRow>

type ServerVersionRecord = typeof siteModelVersions.$inferSelect

/** Where a saved version stands in review (the database's enum). */
export type VersionStatus = ServerVersionRecord['status']

/** A saved version with its author's name (`requireVersion`). */
export type ServerModelVersionRow = ServerVersionRecord & { author: string | null }
export type ModelVersionRow = Serialize<ServerModelVersionRow>

/** A saved version as the model's list shows it (`listVersions`); `superseded`: a newer version of the model is approved. */
export type ServerModelVersionSummary = Pick<ServerModelVersionRow, 'version' | 'message' | 'status' | 'createdAt' | 'author'> & { superseded: boolean }
export type ModelVersionSummary = Serialize<ServerModelVersionSummary>

/** One model of GET …/models, with its latest saved version. */
export type ServerModelListItem = Pick<ServerSiteModelRow, 'id' | 'name' | 'description' | 'version' | 'basedOn' | 'updatedAt'> & {
  latest: Pick<ServerVersionRecord, 'modelId' | 'version' | 'status' | 'createdAt' | 'message'> | null
  versionCount: number
  /** The model's approved version not superseded, if any. */
  approved: { version: number, decidedAt: Date | null } | null
}
export type ModelListItem = Serialize<ServerModelListItem>

export interface ServerModelList { models: ServerModelListItem[] }
export type ModelList = Serialize<ServerModelList>

/** GET …/models/:modelId: the model with its draft, its saved versions and the caller's role. */
export interface ServerModelDetail { model: ServerSiteModelRow, versions: ServerModelVersionSummary[], role: ProjectRole }
export type ModelDetail = Serialize<ServerModelDetail>

/** GET …/models/:modelId/versions/:version: the version with its review (reviewers, timeline, blocking flags). */
export interface ServerModelVersionReply { model: Pick<ServerSiteModelRow, 'id' | 'name'>, version: ServerModelVersionRow, review: ServerVersionReview }
export type ModelVersionReply = Serialize<ServerModelVersionReply>

/** One changed leaf between two definitions. */
export type { DefinitionChange }

/** One side of a comparison. */
export interface ServerCompareSide { version: number, message: string, savedAt: Date, author: string | null }

/** GET …/models/:modelId/compare */
export interface ServerCompareAnswer {
  a: ServerCompareSide
  b: ServerCompareSide
  changes: DefinitionChange[]
  /** The changes in words, in the project's units (shared/site-model/change-words.ts). */
  summary: string[]
  flagsChanged: boolean
  profiles: { a: StressProfilePoint[], b: StressProfilePoint[] }
}
export type CompareAnswer = Serialize<ServerCompareAnswer>

/** GET …/models/:modelId/drawing: the saved draft drawn on the server, as the stress-model page opens with it. */
export interface ServerModelDrawing {
  /** The draft revision drawn. */
  revision: number
  /** The drawing, one SVG element (its text escaped). */
  svg: string
  width: number
  height: number
  /** σ'p points drawn. */
  points: number
}
export type ModelDrawingReply = Serialize<ServerModelDrawing>
