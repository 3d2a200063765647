// The account page's token form: expiry by days or by date, the read-only choice, and the
// list showing scope and expiry. Each test uses its own new account.
import { describe, expect, it } from 'vitest'
import { formatDate } from '../../app/utils/dates'
import { baseUrl, signIn, TEST_PASSWORD } from '../helpers/http'
import { screenshot, signInAsNewAccount, useBrowser } from './helpers'

/** yyyy-mm-dd, n days from today in the test machine's zone (the browser's too). */
function dateAhead(days: number): string {
  const d = new Date()
  d.setDate(d.getDate() + days)
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`
}

describe('API tokens on the account page', () => {
  const browser = useBrowser()

  it('creates a read-only token expiring on a chosen date and a default one, and lists scope and expiry', async () => {
    const { page, email } = await signInAsNewAccount(browser.context, 'tokens-ui')
    await page.goto(`${baseUrl()}/account`)

    await page.getByLabel('Token name').fill('site dashboard')
    await page.getByTestId('token-expiry-date-mode').check()
    const on = dateAhead(30)
    await page.getByLabel('Date the token stops working').fill(on)
    await page.getByLabel('Read-only (read and compute; no changes)').check()
    await page.getByRole('button', { name: 'Create token' }).click()
    expect(await page.getByTestId('new-token').textContent()).toMatch(/^plt_/)

    await page.getByLabel('Token name').fill('nightly export')
    await page.getByTestId('token-expiry-days-mode').check()
    await page.getByLabel('Read-only (read and compute; no changes)').uncheck()
    await page.getByRole('button', { name: 'Create token' }).click()
    const rows = page.getByTestId('token-table').locator('tbody tr')
    await rows.nth(1).waitFor()
    expect(await rows.count()).toBe(2)
    // Newest first: the default (read and write, 90 days) above the read-only one.
    expect(await rows.nth(0).getByTestId('token-scope').textContent()).toContain('read and write')
    expect(await rows.nth(1).getByTestId('token-scope').textContent()).toContain('read-only')
    const [y, m, d] = on.split('-').map(Number) as [number, number, number]
    expect(await rows.nth(1).getByTestId('token-expires').textContent()).toContain(formatDate(new Date(y, m - 1, d)))
    await screenshot(page, 'account-tokens')

    const list = await (await signIn(email, TEST_PASSWORD)).get<{ tokens: { name: string, scope: string, expiresAt: string, createdAt: string }[] }>('/api/account/tokens')
    const dated = list.body.tokens.find(t => t.name === 'site dashboard')!
    expect(dated.scope).toBe('read-only')
    expect(new Date(dated.expiresAt).getTime()).toBe(new Date(y, m - 1, d).getTime())
    const byDefault = list.body.tokens.find(t => t.name === 'nightly export')!
    expect(byDefault.scope).toBe('read-write')
    expect(Math.round((Date.parse(byDefault.expiresAt) - Date.parse(byDefault.createdAt)) / 86_400_000)).toBe(90)
    await page.close()
  })

  it('says why a token is refused before sending it: more than a year', async () => {
    const { page } = await signInAsNewAccount(browser.context, 'tokens-ui-bad')
    await page.goto(`${baseUrl()}/account`)
    await page.getByLabel('Token name').fill('too long')
    await page.getByLabel('Days until the token expires').fill('400')
    await page.getByRole('button', { name: 'Create token' }).click()
    const alert = page.getByRole('alert')
    await alert.waitFor()
    expect(await alert.textContent()).toContain('Days until expiry must be at most 365 days (one year).')
    await screenshot(page, 'account-token-too-long')
    await page.close()
  })
})
