// The inbox in the browser: the bell in the header counts a flag raised on the person's logged interval,
// the inbox page lists it and marks it read, and the account page turns a kind of e-mail off. Screenshots
// at laptop and phone sizes. Each test uses its own new account and project.
import { describe, expect, it } from 'vitest'
import { baseUrl, createUser, demoEmail, signIn, TEST_PASSWORD } from '../helpers/http'
import { createProject } from '../helpers/project'
import { screenshot, signInAs, useBrowser } from './helpers'

describe('the inbox', () => {
  const browser = useBrowser()

  it('the bell counts a new notice, the inbox lists it, opening it marks it read; laptop and phone', async () => {
    const owner = await signIn(demoEmail('owner'))
    const engineer = await createUser(owner, 'inbox-ui')
    const project = await createProject(owner, 'INB', 'Inbox project', [{ email: engineer.email, role: 'engineer' }, 'reviewer'])
    const point = await engineer.client.post<{ point: { id: string } }>(`${project.base}/points`, { identifier: 'BH-IN1', kind: 'borehole', easting: 0, northing: 0, groundElevation: 2, finalDepth: 10 })
    const log = await engineer.client.request<{ intervals: { id: string }[] }>('PUT', `${project.base}/points/${point.body.point.id}/intervals`, { intervals: [{ top: 0, bottom: 3.2, description: 'Soft grey silty CLAY' }] })
    const reviewer = await signIn(demoEmail('reviewer'))
    const flag = await reviewer.post<{ flag: { id: string } }>(`${project.base}/flags`, { targetType: 'log-interval', targetId: log.body.intervals[0]!.id, verdict: 'questionable', comment: 'Moisture reads dry, but the sample photo looks wet. Please check.' })
    expect(flag.status).toBe(201)
    await reviewer.post(`${project.base}/flags/${flag.body.flag.id}/replies`, { body: 'Photo attached to the point.' })

    const page = await signInAs(browser.context, engineer.email, TEST_PASSWORD)
    const bell = page.getByTestId('inbox-bell')
    await expect.poll(() => bell.getAttribute('aria-label')).toBe('Inbox, 1 unread')
    expect(await page.getByTestId('inbox-count').textContent()).toBe('1')
    await screenshot(page, 'inbox-bell-laptop')

    await bell.click()
    await page.waitForURL(/\/inbox$/)
    const entries = page.getByTestId('inbox-entry')
    await entries.first().waitFor()
    expect(await entries.count()).toBe(1)
    expect(await entries.first().textContent()).toContain('Questionable flag on BH-IN1 0–3.2 m')
    expect(await entries.first().textContent()).toContain('Moisture reads dry')
    expect(await page.getByTestId('inbox-summary').textContent()).toContain('One unread notice.')
    await screenshot(page, 'inbox-page-laptop')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'inbox-page-phone')

    // Opening the notice marks it read and lands on the flag's thread.
    await page.getByRole('link', { name: 'Questionable flag on BH-IN1 0–3.2 m' }).click()
    await page.waitForURL(/\/review\?status=all&flag=/)
    await page.locator(`#thread-${flag.body.flag.id}`).waitFor()
    await expect.poll(() => bell.getAttribute('aria-label')).toBe('Inbox, nothing unread')
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.close()
  })

  it('marks all read, and the account page turns one kind of e-mail off', async () => {
    const owner = await signIn(demoEmail('owner'))
    const engineer = await createUser(owner, 'inbox-all')
    const project = await createProject(owner, 'INA', 'Inbox all', [{ email: engineer.email, role: 'engineer' }, 'reviewer'])
    const reviewer = await signIn(demoEmail('reviewer'))
    for (const id of ['BH-A1', 'BH-A2']) {
      const point = await engineer.client.post<{ point: { id: string } }>(`${project.base}/points`, { identifier: id, kind: 'borehole', easting: 0, northing: 0, groundElevation: 2, finalDepth: 10 })
      const log = await engineer.client.request<{ intervals: { id: string }[] }>('PUT', `${project.base}/points/${point.body.point.id}/intervals`, { intervals: [{ top: 0, bottom: 2, description: 'Made ground' }] })
      await reviewer.post(`${project.base}/flags`, { targetType: 'log-interval', targetId: log.body.intervals[0]!.id, verdict: 'exclude', comment: `Made ground in ${id}: leave out of the fits.` })
    }
    const page = await signInAs(browser.context, engineer.email, TEST_PASSWORD)
    await page.goto(`${baseUrl()}/inbox`)
    await page.getByTestId('inbox-entry').nth(1).waitFor()
    await page.getByTestId('inbox-read-all').click()
    await page.getByText('2 notices marked read.').waitFor()
    await expect.poll(() => page.getByTestId('inbox-bell').getAttribute('aria-label')).toBe('Inbox, nothing unread')
    await page.getByTestId('inbox-unread-only').click()
    await page.getByTestId('inbox-empty').waitFor()

    await page.goto(`${baseUrl()}/account#notifications`)
    const row = page.locator('[data-testid="notification-preferences"] tr[data-kind="flag-raised"]')
    await row.getByLabel('Off').check()
    await page.getByText('Saved: no e-mail of this kind; the inbox still lists it.').waitFor()
    expect((await engineer.client.get<{ preferences: { kind: string, mode: string }[] }>('/api/account/notifications')).body.preferences.find(p => p.kind === 'flag-raised')?.mode).toBe('off')
    await screenshot(page, 'account-preferences-laptop')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'account-preferences-phone')
    await page.goto(`${baseUrl()}/`)
    await screenshot(page, 'inbox-bell-phone')
    await page.setViewportSize({ width: 1280, height: 800 })
    await page.close()
  })
})
