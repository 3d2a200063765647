import { IssueReportSchema } from '#shared/schemas/reports'
import { issueReport } from '~~/server/services/reports/issued'

/**
 * Issues a report of one record with the next revision letter (owner, engineer, designer): a short report is
 * made and stored in the request (201, `issued`); a long one is listed at once and made on the job queue
 * (202, `queued`; it moves on to `issued` or `failed`, announced as `report.changed`).
 */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'reports.issue')
  const body = await validateBody(event, IssueReportSchema)
  const { report, queued } = await issueReport(project.id, { id: user.id, name: user.displayName }, body)
  setResponseStatus(event, queued ? 202 : 201)
  return { report }
})
