// An owner invites a new address from the team panel; the invitee opens the e-mailed link
// (read back from the outbox row), chooses a name and password and lands in the project with
// the invited role. Also: the role change asks first, "Forgot password?" through to a new
// password, the people page. Screenshots at laptop and phone sizes.
import pg from 'pg'
import type { Page } from 'playwright-core'
import { afterAll, describe, expect, it } from 'vitest'
import { baseUrl, createUser, demoEmail, signIn, TEST_PASSWORD, uniqueEmail } from '../helpers/http'
import { createProject } from '../helpers/project'
import { screenshot, screenshotLaptopAndPhone, signInAs, useBrowser, waitForApp } from './helpers'

const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 1 })
afterAll(() => pool.end())

async function linkFromOutbox(email: string, kind: 'invitation' | 'password-reset'): Promise<string> {
  const { rows } = await pool.query<{ text_body: string }>('select text_body from mail_outbox where lower(to_address) = lower($1) and kind = $2 order by id desc limit 1', [email, kind])
  const m = /\/(invitations|reset-password)\/([A-Za-z0-9_-]{43})/.exec(rows[0]?.text_body ?? '')
  if (!m) throw new Error(`no ${kind} link for ${email}`)
  return `/${m[1]}/${m[2]}`
}

/** A one-time link opened a second time says plainly that it was used (screenshots, then closes the page). */
async function expectUsedLink(page: Page, link: string, problemTestId: string, shot: string) {
  await page.goto(`${baseUrl()}${link}`)
  const problem = page.getByTestId(problemTestId)
  await problem.waitFor()
  expect(await problem.textContent()).toContain('already been used')
  await screenshotLaptopAndPhone(page, shot)
  await page.close()
}

describe('invitations, password reset and people in the browser', () => {
  const browser = useBrowser()

  it('an owner invites a new address; the invitee accepts from the e-mailed link and lands in the project as reviewer', async () => {
    const admin = await signIn(demoEmail('owner'))
    const owner = await createUser(admin, 'e2e-inv-owner')
    const colleague = await createUser(admin, 'e2e-inv-colleague')
    const project = await createProject(admin, 'EINV', 'Invitation walk-through', [{ email: owner.email, role: 'owner' }, { email: colleague.email, role: 'viewer' }])

    const page = await signInAs(browser.context, owner.email, TEST_PASSWORD)
    await page.goto(`${baseUrl()}/projects/${project.id}`)
    const team = page.getByTestId('members-table')
    await team.getByRole('cell', { name: colleague.email }).waitFor()
    // The table comes with the page; its role choices answer once the app has taken the page over.
    await waitForApp(page)

    // A role change waits for the owner's confirmation.
    const colleagueRole = page.getByLabel(/^Role of Test e2e-inv-colleague/)
    await colleagueRole.selectOption('designer')
    await page.getByText('Viewer → Design team?').waitFor()
    const stillViewer = await owner.client.get<{ members: { email: string, role: string }[] }>(`/api/projects/${project.id}/members`)
    expect(stillViewer.body.members.find(m => m.email === colleague.email)?.role).toBe('viewer')
    await page.getByRole('button', { name: 'Change role' }).click()
    await page.getByText('is now design team.').waitFor()

    const invitee = uniqueEmail('e2e-invitee')
    await page.getByLabel('Invite by e-mail').fill(invitee)
    await page.getByLabel('Role', { exact: true }).selectOption('reviewer')
    await page.getByRole('button', { name: 'Invite', exact: true }).click()
    await page.getByText(`Invitation sent to ${invitee}.`).waitFor()
    const pending = page.getByTestId('pending-invitations')
    await pending.getByText(invitee).waitFor()
    expect(await pending.locator('tbody tr').filter({ hasText: invitee }).textContent()).toContain('Reviewer')
    await screenshotLaptopAndPhone(page, 'team-panel')
    await page.close()

    // The invitee, signed out, opens the link from the e-mail.
    await browser.context.clearCookies()
    const link = await linkFromOutbox(invitee, 'invitation')
    const guest = await browser.context.newPage()
    await guest.goto(`${baseUrl()}${link}`)
    await waitForApp(guest)
    const summary = guest.getByTestId('invitation-summary')
    await summary.waitFor()
    expect((await summary.textContent())?.replace(/\s+/g, ' ')).toContain('invites you to')
    expect(await summary.textContent()).toContain('Invitation walk-through')
    expect(await summary.textContent()).toContain('reviewer')
    await screenshotLaptopAndPhone(guest, 'invitation')
    await guest.getByLabel('Your name, as colleagues see it').fill('Marguerite Oyelaran')
    await guest.getByLabel('Password (12 characters or more)').fill('tidal-flats-and-sandbars-7')
    await guest.getByLabel('The same password again').fill('tidal-flats-and-sandbars-7')
    await guest.getByRole('button', { name: 'Create my account and open the project' }).click()
    await guest.getByRole('heading', { name: 'Invitation walk-through' }).waitFor()
    expect(new URL(guest.url()).pathname).toBe(`/projects/${project.id}`)
    await guest.getByText('you are reviewer').waitFor()
    await screenshot(guest, 'invitation-accepted')

    // The same link a second time says so plainly.
    await expectUsedLink(guest, link, 'invitation-problem', 'invitation-used')
  })

  it('"Forgot password?" leads to a link; the reset page sets a new password and signs in', async () => {
    const admin = await signIn(demoEmail('owner'))
    const user = await createUser(admin, 'e2e-reset')
    await browser.context.clearCookies()
    const page = await browser.context.newPage()
    await page.goto(`${baseUrl()}/login`)
    await page.getByTestId('forgot-password').click()
    await page.getByRole('heading', { name: 'Forgot password?' }).waitFor()
    await waitForApp(page)
    await screenshotLaptopAndPhone(page, 'forgot-password')
    await page.getByLabel('E-mail').fill(user.email)
    await page.getByRole('button', { name: 'Send the link' }).click()
    await page.getByTestId('reset-requested').waitFor()
    await screenshotLaptopAndPhone(page, 'forgot-password-sent')

    const link = await linkFromOutbox(user.email, 'password-reset')
    await page.goto(`${baseUrl()}${link}`)
    await waitForApp(page)
    await page.getByRole('heading', { name: 'Choose a new password' }).waitFor()
    await screenshotLaptopAndPhone(page, 'reset-password')
    await page.getByLabel('New password').fill('harbour-mud-line-2026')
    await page.getByLabel('The same password again').fill('harbour-mud-line-2026')
    await page.getByRole('button', { name: 'Save the new password' }).click()
    await page.getByTestId('project-list').waitFor({ state: 'attached' })
    expect((await signIn(user.email, 'harbour-mud-line-2026')).cookie).toMatch(/^pastload_session=/)

    await expectUsedLink(page, link, 'reset-link-problem', 'reset-password-used')
  })

  it('the people page lists accounts and a site admin disables and enables one', async () => {
    const admin = await signIn(demoEmail('owner'))
    const target = await createUser(admin, 'e2e-people')
    await admin.post('/api/admin/users', { email: uniqueEmail('e2e-site-invite') })
    const page = await signInAs(browser.context, demoEmail('owner'))
    await page.goto(`${baseUrl()}/admin/people`)
    await waitForApp(page)
    const row = page.getByTestId(`person-${target.email}`)
    await row.waitFor()
    page.once('dialog', d => void d.accept())
    await row.getByRole('button', { name: 'Disable' }).click()
    await row.getByText(/^Disabled/).waitFor()
    expect((await target.client.get('/api/auth/me')).status).toBe(401)
    await page.getByTestId('site-invitations').waitFor()
    await screenshotLaptopAndPhone(page, 'people')
    page.once('dialog', d => void d.accept())
    await row.getByRole('button', { name: 'Enable' }).click()
    await row.getByText('Active').waitFor()
    await page.close()
  })
})
