// Modulated sources in the form in a real browser: an editor gives the pump and the Stokes input one shared
// sinusoidal frequency modulation, reads the modulation index and the correlation peaks on the waveguide, and
// queues the run. Screenshots at 1440 and 390 px.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let ctx: BrowserContext

beforeAll(async () => {
  browser = await launchBrowser()
  ctx = await newContext(browser, base)
})
afterAll(async () => {
  await ctx?.close().catch(() => {})
  await browser?.close()
})

async function modulate(page: Page, port: 'Pump' | 'Stokes'): Promise<void> {
  const group = page.getByRole('group', { name: `${port} modulation` })
  const rate = group.getByLabel('Rate f_m')
  // Centre the select first: scrolled only "into view" it can sit under the sticky app bar. On a loaded machine
  // a click can land while the menu is still opening, so the choice is made again until the fields appear.
  const fm = page.getByRole('option', { name: 'Sinusoidal FM' })
  for (let attempt = 0; attempt < 6 && !(await rate.isVisible()); attempt++) {
    await group.evaluate((el) => el.scrollIntoView({ block: 'center' }))
    if (!(await fm.isVisible())) await group.locator('.simulation-port-modulation__kind .v-field').click({ timeout: 10_000 }).catch(() => {})
    await fm.waitFor({ timeout: 10_000 }).catch(() => {})
    if (await fm.isVisible()) await fm.click({ timeout: 10_000 }).catch(() => {})
    await rate.waitFor({ timeout: 10_000 }).catch(() => {})
  }
  await rate.waitFor()
  await page.getByRole('listbox').waitFor({ state: 'detached' })
  await rate.fill('20')
  await group.getByLabel('Excursion ±Δf').fill('2000')
}

describe('modulated sources in the form', () => {
  it('gives pump and Stokes one frequency modulation, shows β and the correlation peaks, and queues the run', async () => {
    const page = await ctx.newPage()
    await signIn(page, DEMO.editor)
    await page.goto('/simulations/new')
    await modulate(page, 'Pump')
    await modulate(page, 'Stokes')

    const pump = page.getByRole('group', { name: 'Pump modulation' })
    const text = await pump.innerText()
    expect(text).toContain('β = Δf/f_m = 100 rad')
    // Correlation peaks every v_g/(2 f_m) on the form's starting waveguide: a length, not a dash.
    expect(text).toMatch(/correlation peaks every \d[\d.]* m \(d_m = v_g\/\(2 f_m\)\), each about \d[\d.]* (m|mm|µm) wide/)
    expect(await page.locator('main').innerText()).not.toMatch(/excursionMHz|rateMHz|modulation\.|channels\.\d|Invalid input/)

    await screenshot(page, 'port-modulation-1440')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'port-modulation-390')

    await page.setViewportSize({ width: 1440, height: 900 })
    await page.getByLabel('Run title').fill('E2E shared frequency modulation')
    await page.getByRole('button', { name: 'Queue run' }).click()
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}/, { timeout: 20_000 })
  })
})
