import { describe, expect, it } from 'vitest'
import { attach, TINY_PDF, testPhoto } from '../helpers/attach'
import { baseUrl, createUser, demoEmail, demoProjectId, signIn, TEST_PASSWORD } from '../helpers/http'
import { createProject } from '../helpers/project'
import { startServer } from '../helpers/server'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import { openProjectAs, screenshot, signInAs, useBrowser } from './helpers'

describe('attachments in Chromium', () => {
  const browser = useBrowser()

  it('shows the demo project\'s lab report, core-box photo (with its thumbnail) and field sheet on the overview', async () => {
    const admin = await signIn(demoEmail('owner'))
    const projectId = await demoProjectId(admin)
    const page = await openProjectAs(browser.context, 'geologist', projectId)
    const list = page.getByTestId('attachment-list')
    await list.waitFor()
    expect(await list.locator('li').count()).toBe(3)
    const text = await list.textContent()
    expect(text).toContain('LR-0417-03 oedometer tests BH-02 BH-04.pdf')
    expect(text).toContain('Ana Ferreira')
    const thumb = list.locator('img').first()
    await thumb.scrollIntoViewIfNeeded()
    await page.waitForFunction(() => {
      const img = document.querySelector<HTMLImageElement>('[data-testid="attachment-list"] img')
      return !!img && img.complete && img.naturalWidth > 0
    })
    expect(await thumb.evaluate(img => (img as HTMLImageElement).naturalWidth)).toBe(320)
    expect(await page.getByTestId('attachment-upload').count()).toBe(1)
    await screenshot(page, 'project-attachments')
    await page.close()
  })

  it('uploads with progress, shows the server\'s refusal, and deletes after a confirmation', async () => {
    const admin = await signIn(demoEmail('owner'))
    const { id: projectId } = await createProject(admin, 'ATE', 'Attachment browser test', ['geologist'])
    const page = await openProjectAs(browser.context, 'geologist', projectId)
    const form = page.getByTestId('attachment-upload')
    await form.waitFor()
    expect(await page.getByTestId('attachment-panel').textContent()).toContain('Nothing attached yet.')

    await form.getByLabel('File').setInputFiles({ name: 'core box 3.png', mimeType: 'image/png', buffer: await testPhoto(640, 480) })
    await form.getByLabel('Caption').fill('Core box 3, 11.0–16.0 m')
    await form.getByRole('button', { name: 'Attach' }).click()
    await page.getByRole('status').filter({ hasText: 'core box 3.png attached.' }).waitFor()
    const list = page.getByTestId('attachment-list')
    await list.getByText('core box 3.png').waitFor()
    expect(await list.locator('li').count()).toBe(1)
    expect(await list.textContent()).toContain('Core box 3, 11.0–16.0 m')

    await form.getByLabel('File').setInputFiles({ name: 'site.gif', mimeType: 'image/gif', buffer: Buffer.from('GIF89a\x01\x00\x01\x00', 'latin1') })
    await form.getByRole('button', { name: 'Attach' }).click()
    const error = page.getByTestId('attachment-error')
    await error.waitFor()
    expect(await error.textContent()).toContain('site.gif is a GIF image: save the photo as PNG or JPEG.')
    await screenshot(page, 'attachments-refused')

    page.once('dialog', d => void d.accept())
    await list.getByRole('button', { name: 'Delete' }).click()
    await page.getByRole('status').filter({ hasText: 'core box 3.png deleted.' }).waitFor()
    expect(await page.getByTestId('attachment-list').count()).toBe(0)
    await page.close()
  })

  it('gives a viewer the files but no upload or delete controls', async () => {
    const admin = await signIn(demoEmail('owner'))
    // A project of this test's own with one report on it: adding the viewer leaves the demo's members alone.
    const viewer = await createUser(admin, 'att-viewer')
    const { id: projectId } = await createProject(admin, 'ATV', 'Attachment viewer test', [{ email: viewer.email, role: 'viewer' }])
    expect((await attach(admin, projectId, 'LR-01 oedometer.pdf', TINY_PDF, { ownerType: 'project' })).status).toBe(201)
    const page = await signInAs(browser.context, viewer.email, TEST_PASSWORD)
    await page.goto(`${baseUrl()}/projects/${projectId}`)
    await page.getByTestId('attachment-list').getByText('LR-01 oedometer.pdf').waitFor()
    expect(await page.getByTestId('attachment-upload').count()).toBe(0)
    expect(await page.getByTestId('attachment-list').getByRole('button', { name: 'Delete' }).count()).toBe(0)
    await page.close()
  })

  it('says plainly that attachments are unavailable when object storage is down, and the page still works', async () => {
    const down = await startServer({ PASTLOAD_S3_ENDPOINT: 'http://127.0.0.1:9' })
    try {
      const admin = await signIn(demoEmail('owner'))
      const projectId = await demoProjectId(admin)
      const page = await signInAs(browser.context, demoEmail('geologist'), DEMO_PASSWORD, down.url)
      await page.goto(`${down.url}/projects/${projectId}`)
      const notice = page.getByTestId('attachment-unavailable')
      await notice.waitFor()
      expect(await notice.textContent()).toContain('Object storage is not reachable right now')
      expect(await page.getByTestId('attachment-upload').count()).toBe(0)
      expect(await page.getByTestId('members-table').textContent()).toContain('Priya Natarajan')
      await screenshot(page, 'attachments-storage-down')
      await page.close()
    }
    finally {
      await down.stop()
    }
  })
})
