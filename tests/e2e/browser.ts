// Shared pieces of the browser tests: Debian's chromium through playwright-core (never a downloaded
// browser), sign-in through the real form, and screenshots for review under tests/artifacts/.
import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { chromium, type Browser, type BrowserContext, type Locator, type Page } from 'playwright-core'
import { REPO_ROOT } from '../../server/env'

export const ARTIFACTS = join(REPO_ROOT, 'tests', 'artifacts')

export const DEMO = {
  editor: { email: 'tomas@halden-lab.example', password: 'demo-password-2' },
  viewer: { email: 'mei@halden-lab.example', password: 'demo-password-3' },
} as const

export function launchBrowser(): Promise<Browser> {
  return chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    // docs/operations.md: the flags that worked with Debian's chromium on this machine.
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  })
}

/** A browser context; pass `signedInAs` (another context) to reuse its session cookie instead of signing in again. */
export async function newContext(browser: Browser, baseURL: string, theme: 'light' | 'dark' = 'light', signedInAs?: BrowserContext): Promise<BrowserContext> {
  const storageState = signedInAs ? await signedInAs.storageState() : undefined
  const context = await browser.newContext({ baseURL, viewport: { width: 1440, height: 900 }, acceptDownloads: true, storageState })
  const stored = theme === 'dark' ? 'sonoweaveDark' : 'sonoweaveLight'
  await context.addInitScript(`localStorage.setItem('sonoweave.theme', '${stored}')`)
  return context
}

export async function signIn(page: Page, who: { email: string; password: string }): Promise<void> {
  await page.goto('/sign-in')
  await page.getByLabel('E-mail').fill(who.email)
  await page.getByLabel('Password', { exact: true }).fill(who.password)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'), { timeout: 20_000 })
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(ARTIFACTS, { recursive: true })
  await page.screenshot({ path: join(ARTIFACTS, `${name}.png`), fullPage: true })
}

/**
 * Clicks `button` until `shows` is visible. On a loaded machine a click can land while a panel is still opening
 * (or before the page's handlers are ready) and be lost; each try waits 10 s for its effect before clicking again.
 */
export async function clickUntilVisible(button: Locator, shows: Locator, tries = 6): Promise<void> {
  for (let attempt = 0; attempt < tries && !(await shows.isVisible()); attempt++) {
    await button.evaluate((el) => el.scrollIntoView({ block: 'center' })).catch(() => {})
    await button.click({ timeout: 10_000 }).catch(() => {})
    await shows.waitFor({ timeout: 10_000 }).catch(() => {})
  }
  await shows.waitFor()
}
