import { SettlementRunExportQuerySchema, SettlementRunParamsSchema } from '#shared/schemas/settlement-runs'
import { exportSettlementRun } from '~~/server/services/settlement-run-export'

/** The run as a workbook (`?format=xlsx`) or as JSON (`?format=json`), both with the caution. */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'export.read')
  const { runId } = validateParams(event, SettlementRunParamsSchema)
  const { format } = validateQuery(event, SettlementRunExportQuerySchema)
  const file = await exportSettlementRun(project, runId, format)
  setResponseHeader(event, 'Content-Type', file.contentType)
  setResponseHeader(event, 'Content-Disposition', file.disposition)
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return file.body
})
