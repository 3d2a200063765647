// Issued reports made on the job queue: wait for one to be stored (or to fail), reading the issued list as a
// page would, and keep what was seen on the way.
import type { IssuedReport, IssuedReportList } from '../../shared/types/reports'
import type { Client } from './http'

/** Polls `GET …/reports` until the report is issued or failed (generous: the machine may be busy). */
export async function waitForReport(c: Client, projectId: string, reportId: string, seen: IssuedReport[] = [], seconds = 240): Promise<IssuedReport> {
  const deadline = Date.now() + seconds * 1000
  for (;;) {
    const r = await c.get<IssuedReportList>(`/api/projects/${projectId}/reports?limit=200`)
    if (r.status !== 200) throw new Error(`reports list: ${r.status} ${JSON.stringify(r.body)}`)
    const mine = r.body.reports.find(x => x.id === reportId)
    if (!mine) throw new Error(`report ${reportId} is not in the list`)
    seen.push(mine)
    if (mine.status === 'issued' || mine.status === 'failed') return mine
    if (Date.now() > deadline) throw new Error(`report ${reportId}: still ${mine.status} after ${seconds} s`)
    await new Promise(res => setTimeout(res, 100))
  }
}
