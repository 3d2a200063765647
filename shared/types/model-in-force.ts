/**
 * The model in force: the saved version of the project's design model whose σ'v0 every page with
 * derived values uses (the latest approved one, else the latest saved one until one is approved).
 * `Server…` is what the service returns, the plain name what the page reads (dates as ISO strings).
 */
import type { VersionStatus } from './models'
import type { Serialize } from './serialize'

/** GET …/model-in-force: the version in force, or `{ modelId: null }` when the design model has no saved version. */
export type ServerModelInForce = {
  modelId: string
  modelName: string
  version: number
  /** 'approved' once a reviewer approved it; anything else means not yet approved. */
  status: VersionStatus
  approvedAt: Date | null
  /** The approver's display name. */
  approvedBy: string | null
} | { modelId: null }
export type ModelInForce = Serialize<ServerModelInForce>
