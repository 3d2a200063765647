// The review story end to end, with two people at once in two browsers: the engineer sends a
// version to the reviewer, whose bell counts it live; she opens the link of the e-mail read back
// from the mail catcher and returns the version with a comment, which the engineer's open page
// shows without a reload; he saves a new version and sends it; she approves it; the tests page
// then names that version, approved, as the one its values use.
import { readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import { simpleParser } from 'mailparser'
import type { Page } from 'playwright-core'
import { describe, expect, it } from 'vitest'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { baseUrl, demoEmail, signIn } from '../helpers/http'
import { screenshot, signInAs, useBrowser } from './helpers'

interface ModelRow { id: string, version: number, draft: SiteModelDefinition }

/** The newest message in the catcher to `to` whose subject contains `subject` (waits for delivery). */
async function mailTo(to: string, subject: string): Promise<{ subject: string, text: string }> {
  const dir = process.env.PASTLOAD_MAIL_DIR
  if (!dir) throw new Error('PASTLOAD_MAIL_DIR is not set: run the browser tests through npm test, which starts the mail catcher.')
  for (let i = 0; i < 200; i++) {
    const files = readdirSync(dir).filter(f => f.endsWith('.eml')).sort().reverse()
    for (const f of files) {
      const m = await simpleParser(readFileSync(join(dir, f)))
      const address = Array.isArray(m.to) ? m.to.map(a => a.text).join(',') : (m.to?.text ?? '')
      if (address.includes(to) && (m.subject ?? '').includes(subject)) return { subject: m.subject ?? '', text: m.text ?? '' }
    }
    await new Promise(r => setTimeout(r, 150))
  }
  throw new Error(`no e-mail to ${to} about "${subject}" arrived`)
}

async function unread(page: Page): Promise<number> {
  const label = await page.getByTestId('inbox-bell').getAttribute('aria-label') ?? ''
  const m = /(\d+) unread/.exec(label)
  return m ? Number(m[1]) : 0
}

describe('the review story in two browsers', () => {
  const engineerBrowser = useBrowser()
  const reviewerBrowser = useBrowser()

  it('send → live bell → e-mail link → return with comment (seen live) → new version → approve → banner names it', async () => {
    const engineer = await signIn(demoEmail('engineer'))
    const projectId = await createDemoCopy('E2E-STORY')
    const name = `Story model ${Date.now().toString(36)}`
    const m = (await engineer.post<{ model: ModelRow }>(`/api/projects/${projectId}/models`, { name })).body.model
    expect((await engineer.request('PATCH', `/api/projects/${projectId}`, { designModelId: m.id })).status).toBe(200)
    expect((await engineer.post(`/api/projects/${projectId}/models/${m.id}/versions`, { message: 'Strata and water from the logs', version: m.version })).status).toBe(201)
    const versionPage = (v: number) => `${baseUrl()}/projects/${projectId}/models/${m.id}/versions/${v}`

    // The reviewer has the project open (its live stream with it) before anything is sent.
    const reviewer = await signInAs(reviewerBrowser.context, demoEmail('reviewer'))
    await reviewer.goto(`${baseUrl()}/projects/${projectId}/tests`)
    await reviewer.getByTestId('inbox-bell').waitFor()
    const before = await unread(reviewer)

    const page = await signInAs(engineerBrowser.context, demoEmail('engineer'))
    await page.goto(versionPage(1))
    await page.getByTestId('send-for-review').click()
    const dialog = page.getByTestId('submit-dialog')
    await dialog.getByTestId('reviewer-Priya Natarajan').check()
    await dialog.getByTestId('submit-message').fill('First interpretation: please check the crust.')
    await dialog.getByTestId('submit-send').click()
    await page.getByTestId('version-title').getByTestId('status-badge-submitted').waitFor()

    // Live: the reviewer's bell counts the request without a reload.
    await expect.poll(() => unread(reviewer), { timeout: 15_000 }).toBe(before + 1)
    await screenshot(reviewer, 'review-story-bell-live')

    // She follows the link of the e-mail the catcher received.
    const mail = await mailTo(demoEmail('reviewer'), `${name} version 1`)
    const link = /https?:\/\/\S+\/projects\/\S+\/versions\/1\b/.exec(mail.text)?.[0]
    expect(link).toBeDefined()
    await reviewer.goto(baseUrl() + new URL(link!).pathname)
    const panel = reviewer.getByTestId('review-panel')
    await panel.getByTestId('decision-comment').fill('The crust trend is too steep below 2.5 m; refit it.')
    await panel.getByTestId('decision-return').click()
    await reviewer.getByTestId('version-title').getByTestId('status-badge-returned').waitFor()

    // Live: the engineer's open page shows the comment without a reload.
    await page.getByTestId('timeline-returned').getByTestId('timeline-comment').waitFor({ timeout: 15_000 })
    expect(await page.getByTestId('timeline-returned').getByTestId('timeline-comment').textContent()).toBe('The crust trend is too steep below 2.5 m; refit it.')
    await screenshot(page, 'review-story-returned-live')

    // A new version saved from the returned one, sent again, approved.
    // The engineer changes the draft (a version with nothing new is refused), then saves it as version 2.
    const draft = (await engineer.get<{ model: ModelRow }>(`/api/projects/${projectId}/models/${m.id}`)).body.model
    const put = await engineer.request<{ model: ModelRow }>('PUT', `/api/projects/${projectId}/models/${m.id}/draft`, { draft: { ...draft.draft, groundwater: { ...draft.draft.groundwater, waterTableDepth: draft.draft.groundwater.waterTableDepth + 0.1 } }, version: draft.version })
    expect(put.status).toBe(200)
    expect((await engineer.post(`/api/projects/${projectId}/models/${m.id}/versions`, { message: 'Crust refitted', version: put.body.model.version })).status).toBe(201)
    await page.goto(versionPage(2))
    await page.getByTestId('send-for-review').click()
    await page.getByTestId('submit-dialog').getByTestId('reviewer-Priya Natarajan').check()
    await page.getByTestId('submit-dialog').getByTestId('submit-message').fill('Crust refitted.')
    await page.getByTestId('submit-dialog').getByTestId('submit-send').click()
    await page.getByTestId('version-title').getByTestId('status-badge-submitted').waitFor()

    await reviewer.goto(versionPage(2))
    await reviewer.getByTestId('review-panel').getByTestId('decision-comment').fill('Agreed.')
    await reviewer.getByTestId('decision-approve').click()
    await reviewer.getByTestId('version-title').getByTestId('status-badge-approved').waitFor()

    await page.goto(`${baseUrl()}/projects/${projectId}/tests`)
    const banner = page.getByTestId('model-in-force')
    await expect.poll(() => banner.getAttribute('data-state')).toBe('approved')
    const words = (await banner.textContent())?.replace(/\s+/g, ' ') ?? ''
    expect(words).toContain(`version 2 of ${name}`)
    expect(words).toContain('approved by Priya Natarajan')
    await screenshot(page, 'review-story-tests-banner')
    // Two browsers, a demo copy and a mail round trip: more than the default minute on a busy machine.
  }, 240_000)
})
