// The built app under its Content-Security-Policy in Chromium: every page, signed out and signed in
// as a site admin, including a finished run's charts, loads without a single CSP violation. A control
// shows the listener does catch one (an injected inline script), so a quiet run means something.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
const ADMIN = { email: 'ingrid@halden-lab.example', password: 'demo-password-1' }
const MISSING_ID = '00000000-0000-4000-8000-000000000000'
let browser: Browser
const contexts: BrowserContext[] = []

/** A page that records every securitypolicyviolation event and every CSP console complaint. */
async function watchedPage(): Promise<{ page: Page; violations: () => Promise<string[]> }> {
  const ctx = await newContext(browser, base)
  contexts.push(ctx)
  // Init scripts run through the DevTools protocol, outside the page's CSP. (Page code is passed as
  // strings: this file is type-checked for Node, without the DOM's types.)
  await ctx.addInitScript(`
    window.cspViolations = []
    document.addEventListener('securitypolicyviolation', (e) => window.cspViolations.push(e.violatedDirective + ' ' + e.blockedURI + ' at ' + location.pathname))
  `)
  const page = await ctx.newPage()
  const fromConsole: string[] = []
  page.on('console', (m) => {
    if (/Content Security Policy/i.test(m.text())) fromConsole.push(`${m.text()} at ${new URL(page.url()).pathname}`)
  })
  const violations = async () => [...fromConsole, ...((await page.evaluate('window.cspViolations').catch(() => [])) as string[])]
  return { page, violations }
}

/** Opens each path in turn and returns the violations seen, per path (checked before leaving it). */
async function visit(page: Page, violations: () => Promise<string[]>, paths: string[]): Promise<string[]> {
  const seen: string[] = []
  for (const path of paths) {
    const res = await page.goto(path)
    expect(res?.headers()['content-security-policy']).toContain("script-src 'self'")
    await page.locator('main, .v-main, #app > *').first().waitFor()
    await page.waitForLoadState('networkidle').catch(() => {})
    seen.push(...(await violations()))
  }
  return seen
}

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {})
  await browser?.close()
})

describe('Content-Security-Policy in the browser', () => {
  it('catches a violation when one happens (control: an inline script injected into the page)', async () => {
    const { page, violations } = await watchedPage()
    await page.goto('/sign-in')

    await page.evaluate(`{
      const s = document.createElement('script')
      s.textContent = 'window.inlineRan = true'
      document.body.append(s)
    }`)
    await expect.poll(violations).not.toEqual([])

    expect(await page.evaluate('window.inlineRan')).toBeUndefined()
  })

  it('shows every signed-out page without a violation', async () => {
    const { page, violations } = await watchedPage()
    const seen = await visit(page, violations, ['/sign-in', '/sign-up', '/reset-password?token=abc', '/confirm-email?token=abc', '/accept-invite?token=abc', '/no/such/page'])
    expect(seen).toEqual([])
  })

  it('shows every signed-in page, a finished run with its charts included, without a violation', async () => {
    const { page, violations } = await watchedPage()
    await signIn(page, ADMIN)

    // A short run of the default form, so the run page draws its maps and line charts.
    await page.goto('/simulations/new')
    await page.getByLabel('Run title').fill('CSP check run')
    await page.getByRole('button', { name: 'Queue run' }).click()
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}/, { timeout: 20_000 })
    const runPath = new URL(page.url()).pathname
    await page.locator('[data-testid=run-status]', { hasText: 'Succeeded' }).first().waitFor({ timeout: 80_000 })
    // Polled from the test: waitForFunction would eval in the page, which the policy under test forbids.
    await expect.poll(() => page.$$eval('section.space-time-map', (els) => els.length > 0 && els.every((e) => Number(e.getAttribute('data-rows-filled')) > 0)), { timeout: 30_000 }).toBe(true)
    // A line chart's tooltip: ECharts writes it as HTML with style attributes.
    const chart = page.getByRole('img', { name: /Output power and phase/ })
    await chart.waitFor()
    await chart.scrollIntoViewIfNeeded()
    const box = (await chart.boundingBox())!
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.5)
    await page.waitForTimeout(500)
    await screenshot(page, 'csp-run-tooltip')
    const onRun = await violations()

    const seen = await visit(page, violations, [
      '/',
      '/simulations/new',
      '/waveguides',
      '/runs',
      runPath,
      `/runs/${MISSING_ID}`,
      '/traces',
      `/traces/${MISSING_ID}`,
      '/sweeps',
      '/sweeps/new',
      `/sweeps/${MISSING_ID}`,
      '/group',
      '/tokens',
      '/admin',
      '/admin/held-mail',
    ])
    await screenshot(page, 'csp-held-mail')

    expect(onRun).toEqual([])
    expect(seen).toEqual([])
  })
})
