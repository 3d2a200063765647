import { describe, expect, it } from 'vitest'
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../shared/demo/scenario'
import { ROLE_LABELS } from '../../shared/auth/roles'
import { baseUrl, createUser, demoEmail, demoProjectId, signIn, TEST_PASSWORD } from '../helpers/http'
import { createProject } from '../helpers/project'
import { screenshot, signInAs, signInAsNewAccount, useBrowser } from './helpers'

describe('the signed-in workspace in Chromium', () => {
  const browser = useBrowser()

  it('shows the error for a wrong password and stays on the sign-in page', async () => {
    // Signed out, whichever test used the browser before.
    await browser.context.clearCookies()
    const page = await browser.context.newPage()
    await page.goto(`${baseUrl()}/login`)
    await page.getByLabel('E-mail').fill(demoEmail('engineer'))
    await page.getByLabel('Password').fill('not-the-password')
    await page.getByRole('button', { name: 'Sign in' }).click()
    const error = page.getByTestId('login-error')
    await error.waitFor()
    expect(await error.textContent()).toContain('E-mail or password is wrong.')
    expect(new URL(page.url()).pathname).toBe('/login')
    await screenshot(page, 'login-error')
    await page.close()
  })

  it('the sign-in page comes without scripts; its form is sent by the browser, the password never in an address', async () => {
    await browser.context.clearCookies()
    const page = await browser.context.newPage()
    const addresses: string[] = []
    page.on('request', r => addresses.push(r.url()))
    await page.goto(`${baseUrl()}/account`)
    expect(new URL(page.url()).pathname).toBe('/login')
    expect(await page.locator('script[src], script[type="module"]').count()).toBe(0)
    expect(addresses.filter(a => a.endsWith('.js'))).toEqual([])
    await page.getByLabel('E-mail').fill(demoEmail('engineer'))
    await page.getByLabel('Password').fill(DEMO_PASSWORD)
    // Enter sends the form, as the button does; the page asked for goes on from there.
    await page.getByLabel('Password').press('Enter')
    await page.waitForURL(u => u.pathname === '/account')
    await page.getByRole('heading', { name: /account/i }).first().waitFor()
    expect(addresses.filter(a => a.includes('password=') || a.includes(encodeURIComponent(DEMO_PASSWORD)))).toEqual([])
    // The next page came from the server without the viewer's zone; the app keeps it for the pages after.
    await expect.poll(async () => (await browser.context.cookies()).some(c => c.name === 'pastload_tz')).toBe(true)
    await page.close()
  })

  it('sends a signed-out visitor to the sign-in page', async () => {
    await browser.context.clearCookies()
    const page = await browser.context.newPage()
    await page.goto(`${baseUrl()}/account`)
    await page.getByRole('button', { name: 'Sign in' }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/login')
    expect(new URL(page.url()).searchParams.get('next')).toBe('/account')
    await screenshot(page, 'login')
    await page.close()
  })

  for (const person of DEMO_PEOPLE) {
    it(`signs in as the demo ${person.role} and sees TRN-0417 with that role`, async () => {
      const page = await signInAs(browser.context, person.email)
      const card = page.getByTestId('project-list').getByRole('link', { name: /Saltmarsh Lane Freight Terminal/ })
      expect(await card.textContent()).toContain(ROLE_LABELS[person.role])
      await screenshot(page, `projects-${person.role}`)
      await card.click()
      await page.getByRole('heading', { name: 'Saltmarsh Lane Freight Terminal' }).waitFor()
      const table = page.getByTestId('members-table')
      // The member list loads after navigation: wait for its rows.
      await table.getByText('Priya Natarajan').waitFor()
      expect(await table.locator('tbody tr').count()).toBeGreaterThanOrEqual(5)
      const canManage = person.role === 'owner'
      expect(await page.getByTestId('add-member').count()).toBe(canManage ? 1 : 0)
      expect(await page.getByTestId('new-project').count()).toBe(0)
      await screenshot(page, `project-${person.role}`)
      await page.close()
    })
  }

  it('a viewer sees no create or edit controls anywhere', async () => {
    const admin = await signIn(demoEmail('owner'))
    // A project of this test's own: adding the viewer leaves the demo's members alone.
    const viewer = await createUser(admin, 'viewer')
    const { id: projectId } = await createProject(admin, 'WSV', 'Viewer controls check', [{ email: viewer.email, role: 'viewer' }])

    const page = await signInAs(browser.context, viewer.email, TEST_PASSWORD)
    expect(await page.getByTestId('new-project').count()).toBe(0)
    await page.goto(`${baseUrl()}/projects/${projectId}`)
    await page.getByTestId('members-table').waitFor()
    expect(await page.getByTestId('add-member').count()).toBe(0)
    expect(await page.getByRole('button', { name: 'Remove' }).count()).toBe(0)
    expect(await page.locator('[data-testid="members-table"] select').count()).toBe(0)
    await screenshot(page, 'project-viewer')
    await page.close()
  })

  it('someone outside a project finds no trace of it on any of its pages', async () => {
    const admin = await signIn(demoEmail('owner'))
    const projectId = await demoProjectId(admin)
    const { page } = await signInAsNewAccount(browser.context, 'outsider')
    for (const path of ['', '/plan', '/strata', '/tests', '/preconsolidation', '/review', '/models']) {
      await page.goto(`${baseUrl()}/projects/${projectId}${path}`)
      const box = page.getByTestId('project-not-found')
      await box.waitFor()
      expect(await box.textContent()).toContain('It does not exist, or you are not a member of it.')
      expect(await page.getByText('Saltmarsh Lane').count()).toBe(0)
      expect(await page.getByTestId('project-switcher').inputValue()).toBe('')
    }
    await screenshot(page, 'project-not-found')
    await page.getByRole('link', { name: 'Back to projects' }).click()
    await page.waitForURL(`${baseUrl()}/`)
    await page.close()
  })

  it('the site admin sees the new-project form; the account page lists tokens; sign-out works', async () => {
    const page = await signInAs(browser.context, demoEmail('owner'))
    await page.getByTestId('new-project').click()
    await page.getByRole('button', { name: 'Create project' }).click()
    expect(await page.getByText('Job number must be at least 2 characters').count()).toBe(1)
    await screenshot(page, 'projects-new')
    await page.goto(`${baseUrl()}/account`)
    await page.getByLabel('Token name').fill('browser test')
    await page.getByRole('button', { name: 'Create token' }).click()
    const token = await page.getByTestId('new-token').textContent()
    expect(token).toMatch(/^plt_/)
    await screenshot(page, 'account')
    await page.getByTestId('user-menu').click()
    await page.getByTestId('sign-out').click()
    await page.getByRole('button', { name: 'Sign in' }).waitFor()
    expect(new URL(page.url()).pathname).toBe('/login')
    await page.close()
  })
})
