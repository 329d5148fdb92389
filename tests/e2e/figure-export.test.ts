// Figures for a paper from a finished run: a port-trace chart and a space–time map saved as SVG and PDF at one
// journal column (8.5 cm) and a page width (17 cm), opened and measured. 8.5 cm = 240.94 pt (1 in = 2.54 cm = 72 pt).
import { readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Download, Page } from 'playwright-core'
import { ARTIFACTS, DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let ctx: BrowserContext

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  await ctx?.close().catch(() => {})
  await browser?.close()
})

/**
 * Opens the Figure menu and picks one entry, until the file arrives. On a busy machine a click can land while the
 * menu is still opening, or close the menu without picking: so each step is repeated until it took (the menu shows
 * the entry; the entry has gone once picked), and the whole pick again when no file came and the button shows no
 * figure being made (a PDF is converted in the page, which may take a while then).
 */
async function save(page: Page, menu: ReturnType<Page['locator']>, choice: string): Promise<Buffer> {
  const item = page.getByTestId(choice)
  let file: Download | null = null
  const download = page.waitForEvent('download', { timeout: 280_000 })
  download.then((d) => (file = d)).catch(() => {})
  const making = () => menu.evaluate((node) => (node as unknown as { classList: { contains(c: string): boolean } }).classList.contains('v-btn--loading')).catch(() => false)
  for (let attempt = 0; attempt < 5 && file === null; attempt++) {
    // Mid-screen, so the button is not under the fixed app bar and its menu opens in view.
    await menu.evaluate((node) => (node as unknown as { scrollIntoView(o: { block: string }): void }).scrollIntoView({ block: 'center' }))
    for (let i = 0; i < 5 && !(await item.isVisible()); i++) {
      await menu.click({ timeout: 10_000 }).catch(() => {})
      await item.waitFor({ timeout: 10_000 }).catch(() => {})
    }
    for (let i = 0; i < 5 && (await item.isVisible()); i++) {
      await item.click({ timeout: 10_000 }).catch(() => {})
      await item.waitFor({ state: 'hidden', timeout: 10_000 }).catch(() => {})
    }
    // Wait while a figure is being made; 10 s after it stopped (or never started) without a file, pick again.
    let idleSince = Date.now()
    while (file === null && Date.now() - idleSince < 10_000) {
      await page.waitForTimeout(250)
      if (await making()) idleSince = Date.now()
    }
  }
  return readFileSync(await (await download).path())
}

describe('chart figures', () => {
  it('saves a trace chart and a map as SVG and PDF of the journal sizes, with axes and a colour bar', async () => {
    ctx = await newContext(browser, base)
    const page = await ctx.newPage()
    await signIn(page, DEMO.editor)
    const me = await (await page.request.get('/api/me')).json()
    const config = JSON.parse(readFileSync('solver/examples/pulsed-pump-depletion-chalcogenide-rib.json', 'utf8'))
    const res = await page.request.post('/api/runs', { data: { groupId: me.currentGroupId ?? me.memberships[0].groupId, title: 'E2E figures', config } })
    expect(res.status()).toBe(202)
    await page.goto(`/runs/${(await res.json()).id}`)
    await page.locator('[data-testid=run-status]', { hasText: 'Succeeded' }).first().waitFor({ timeout: 120_000 })

    const traceMenu = page.getByRole('button', { name: /^Save Output power and phase .* as a figure$/ })
    await traceMenu.waitFor({ timeout: 30_000 })
    const svg = (await save(page, traceMenu, 'figure-svg-column')).toString('utf8')
    expect(svg).toMatch(/<svg[^>]* width="8\.5cm" height="5\.27cm"/)
    expect(svg).toMatch(/viewBox="0 0 241 149"/)
    // Axes with their units are part of the drawing.
    expect(svg).toContain('t (ns)')
    expect(svg).toContain('Power (')

    const pdf = (await save(page, traceMenu, 'figure-pdf-page')).toString('latin1')
    expect(pdf.startsWith('%PDF-')).toBe(true)
    // 17 cm × 0.62 = 10.54 cm → 482 × 299 pt.
    const box = /\/MediaBox \[([^\]]+)\]/.exec(pdf)?.[1].trim().split(/\s+/).map(Number)
    expect(box, pdf.slice(0, 400)).toBeDefined()
    expect(box![2] - box![0]).toBeCloseTo(482, 0)
    expect(box![3] - box![1]).toBeCloseTo(299, 0)

    const mapMenu = page.getByRole('button', { name: /^Save Pump power map as a figure$/ })
    const map = (await save(page, mapMenu, 'figure-svg-page')).toString('utf8')
    expect(map).toMatch(/<svg[^>]* width="17cm" height="12\.75cm"/)
    expect(map).toMatch(/<image[^>]+data:image\/png;base64,/)
    expect(map).toContain('z (')
    expect(map).toMatch(/<linearGradient/)
    // Kept for review beside the screenshots, and drawn once in the browser to look at.
    writeFileSync(join(ARTIFACTS, 'figure-trace-8.5cm.svg'), svg)
    writeFileSync(join(ARTIFACTS, 'figure-map-17cm.svg'), map)
    const view = await ctx.newPage()
    await view.setContent(`<body style="margin:0;background:#fff">${svg}<br>${map}</body>`)
    await screenshot(view, 'figure-export-svg')
  }, 600_000)
})
