// Uploading a measured trace in a real browser: a file that does not name its time unit is held back
// until the editor picks one, with the span and sample spacing each choice implies on screen, and is
// stored in the unit picked.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let context: BrowserContext

beforeAll(async () => {
  browser = await launchBrowser()
  context = await newContext(browser, base)
})
afterAll(async () => {
  await context?.close()
  await browser?.close()
})

// No header: 400 samples of a Gaussian pulse, time 0 to 7.98 in steps of 0.02 (the numbers of a µs time base).
const headerless = Array.from({ length: 400 }, (_, i) => `${(i * 0.02).toFixed(2)},${(1e-3 * Math.exp(-(((i - 200) / 40) ** 2))).toExponential(4)}`).join('\n')

describe('trace upload', () => {
  it('asks for the time unit of a file that names none, shows the span it implies, and stores the trace in it', async () => {
    const page = await context.newPage()
    await signIn(page, DEMO.editor)
    await page.goto('/traces')
    await page.getByRole('button', { name: 'Upload trace' }).click()
    const dialog = page.locator('.v-dialog', { hasText: 'Upload a measured trace' })
    await dialog.locator('input[type=file]').setInputFiles({ name: 'probe pulse.csv', mimeType: 'text/csv', buffer: Buffer.from(headerless) })

    await dialog.getByRole('alert').filter({ hasText: 'The file does not name the unit of its time column: choose it.' }).waitFor()
    // The preview was parsed in its worker (allowed by the page's CSP), not on the page's main thread.
    expect(page.workers().map((w) => w.url())).toEqual([expect.stringMatching(/trace-preview\.worker/)])
    const upload = dialog.getByRole('button', { name: 'Upload', exact: true })
    expect(await upload.isDisabled()).toBe(true)
    await screenshot(page, 'trace-upload-time-unit-asked')

    await dialog.getByRole('button', { name: 'µs', exact: true }).click()
    await dialog.getByText('Span 0–7.98 µs, one sample every 20 ns').waitFor()
    expect(await upload.isDisabled()).toBe(false)
    await screenshot(page, 'trace-upload-time-unit-chosen')

    await upload.click()
    await page.waitForURL(/\/traces\/[0-9a-f-]{36}/, { timeout: 20_000 })
    await page.getByText('0 to 7980 ns').waitFor()
    await page.getByText('Column 1 in µs').waitFor()
  })
})
