// Browser-test helpers: Debian's Chromium through playwright-core, sign-in as a
// role, and screenshots of every page into test-results/screenshots (git-ignored).
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join, resolve } from 'node:path'
import { chromium, type BrowserContext, type Page } from 'playwright-core'
import { afterAll, afterEach, beforeAll, expect } from 'vitest'
import { DEMO_PASSWORD } from '../../shared/demo/scenario'
import type { ProjectRole } from '../../shared/auth/roles'
import { createDemoCopy } from '../helpers/demo-project'
import { baseUrl, type Client, createUser, demoEmail, demoProjectId, signIn, TEST_PASSWORD } from '../helpers/http'

export const SCREENSHOTS = resolve(import.meta.dirname, '../../test-results/screenshots')

export interface Browser {
  context: BrowserContext
  close: () => Promise<void>
}

/**
 * Content-Security-Policy violations seen by any page of any browser launched in
 * this file. Each one fails the test during which it happened (and `close()`
 * fails on those seen after the last test), so every page must work under the CSP.
 */
const cspViolations: string[] = []
const CSP_MARK = '[csp-violation]'

function failOnCspViolations(when: string) {
  if (cspViolations.length === 0) return
  const seen = cspViolations.splice(0)
  throw new Error(`Content-Security-Policy violation ${when}:\n${seen.join('\n')}`)
}

afterEach(() => failOnCspViolations(`in "${expect.getState().currentTestName ?? 'this test'}"`))

function watchCsp(page: Page) {
  page.on('console', (msg) => {
    const text = msg.text()
    if (text.startsWith(CSP_MARK) || /Content Security Policy/i.test(text)) cspViolations.push(`${page.url()}: ${text}`)
  })
}

/** A browser as a device: its screen, touch (`hasTouch`, `isMobile`) for a phone or tablet, and its time zone. */
export interface Device { viewport?: { width: number, height: number }, hasTouch?: boolean, isMobile?: boolean, /** The browser's time zone (IANA). */ timezoneId?: string }

export async function launch(device: Device = {}): Promise<Browser> {
  const dir = mkdtempSync(join(tmpdir(), 'pastload-chromium-'))
  const context = await chromium.launchPersistentContext(dir, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    viewport: { width: 1280, height: 800 },
    ...device,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
  // Runs before any page script; the browser reports each blocked load or inline use as a DOM event.
  await context.addInitScript(`document.addEventListener('securitypolicyviolation', e => console.error(${JSON.stringify(CSP_MARK)} + ' ' + e.effectiveDirective + ' blocked ' + (e.blockedURI || 'inline') + ' at ' + (e.sourceFile || '') + ':' + e.lineNumber))`)
  context.pages().forEach(watchCsp)
  context.on('page', watchCsp)
  return {
    context,
    close: async () => {
      await context.close()
      rmSync(dir, { recursive: true, force: true })
      failOnCspViolations('after the last test')
    },
  }
}

/**
 * One Chromium for the enclosing describe: launched before its first test, closed (and
 * checked for late CSP violations) after its last. Read `.context` inside hooks and tests.
 */
export function useBrowser(device: Device = {}): { readonly context: BrowserContext } {
  let browser: Browser | undefined
  beforeAll(async () => { browser = await launch(device) })
  afterAll(async () => { await browser?.close() })
  return {
    get context() {
      if (!browser) throw new Error('the browser is not launched yet')
      return browser.context
    },
  }
}

/** Signs in through the real form (of the test server unless `base` names another); resolves once the project list shows. */
export async function signInAs(context: BrowserContext, email: string, password = DEMO_PASSWORD, base = baseUrl()): Promise<Page> {
  await context.clearCookies()
  const page = await context.newPage()
  // The sign-in page has no scripts: its form is the browser's own.
  await page.goto(`${base}/login`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  // The projects page is up (its list is empty, so hidden, for someone in no project yet).
  await page.getByTestId('project-list').waitFor({ state: 'attached' })
  // It came without the viewer's zone (the sign-in page has no scripts to tell it); the app keeps it once the page is
  // up, and the next pages come with their dates in it. (A wait, not a check: tests/e2e/dates-by-zone.test.ts checks it.)
  await page.waitForFunction(() => document.cookie.includes('pastload_tz='), undefined, { timeout: 10_000 }).catch(() => undefined)
  return page
}

/**
 * Waits until the app has taken over the page the server sent (`app/plugins/hydrated-mark.client.ts`): the page is
 * painted first, and a control used before then does nothing.
 */
export async function waitForApp(page: Page): Promise<void> {
  await page.locator('html[data-hydrated]').waitFor({ state: 'attached' })
}

/**
 * A visit's first stress-model page shows the server's drawing of the draft, and the workspace opens on first use:
 * this opens it as a user would (a click on the drawing, which leaves the page where it is) and waits for it. Where
 * the page opened the workspace at once (no drawing, an in-app navigation) there is nothing to click.
 */
export async function openWorkspace(page: Page): Promise<void> {
  await waitForApp(page)
  const either = page.locator('[data-testid="model-drawing-figure"], [data-testid="model-workspace"]').first()
  await either.waitFor()
  if (await either.getAttribute('data-testid') === 'model-drawing-figure') await either.click()
  await page.getByTestId('model-workspace').waitFor()
}

/** Signs the demo person of `role` in through the form and opens the page at `path` of project `projectId` (`''` its overview), at the `viewport` size if given. */
export async function openProjectAs(context: BrowserContext, role: ProjectRole, projectId: string, path = '', options: { viewport?: { width: number, height: number } } = {}): Promise<Page> {
  const page = await signInAs(context, demoEmail(role))
  if (options.viewport) await page.setViewportSize(options.viewport)
  await page.goto(`${baseUrl()}/projects/${projectId}${path}`)
  await waitForApp(page)
  // A model's draft page is opened to work in its workspace.
  if (/^\/models\/[^/?#]+$/.test(path)) await openWorkspace(page)
  return page
}

/**
 * One Chromium and one project for the enclosing describe, as the demo person of `role` works in it:
 * the seeded demo project (read only), or, given `copyTag`, a copy of the demo of the describe's own.
 * `client` (the API as that person) and `projectId` are ready inside tests; `open(path)` signs the
 * person in through the form and opens the project's page at `path` (`/models/<id>`, its workspace opened; `/strata`, …),
 * at the `viewport` size if given.
 */
export function useProjectAs(role: ProjectRole, copyTag?: string, device: Device = {}) {
  const browser = useBrowser(device)
  let client: Client | undefined
  let projectId = ''
  beforeAll(async () => {
    client = await signIn(demoEmail(role))
    projectId = copyTag ? await createDemoCopy(copyTag) : await demoProjectId(client)
  })
  const url = (path = '') => `${baseUrl()}/projects/${projectId}${path}`
  return {
    browser,
    get client(): Client {
      if (!client) throw new Error('the project is not ready yet')
      return client
    },
    get projectId() { return projectId },
    url,
    open: (path = '', options: { viewport?: { width: number, height: number } } = {}) => openProjectAs(browser.context, role, projectId, path, options),
  }
}

/** A new account of no project, made by the demo owner, signed in through the form: its page and e-mail. */
export async function signInAsNewAccount(context: BrowserContext, tag: string): Promise<{ page: Page, email: string }> {
  const { email } = await createUser(await signIn(demoEmail('owner')), tag)
  return { page: await signInAs(context, email, TEST_PASSWORD), email }
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(SCREENSHOTS, { recursive: true })
  const file = join(SCREENSHOTS, `${name}.png`)
  await page.screenshot({ path: file, fullPage: true })
  return file
}

/** A laptop (1280 × 800) and a phone (390 × 844) screenshot of the page as it stands; the page is left at laptop size. */
export async function screenshotLaptopAndPhone(page: Page, name: string): Promise<void> {
  await page.setViewportSize({ width: 1280, height: 800 })
  await screenshot(page, `${name}-laptop`)
  await page.setViewportSize({ width: 390, height: 844 })
  await screenshot(page, `${name}-phone`)
  await page.setViewportSize({ width: 1280, height: 800 })
}
