// The sweep form in a real browser: a storage run starts with a write–read delay axis, the points whose echo
// would leave the 6 ns window get a longer one (the form says how many and up to how long), that can be turned
// off, and the window can be edited here. Screenshots at 1440 and 390 px, both themes.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

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

describe('sweep form', () => {
  it('lengthens the late points’ windows of a write–read delay sweep and says so', async () => {
    const ctx = await newContext(browser, base)
    contexts.push(ctx)
    const page = await ctx.newPage()
    await signIn(page, DEMO.editor)
    await page.goto('/sweeps/new')
    // The storage example: data at 1 ns, write at 1 ns, read at 4 ns, 6 ns window.
    await page.getByText('Write–read delay (ns)').first().waitFor({ timeout: 30_000 })
    const note = page.getByTestId('extended-windows')
    await expect.poll(async () => (await note.count()) > 0 && (await note.innerText()), { timeout: 30_000 }).toMatch(/^\d+ points? gets? a longer window, up to [\d.]+ ns\.$/)
    const upTo = Number(/up to ([\d.]+) ns/.exec(await note.innerText())![1])
    expect(upTo).toBeGreaterThan(6)
    await screenshot(page, 'sweep-form-extended-1440')

    // Off: the windows stay as set (the late echoes' figures would then say they cannot be given).
    await page.getByTestId('extend-window').getByRole('checkbox').uncheck()
    await expect.poll(() => note.count()).toBe(0)
    await page.getByTestId('extend-window').getByRole('checkbox').check()
    await note.waitFor()

    // A window long enough for every echo: nothing to lengthen.
    await page.getByLabel('Window (ns)').fill(String(Math.ceil(upTo) + 1))
    await expect.poll(() => note.count()).toBe(0)
    expect((await page.getByRole('alert').allInnerTexts()).filter((t) => /not a valid run/.test(t))).toEqual([])
    await page.setViewportSize({ width: 390, height: 844 })
    await screenshot(page, 'sweep-form-390')

    const dark = await newContext(browser, base, 'dark', ctx)
    contexts.push(dark)
    const d = await dark.newPage()
    await d.goto('/sweeps/new')
    await d.getByTestId('extended-windows').waitFor({ timeout: 30_000 })
    await screenshot(d, 'sweep-form-dark-1440')
    await d.setViewportSize({ width: 390, height: 844 })
    await screenshot(d, 'sweep-form-dark-390')
  })
})
