import { IssueReportSchema } from '#shared/schemas/reports'
import { issueReport } from '~~/server/services/reports/issued'

/** Issues a report of one record: the PDF stored with the next revision letter (owner, engineer, designer). */
export default defineEventHandler(async (event) => {
  const { user, project } = await requireProjectRole(event, 'reports.issue')
  const body = await validateBody(event, IssueReportSchema)
  const result = await issueReport(project.id, { id: user.id, name: user.displayName }, body)
  setResponseStatus(event, 201)
  return result
})
