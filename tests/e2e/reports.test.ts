// Reports in Chromium: the run page's "PDF report" and "Issue" buttons (the confirmation names the revision
// letter), then the project's Reports page with the issued revision and its download. A settlement-run report
// is made on the job queue: the notice says so, and the Reports page shows it once stored.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import pg from 'pg'
import { signedInDemo } from '../helpers/http'
import { createProject, must } from '../helpers/project'
import { createRunModel, smallRunBody } from '../helpers/settlement-run'
import { openProjectAs, screenshot, useBrowser } from './helpers'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 })
afterAll(() => pool.end())

describe('reports in Chromium', () => {
  const browser = useBrowser()
  const { owner, engineer, designer } = signedInDemo('owner', 'engineer', 'designer')
  let projectId = ''
  let runId = ''

  beforeAll(async () => {
    const project = await createProject(owner, 'E2E-RP', 'Reports (browser)', ['engineer', 'designer'])
    projectId = project.id
    const model = await createRunModel(engineer, project.id, undefined, 'Yard model')
    runId = (await must('run', designer.post<{ run: { id: string } }>(`${project.base}/settlement-runs`, smallRunBody(model, { name: 'Reported slab' })), 201)).run.id
  })

  it('issues revision A from the run page after a confirmation naming it, then lists it on the Reports page', async () => {
    const page = await openProjectAs(browser.context, 'designer', projectId, `/settlement/${runId}`, { viewport: { width: 1366, height: 800 } })
    const pdf = page.getByTestId('report-pdf')
    await pdf.waitFor()
    expect(await pdf.getAttribute('href')).toBe(`/api/projects/${projectId}/settlement-runs/${runId}/report.pdf`)
    expect(await pdf.getAttribute('target')).toBe('_blank')
    const issue = page.getByTestId('report-issue')
    await expect.poll(() => issue.textContent()).toContain('Issue rev A')
    await screenshot(page, 'reports-run-buttons-laptop')

    let asked = ''
    page.once('dialog', (d) => {
      asked = d.message()
      void d.accept()
    })
    await issue.click()
    await page.getByTestId('report-issue-notice').waitFor()
    expect(asked).toContain('as revision A?')
    expect(await page.getByTestId('report-issue-notice').textContent()).toMatch(/Revision A is being made/)
    await expect.poll(() => issue.textContent()).toContain('Issue rev B')

    await page.getByTestId('project-nav').getByRole('link', { name: 'Reports' }).click()
    const table = page.getByTestId('issued-reports')
    await table.waitFor()
    expect(await page.getByTestId('project-nav').getByRole('link', { name: 'Reports' }).getAttribute('aria-current')).toBe('page')
    await expect.poll(async () => (await pool.query('select status from issued_reports where project_id = $1', [projectId])).rows.map(r => r.status as string), { timeout: 240_000, interval: 250 }).toEqual(['issued'])
    const { rows } = await pool.query<{ id: string, sha256: string }>('select id, sha256 from issued_reports where project_id = $1', [projectId])
    expect(rows).toHaveLength(1)
    const row = page.getByTestId(`issued-${rows[0]!.id}`)
    // The page hears it stored (live event, or its 3 s reading again).
    await row.getByTestId('issued-download').waitFor({ timeout: 30_000 })
    expect(await row.getByTestId('issued-revision').textContent()).toBe('A')
    expect(await row.textContent()).toContain(rows[0]!.sha256.slice(0, 12))
    expect(await row.textContent()).toContain('Not approved — for discussion')
    expect(await row.getByTestId('issued-download').getAttribute('href')).toBe(`/api/projects/${projectId}/reports/${rows[0]!.id}/pdf`)
    await screenshot(page, 'reports-list-laptop')

    // A later revision whose job failed: its reason and "Retry rev B" beside it, no file.
    const issuer = await pool.query<{ issued_by: string }>('select issued_by from issued_reports where id = $1', [rows[0]!.id])
    const failed = await pool.query<{ id: string }>(`insert into issued_reports (project_id, kind, source_id, source_key, revision, status, progress, error_message, error_code, filename, title, subject, approved_record, issued_by, issued_by_name)
      values ($1, 'settlement-run', $2::uuid, $2::text, 'B', 'failed', 0.3, 'The report stopped 3 times before it was stored (a worker was stopped or ran out of time).', 'attempts-exhausted', 'b.pdf', 'Settlement run', 'Reported slab', false, $3, 'Designer') returning id`, [projectId, runId, issuer.rows[0]!.issued_by])
    await page.reload()
    const failedRow = page.getByTestId(`issued-${failed.rows[0]!.id}`)
    await failedRow.getByTestId('issued-failed').waitFor()
    expect(await failedRow.textContent()).toContain('Not made: The report stopped 3 times')
    await expect.poll(() => failedRow.getByTestId('report-issue').textContent()).toContain('Retry rev B')
    expect(await failedRow.getByTestId('issued-download').count()).toBe(0)
    await screenshot(page, 'reports-list-failed-laptop')
  })
})
