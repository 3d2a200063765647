import { z } from 'zod'
import { int, UuidSchema } from './common'
import { PointParamsSchema } from './investigation'
import { VersionParamsSchema } from './models'
import { SettlementRunParamsSchema } from './settlement-runs'

/**
 * Reports: the PDF routes' params and issuing a report. One block per report kind.
 */

// --- site-model version report ---------------------------------------------------
/** GET …/models/{modelId}/versions/{version}/report.pdf: version 1 or later. */
export const ModelVersionReportParamsSchema = VersionParamsSchema

// --- settlement-run report ---------------------------------------------------------
/** GET …/settlement-runs/{runId}/report.pdf. */
export const SettlementRunReportParamsSchema = SettlementRunParamsSchema

// --- point log ---------------------------------------------------------------------
export const PointLogReportParamsSchema = PointParamsSchema
/** Drawing scale 1:50, 1:100 or 1:200 (default 1:100). */
export const PointLogReportQuerySchema = z.object({
  scale: z.enum(['50', '100', '200']).default('100').transform(s => Number(s) as 50 | 100 | 200),
})

// --- issued reports ----------------------------------------------------------------
/** `POST …/reports` makes the PDF of one record and stores it with the next revision letter. */
export const IssueReportSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('settlement-run'), runId: UuidSchema }).strict(),
  z.object({ kind: z.literal('model-version'), modelId: UuidSchema, version: int(1, 1_000_000) }).strict(),
  z.object({ kind: z.literal('point-log'), pointId: UuidSchema, scale: z.union([z.literal(50), z.literal(100), z.literal(200)]) }).strict(),
])
export type IssueReport = z.infer<typeof IssueReportSchema>

export const ReportParamsSchema = z.object({ projectId: UuidSchema, reportId: UuidSchema })
export const ReportListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(100),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
})
