// Server time of the report PDFs on loopback against the built server with the demo seeded.
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../shared/demo/scenario'
import { timeCalls } from './timing'

export interface ReportBenchRow { name: string, pages: number, median: number, p95: number, calls: number, goalMs: number }

/** The pages of a PDF: pdfmake writes `/Type /Pages … /Count n` once. */
function pageCount(pdf: Uint8Array): number {
  const m = /\/Type \/Pages[^>]*\/Count (\d+)/.exec(Buffer.from(pdf).toString('latin1'))
  return m ? Number(m[1]) : 0
}

async function measure(url: string, cookie: string, path: string, calls: number): Promise<{ pages: number, median: number, p95: number }> {
  const call = async () => {
    const r = await fetch(`${url}${path}`, { headers: { cookie } })
    const pdf = new Uint8Array(await r.arrayBuffer())
    if (r.status !== 200) throw new Error(`report bench call failed: ${r.status}`)
    return pdf
  }
  const { median, p95, last } = await timeCalls(call, { warmup: 5, calls })
  return { pages: pageCount(last), median, p95 }
}

/** The demo's Yard model, version 1 (approved): the site-model version report (goal ≤ 500 ms for 10 pages). */
export async function runModelReportBench(url: string, cookie: string, calls = 20): Promise<ReportBenchRow> {
  const projects = await (await fetch(`${url}/api/projects`, { headers: { cookie } })).json() as { projects: { id: string }[] }
  for (const p of projects.projects) {
    const list = await (await fetch(`${url}/api/projects/${p.id}/models`, { headers: { cookie } })).json() as { models: { id: string, name: string }[] }
    const yard = list.models?.find(m => /yard/i.test(m.name))
    if (!yard) continue
    const m = await measure(url, cookie, `/api/projects/${p.id}/models/${yard.id}/versions/1/report.pdf`, calls)
    return { name: `GET …/models/{yard}/versions/1/report.pdf, the demo model (${m.pages} pages)`, ...m, calls, goalMs: 500 }
  }
  throw new Error('report bench: the demo Yard model was not found')
}

/** The demo's BH-01 at 1:50: the stress-history log (goal ≤ 200 ms for 3 pages), the point and model read from the database. */
export async function runPointLogHttpBench(url: string, cookie: string, calls = 20): Promise<ReportBenchRow> {
  const projects = await (await fetch(`${url}/api/projects`, { headers: { cookie } })).json() as { projects: { id: string }[] }
  for (const p of projects.projects) {
    const list = await (await fetch(`${url}/api/projects/${p.id}/points?limit=200`, { headers: { cookie } })).json() as { points?: { id: string, identifier: string }[] }
    const hole = list.points?.find(pt => pt.identifier === 'BH-01')
    if (!hole) continue
    const m = await measure(url, cookie, `/api/projects/${p.id}/points/${hole.id}/report.pdf?scale=50`, calls)
    return { name: `GET …/points/{BH-01}/report.pdf?scale=50, the demo borehole (${m.pages} pages)`, ...m, calls, goalMs: 200 }
  }
  throw new Error('report bench: the demo point BH-01 was not found')
}

/** Signs the demo designer in on a bench server; the session cookie for the benchmark calls. */
export async function signInDemoDesigner(url: string): Promise<string> {
  const designer = DEMO_PEOPLE.find(p => p.role === 'designer')
  if (!designer) throw new Error('the demo has no designer')
  const login = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'origin': url }, body: JSON.stringify({ email: designer.email, password: DEMO_PASSWORD }) })
  if (!login.ok) throw new Error(`bench sign-in failed: ${login.status}`)
  return login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
}
