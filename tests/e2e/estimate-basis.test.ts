// The expected time in the simulation and sweep forms says where it comes from, in words: this server's
// measured speed of the same kind of run, or the benchmark figures until it has some. At 1440 and 390 px.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext } from 'playwright-core'
import { join } from 'node:path'
import { ARTIFACTS, DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
const contexts: BrowserContext[] = []
const BASIS = /^(Measured on this server: the speed of its last \d+ runs of the same kind \(.+\)|From the benchmark figures, since this server has not finished enough runs of this kind \(.+\) yet): between .+ and .+\.$/

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  for (const c of contexts) await c.close()
  await browser?.close()
})

describe('estimate basis', () => {
  it('is stated beside the expected time of a run and of a sweep, on a laptop and a phone', async () => {
    const ctx = await newContext(browser, base)
    contexts.push(ctx)
    const page = await ctx.newPage()
    await signIn(page, DEMO.editor)
    await page.goto('/simulations/new')
    const basis = page.getByTestId('estimate-basis')
    await basis.first().waitFor({ timeout: 30_000 })
    expect(await basis.first().innerText()).toMatch(BASIS)
    await basis.first().scrollIntoViewIfNeeded()
    await screenshot(page, 'estimate-basis-run-1440')
    // The estimate panel alone, readable at review size.
    await page.locator('.simulation-resource-estimate').screenshot({ path: join(ARTIFACTS, 'estimate-basis-run-panel-1440.png') })
    await page.setViewportSize({ width: 390, height: 844 })
    await basis.first().scrollIntoViewIfNeeded()
    expect(await basis.first().innerText()).toMatch(BASIS)
    await screenshot(page, 'estimate-basis-run-390')
    await page.locator('.simulation-resource-estimate').screenshot({ path: join(ARTIFACTS, 'estimate-basis-run-panel-390.png') })

    await page.setViewportSize({ width: 1440, height: 900 })
    await page.goto('/sweeps/new')
    const sweepBasis = page.getByTestId('estimate-basis')
    await sweepBasis.first().waitFor({ timeout: 30_000 })
    expect(await sweepBasis.first().innerText()).toMatch(BASIS)
    await screenshot(page, 'estimate-basis-sweep-1440')
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'estimate-basis-sweep-390')
    await sweepBasis.first().locator('xpath=ancestor::div[contains(@class, "v-card")][1]').screenshot({ path: join(ARTIFACTS, 'estimate-basis-sweep-panel-390.png') })
  })
})
