import { exportName, logsWorkbook } from '~~/server/services/exports/logs'

/** The project's logs as an XLSX workbook (one sheet per table). */
export default defineEventHandler(async (event) => {
  const { project } = await requireProjectRole(event, 'export.read')
  const buf = await logsWorkbook(project)
  setResponseHeaders(event, {
    'content-type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    'content-disposition': `attachment; filename="${exportName(project, 'logs', 'xlsx')}"`,
    'cache-control': 'no-store',
  })
  return buf
})
