import { beforeAll, describe, expect, it } from 'vitest'
import type { Page } from 'playwright-core'
import type { SiteModelDefinition } from '../../shared/site-model/definition'
import { createDemoCopy } from '../helpers/demo-project'
import { baseUrl, type Client, demoEmail, signIn } from '../helpers/http'
import { openWorkspace, screenshot, screenshotLaptopAndPhone, signInAs, useBrowser } from './helpers'

interface ModelRow { id: string, version: number, draft: SiteModelDefinition }

/** Both screen sizes of the version page as it stands. */
describe('reviewing a model version in Chromium', () => {
  const browser = useBrowser()
  let engineer: Client
  let projectId = ''
  let modelId = ''

  // A copy of the demo site of this file's own, with a model saved once by the engineer.
  beforeAll(async () => {
    engineer = await signIn(demoEmail('engineer'))
    projectId = await createDemoCopy('E2E-REV')
    const m = (await engineer.post<{ model: ModelRow }>(`/api/projects/${projectId}/models`, { name: 'Yard model under review' })).body.model
    modelId = m.id
    expect((await engineer.post(`/api/projects/${projectId}/models/${m.id}/versions`, { message: 'First interpretation', version: m.version })).status).toBe(201)
  })

  const versionPage = (v: number) => `${baseUrl()}/projects/${projectId}/models/${modelId}/versions/${v}`

  async function sendForReview(page: Page, v: number, note: string) {
    await page.goto(versionPage(v))
    await page.getByTestId('send-for-review').click()
    const dialog = page.getByTestId('submit-dialog')
    await dialog.getByTestId('reviewer-Priya Natarajan').check()
    await dialog.getByTestId('submit-message').fill(note)
    await dialog.getByTestId('submit-send').click()
    await page.getByTestId('version-title').getByTestId('status-badge-submitted').waitFor()
  }

  // Four sign-ins and two review rounds in one story: longer than the default time of a browser test.
  it('the engineer sends v1, the reviewer returns it with a comment, the engineer reads it; v2 is resubmitted and approved', async () => {
    let page = await signInAs(browser.context, demoEmail('engineer'))
    await sendForReview(page, 1, 'Estuarine trend ready for a check.')
    await expect(page.getByTestId('timeline-submitted').textContent()).resolves.toContain('Tomas Lindqvist sent it for review')

    page = await signInAs(browser.context, demoEmail('reviewer'))
    await page.goto(versionPage(1))
    const panel = page.getByTestId('review-panel')
    await panel.waitFor()
    // Returning needs a comment: the form says so before anything is sent.
    await panel.getByTestId('decision-return').click()
    await panel.getByText('say why it is returned').waitFor()
    await screenshotLaptopAndPhone(page, 'model-review-panel')
    await panel.getByTestId('decision-comment').fill('The crust trend leaves out CPT-03; refit before approval.')
    await panel.getByTestId('decision-return').click()
    await page.getByTestId('version-title').getByTestId('status-badge-returned').waitFor()

    page = await signInAs(browser.context, demoEmail('engineer'))
    await page.goto(versionPage(1))
    await expect(page.getByTestId('timeline-returned').getByTestId('timeline-comment').textContent()).resolves.toBe('The crust trend leaves out CPT-03; refit before approval.')
    await page.getByTestId('returned-note').waitFor()
    await screenshotLaptopAndPhone(page, 'model-review-returned-timeline')

    // A new version saved from the returned one, sent again.
    // The engineer changes the draft first: a version with nothing new is refused.
    const m = (await engineer.get<{ model: ModelRow }>(`/api/projects/${projectId}/models/${modelId}`)).body.model
    const put = await engineer.request<{ model: ModelRow }>('PUT', `/api/projects/${projectId}/models/${modelId}/draft`, { draft: { ...m.draft, groundwater: { ...m.draft.groundwater, waterTableDepth: m.draft.groundwater.waterTableDepth + 0.1 } }, version: m.version })
    expect(put.status).toBe(200)
    expect((await engineer.post(`/api/projects/${projectId}/models/${modelId}/versions`, { message: 'CPT-03 included', version: put.body.model.version })).status).toBe(201)
    await sendForReview(page, 2, 'Refitted with CPT-03.')

    page = await signInAs(browser.context, demoEmail('reviewer'))
    await page.goto(versionPage(2))
    await page.getByTestId('review-panel').getByTestId('decision-comment').fill('Agreed.')
    await page.getByTestId('decision-approve').click()
    await page.getByTestId('version-title').getByTestId('status-badge-approved').waitFor()
    const hash = await page.getByTestId('approval-hash').textContent()
    expect(hash).toMatch(/^[0-9a-f]{64}$/)
    await screenshotLaptopAndPhone(page, 'model-review-approved')

    // The badges: the model's list of versions and the models page.
    await page.goto(`${baseUrl()}/projects/${projectId}/models/${modelId}`)
    await openWorkspace(page)
    await page.getByTestId('version-row-2').getByTestId('status-badge-approved').waitFor()
    await page.getByTestId('version-row-1').getByTestId('status-badge-returned').waitFor()
    await page.goto(`${baseUrl()}/projects/${projectId}/models`)
    await expect(page.getByTestId(`approved-${modelId}`).textContent()).resolves.toContain('v2')
    await page.getByTestId('model-list').getByTestId('status-badge-approved').waitFor()
    await screenshot(page, 'model-review-models-list')
  }, 240_000)
})
