// Browser-test helpers: Debian's Chromium through playwright-core, sign-in as a
// role, and screenshots of every page into test-results/screenshots (git-ignored).
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import { baseUrl } from '../helpers/http'

export const SCREENSHOTS = resolve(import.meta.dirname, '../../test-results/screenshots')

export interface Browser {
  context: BrowserContext
  close: () => Promise<void>
}

export async function launch(): Promise<Browser> {
  const dir = mkdtempSync(join(tmpdir(), 'pastload-chromium-'))
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    viewport: { width: 1280, height: 800 },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
  return {
    context,
    close: async () => {
      await context.close()
      rmSync(dir, { recursive: true, force: true })
    },
  }
}

/** Signs in through the real form; resolves once the project list shows. */
export async function signInAs(context: BrowserContext, email: string, password = DEMO_PASSWORD): Promise<Page> {
  await context.clearCookies()
  const page = await context.newPage()
  await page.goto(`${baseUrl()}/login`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  // The projects page is up (its list is empty, so hidden, for someone in no project yet).
  await page.getByTestId('project-list').waitFor({ state: 'attached' })
  return page
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOTS, { recursive: true })
  const file = join(SCREENSHOTS, `${name}.png`)
  await page.screenshot({ path: file, fullPage: true })
  return file
}
