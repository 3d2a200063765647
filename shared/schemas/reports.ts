import { z } from 'zod'
import { PointParamsSchema } from './investigation'

/**
 * The report routes' params and queries, one block per report kind.
 */

// ---------------------------------------------------------------------------
// Point log
// ---------------------------------------------------------------------------

export const PointLogReportParamsSchema = PointParamsSchema
/** Drawing scale 1:50, 1:100 or 1:200 (default 1:100). */
export const PointLogReportQuerySchema = z.object({
  scale: z.enum(['50', '100', '200']).default('100').transform(s => Number(s) as 50 | 100 | 200),
})
