// The form's options for waves in both directions in a real browser: an editor adds a further backward resonance
// to the waveguide and a co-propagating probe equal to the Stokes input ("Compare directions"), sees the derived gain
// of the new resonance and the isolation estimate, and queues the run. Screenshots at 1440 and 390 px, both themes.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { clickUntilVisible, DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

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

async function editorPage(theme: 'light' | 'dark', signedInAs?: BrowserContext): Promise<Page> {
  const ctx = await newContext(browser, base, theme, signedInAs)
  contexts.push(ctx)
  const page = await ctx.newPage()
  if (!signedInAs) await signIn(page, DEMO.editor)
  return page
}

/** Fills the form: one further backward resonance at 7.9 GHz and a co-propagating copy of the Stokes input. */
async function fillWaves(page: Page): Promise<void> {
  await page.goto('/simulations/new')
  const add = page.getByRole('button', { name: 'Add backward resonance' })
  const row = page.getByRole('listitem', { name: 'Backward resonance 1' })
  await clickUntilVisible(page.getByRole('button', { name: /Waveguide parameters/ }), add)
  await clickUntilVisible(add, row)
  await row.getByLabel('Shift ν_B,r').fill('7.9')
  await row.getByLabel('Linewidth Δν_r').fill('40')
  await row.getByLabel('Gain coefficient g_B,r').fill('2e-10')
  await page.getByRole('button', { name: 'Compare directions' }).click()
  await page.getByRole('region', { name: 'Co-propagating probe input' }).waitFor()
}

describe('waves in both directions in the form', () => {
  let signedIn: BrowserContext | undefined

  it('adds a further resonance and a co-propagating probe, shows their derived figures and queues the run', async () => {
    const page = await editorPage('light')
    signedIn = page.context()
    await fillWaves(page)

    const derived = page.getByRole('table', { name: 'Derived quantities' })
    const gainRow = derived.locator('tr[data-quantity="backwardResonance1SmallSignalGain"]')
    await gainRow.waitFor()
    expect(await gainRow.locator('th').innerText()).toContain('Further backward resonance 1: small-signal gain exponent')
    // G = η g/A_eff = 2e-10/2.3e-12 = 86.96 1/(W m) on the chip preset (A_eff = 2.3 µm², η = 1): a figure, not a dash.
    expect(await derived.locator('tr[data-quantity="backwardResonance1GainParameter"] td').first().innerText()).toMatch(/^86\.9/)
    expect(await derived.locator('tr[data-quantity="isolationEstimateDb"]').isVisible()).toBe(true)
    // The estimate counts pump, Stokes and probe, and one acoustic field per backward resonance.
    const estimate = page.getByRole('table', { name: 'Resource estimate' })
    expect(await estimate.locator('tr', { hasText: 'Optical waves and acoustic fields per cell' }).locator('td').innerText()).toBe('3 + 2')
    // The probe carries the Stokes input's two pulses.
    const probe = page.getByRole('region', { name: 'Co-propagating probe input' })
    expect(await probe.getByRole('list', { name: 'Co-propagating probe pulses' }).locator(':scope > li').count()).toBe(2)
    // No schema path or raw validator text anywhere on the page.
    const text = await page.locator('main').innerText()
    expect(text).not.toMatch(/additionalResonances|coProbe|forwardInputs|Invalid input|channels\.\d/)

    await screenshot(page, 'wave-directions-1440-light')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'wave-directions-390-light')

    await page.setViewportSize({ width: 1440, height: 900 })
    await page.getByLabel('Run title').fill('E2E co- and counter-propagating probe')
    await page.getByRole('button', { name: 'Queue run' }).click()
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}/, { timeout: 20_000 })
  })

  it('adds a typical forward resonance with its source, its forward inputs and a Stokes cascade with its threshold and caution (dark theme)', async () => {
    const page = await editorPage('dark', signedIn)
    await fillWaves(page)
    // The source stays beside the resonance it gave. On a busy machine a click can land while the menu is still
    // opening (or under the sticky app bar): the menu is opened centred and its item clicked until the resonance
    // is there, never once it is.
    const added = page.getByText(/^Forward resonance 1 \(typical values\): Kittlaus, Shin & Rakich 2016/)
    const addButton = page.getByRole('button', { name: 'Add typical forward resonance' })
    const item = page.locator('[aria-label="Typical forward resonances"]').getByText(/Suspended silicon waveguide/)
    await expect
      .poll(
        async () => {
          if ((await added.count()) > 0) return true
          if (await item.isVisible()) await item.click({ timeout: 5_000 }).catch(() => {})
          else {
            await addButton.evaluate((el) => el.scrollIntoView({ block: 'center' }))
            await addButton.click({ timeout: 5_000 }).catch(() => {})
          }
          return (await added.count()) > 0
        },
        { timeout: 90_000, interval: 3_000 },
      )
      .toBe(true)
    await page.getByRole('region', { name: 'Forward Stokes input' }).waitFor()
    await page.getByRole('region', { name: 'Forward anti-Stokes input' }).waitFor()
    await page.locator('tr[data-quantity="forwardResonance1SmallSignalGain"]').waitFor()

    const orders = page.locator('.simulation-wave-options__orders')
    // Centred first: scrolled only "into view" it can sit under the sticky app bar.
    await orders.evaluate((el) => el.scrollIntoView({ block: 'center' }))
    await orders.locator('.v-field').click()
    await page.getByRole('option', { name: '2', exact: true }).click()
    await page.locator('tr[data-quantity="cascadeSecondThresholdW"]').waitFor()
    // No seed and no thermal noise: the caution says the higher order stays dark.
    await page.locator('[data-code="cascade-dark"]').waitFor()
    await screenshot(page, 'wave-directions-1440-dark')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'wave-directions-390-dark')
  })
})
