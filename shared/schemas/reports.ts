import { VersionParamsSchema } from './models'

/** Route parameters and queries of the report PDFs, one block per report kind. */

// --- site-model version report ---------------------------------------------------
/** GET …/models/{modelId}/versions/{version}/report.pdf: version 1 or later. */
export const ModelVersionReportParamsSchema = VersionParamsSchema
