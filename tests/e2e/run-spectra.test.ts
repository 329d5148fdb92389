// The optical spectra panel of a finished run in a real browser: the spectrum of a port with its window and
// resolution bandwidth under the plot, the port selector, and a dark port's "no light" state. Screenshots at
// 1440 and 390 px in both themes.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { ARTIFACTS, DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
const contexts: BrowserContext[] = []

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {})
  await browser?.close()
})

const panel = (page: Page) => page.locator('.v-card', { has: page.getByRole('heading', { name: 'Optical spectra' }) })

async function shoot(page: Page, name: string): Promise<void> {
  const card = panel(page)
  await card.scrollIntoViewIfNeeded()
  await page.waitForTimeout(300) // let the chart paint before the picture
  await card.screenshot({ path: join(ARTIFACTS, `${name}-panel.png`) })
  await screenshot(page, name)
}

describe('run spectra', () => {
  it('shows a port spectrum with its window and RBW, and says when a port has no light', async () => {
    const ctx = await newContext(browser, base)
    contexts.push(ctx)
    const page = await ctx.newPage()
    await signIn(page, DEMO.editor)
    const me = await (await page.request.get('/api/me')).json()
    // The pulsed example without a Stokes input: nothing enters at z = L and nothing seeds the Stokes wave.
    const example = JSON.parse(readFileSync('solver/examples/pulsed-pump-depletion-chalcogenide-rib.json', 'utf8'))
    const config = { ...example, channels: [{ ...example.channels[0], stokes: { pulses: [], backgroundPowerW: 0 } }], energyWindows: [] }
    const res = await page.request.post('/api/runs', { data: { groupId: me.currentGroupId ?? me.memberships[0].groupId, title: 'E2E spectra', config } })
    expect(res.status()).toBe(202)
    const runId = (await res.json()).id as string

    await page.goto(`/runs/${runId}`)
    await page.locator('[data-testid=run-status]', { hasText: 'Succeeded' }).first().waitFor({ timeout: 120_000 })
    // The stored result carries the same spectra as arrays with units (they go into the ZIP as NPY files).
    const detail = (await (await page.request.get(`/api/runs/${runId}`)).json()) as { arrays: { name: string; units: string }[] }
    const units = Object.fromEntries(detail.arrays.map((d) => [d.name, d.units]))
    expect(units).toMatchObject({ spectrum_offset_ghz: 'GHz', ch1_pump_in_psd_dbm_per_ghz: 'dBm/GHz', ch1_pump_out_psd_dbm_per_ghz: 'dBm/GHz' })
    expect(units.ch1_stokes_in_psd_dbm_per_ghz).toBeUndefined()

    const rbw = page.getByTestId('spectrum-rbw')
    await rbw.waitFor({ timeout: 30_000 })
    expect(await rbw.textContent()).toMatch(/Hann window, \d+-sample segments overlapping 75 % \(\d+ averaged\); resolution bandwidth [\d.]+ [kMG]?Hz \(1\.5 × 1\/segment duration\), drawn every [\d.]+ [kMG]?Hz/)
    await page.getByRole('img', { name: /Power spectral density of the Pump out \(z = L\) trace/ }).waitFor()
    await shoot(page, 'run-spectra-1440')

    await panel(page).getByRole('button', { name: 'Stokes in (z = L)' }).click()
    await page.getByTestId('spectrum-dark').waitFor()
    expect(await page.getByTestId('spectrum-dark').textContent()).toContain('No light at this port')
    expect(await rbw.count()).toBe(0)

    await panel(page).getByRole('button', { name: 'Pump in (z = 0)' }).click()
    await rbw.waitFor()
    await page.setViewportSize({ width: 390, height: 844 })
    await shoot(page, 'run-spectra-390')

    const darkCtx = await newContext(browser, base, 'dark', ctx)
    contexts.push(darkCtx)
    const dark = await darkCtx.newPage()
    await dark.goto(`/runs/${runId}`)
    await dark.getByTestId('spectrum-rbw').waitFor({ timeout: 30_000 })
    await shoot(dark, 'run-spectra-dark-1440')
    await dark.setViewportSize({ width: 390, height: 844 })
    await shoot(dark, 'run-spectra-dark-390')
  })
})
