// The workbench in a real browser: an editor saves a waveguide to the group, queues a short store-and-retrieve run, sees
// the maps and traces of the finished run and downloads its ZIP; a viewer can neither queue nor cancel; an
// invalid field blocks submit with its message; a long run fills its maps live and an editor cancels it.
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page, Route } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'
import { readEntry, zipEntries } from './zip-entries'

const base = inject('e2eBaseUrl')
let browser: Browser
const contexts: BrowserContext[] = []

let editorContext: BrowserContext | null = null

/** A page signed in as `who`; the editor signs in once and later pages reuse that session. */
async function pageAs(who: { email: string; password: string }, theme: 'light' | 'dark' = 'light'): Promise<Page> {
  const reuse = who === DEMO.editor && editorContext ? editorContext : undefined
  const ctx = await newContext(browser, base, theme, reuse)
  contexts.push(ctx)
  const page = await ctx.newPage()
  if (!reuse) await signIn(page, who)
  if (who === DEMO.editor && !editorContext) editorContext = ctx
  return page
}

/** The status chip's words (src/components/run/run-format.ts). */
const STATUS_LABELS: Record<string, string> = { queued: 'Queued', running: 'Running', succeeded: 'Succeeded', failed: 'Failed', cancelled: 'Cancelled' }
const statusIs = (page: Page, label: string, timeout = 60_000) => page.locator('[data-testid=run-status]', { hasText: label }).first().waitFor({ timeout })

/** data-rows-filled / data-rows of the three maps on a run page. */
const mapFill = (page: Page) =>
  page.$$eval('section.space-time-map', (els) => els.map((e) => ({ filled: Number(e.getAttribute('data-rows-filled')), rows: Number(e.getAttribute('data-rows')) })))

beforeAll(async () => {
  browser = await launchBrowser()
})
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {})
  await browser?.close()
})

describe('workbench', () => {
  it('an editor saves a waveguide to the group, queues a store-and-retrieve run, sees it succeed and downloads a complete ZIP', async () => {
    const page = await pageAs(DEMO.editor)

    // Adapt a built-in platform, save it to the group's library, and hand it to the form.
    await page.goto('/waveguides')
    await page.locator('.v-card', { hasText: 'Built-in platforms' }).locator('.v-list-item', { hasText: /rib/i }).first().click()
    await page.getByLabel('Name', { exact: true }).fill('Halden R7 rib, e2e copy')
    await page.getByRole('button', { name: 'Save as group waveguide' }).click()
    await page.locator('.v-card', { hasText: 'Group waveguides' }).locator('.v-list-item', { hasText: 'Halden R7 rib, e2e copy' }).waitFor()
    await page.getByRole('button', { name: 'Use in a new simulation' }).click()
    await page.waitForURL(/\/simulations\/new/)
    await page.getByLabel('Run title').fill('E2E store and retrieve')
    await screenshot(page, 'new-simulation')
    await page.getByRole('button', { name: 'Queue run' }).click()
    await page.waitForURL(/\/runs\/[0-9a-f-]{36}/, { timeout: 20_000 })

    const firstId = new URL(page.url()).pathname.split('/').pop()!
    await statusIs(page, 'Succeeded')
    expect(await page.locator('h1').textContent()).toBe('E2E store and retrieve')
    expect(await page.locator('.run-page__meta').textContent()).toContain('Halden R7 rib, e2e copy')
    // Every map drawn to its last row from the final arrays.
    // Polled from the test, not with waitForFunction: that evals in the page, which the app's CSP forbids.
    await expect.poll(() => page.$$eval('section.space-time-map', (els) => els.every((e) => Number(e.getAttribute('data-rows-filled')) > 0)), { timeout: 30_000 }).toBe(true)
    const fill = await mapFill(page)
    expect(fill).toHaveLength(3)
    for (const m of fill) expect(m.filled).toBe(m.rows)

    // The readout names the value under the pointer, with its unit.
    const chart = page.locator('section.space-time-map .space-time-map__chart').first()
    const box = (await chart.boundingBox())!
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height * 0.3)
    expect(await page.locator('[data-testid=map-readout]').first().textContent()).toMatch(/z [\d.]+ mm · t [\d.]+ ns · [-\d.e]+ \S*W/)

    await page.getByRole('heading', { name: 'Figures of merit' }).waitFor()
    await page.getByRole('img', { name: /Output power and phase/ }).waitFor()
    await page.waitForTimeout(300) // let the line charts paint before the picture
    await screenshot(page, 'run-finished')

    // Clone → queue an identical run: a second finished run for the comparison below. The page is reused for the
    // clone, and must show the clone's own status from its first paint, never the original's "Succeeded" (which
    // offered a download of a run still queued). The clone's live stream is held back a few seconds so that only
    // its record can speak when its title first shows.
    const holdCloneStream = async (route: Route) => {
      if (!route.request().url().includes(firstId)) await new Promise((r) => setTimeout(r, 4_000))
      // The browser may have dropped the request meanwhile (the page moved on); then there is nothing to pass on.
      await route.continue().catch(() => {})
    }
    await page.route(/\/api\/runs\/[0-9a-f-]{36}\/events/, holdCloneStream)
    const cloneRecord = page.waitForResponse((res) => /^\/api\/runs\/[0-9a-f-]{36}$/.test(new URL(res.url()).pathname) && !res.url().includes(firstId))
    cloneRecord.catch(() => {}) // awaited below; a failure before then is reported by the step that failed
    // On a busy machine a click can land while the Clone menu is still opening and pick nothing: open and pick again
    // until the clone's page is reached.
    const onClone = (u: URL) => /\/runs\/[0-9a-f-]{36}/.test(u.pathname) && !u.pathname.endsWith(firstId)
    const queueIdentical = page.getByText('Queue an identical run')
    for (let i = 0; i < 5 && !onClone(new URL(page.url())); i++) {
      if (!(await queueIdentical.isVisible())) await page.getByRole('button', { name: 'Clone' }).click({ timeout: 10_000 }).catch(() => {})
      await queueIdentical.click({ timeout: 10_000 }).catch(() => {})
      await page.waitForURL(onClone, { timeout: 15_000 }).catch(() => {})
    }
    await page.waitForURL(onClone)
    await page.locator('h1', { hasText: 'E2E store and retrieve (copy)' }).waitFor()
    const statusAtFirstPaint = (await page.locator('[data-testid=run-status]').first().textContent())?.trim()
    const recordStatus = ((await (await cloneRecord).json()) as { status: string }).status
    expect(statusAtFirstPaint).toBe(STATUS_LABELS[recordStatus])
    await page.unroute(/\/api\/runs\/[0-9a-f-]{36}\/events/, holdCloneStream)
    await statusIs(page, 'Succeeded')

    // The link the user clicks, fetched with the page's own session: Chromium's download manager now and then
    // cancels a headless download it has started, which says nothing about our bytes.
    const link = page.getByRole('link', { name: 'Download ZIP' })
    expect(await link.getAttribute('download')).not.toBeNull()
    const res = await page.request.get(new URL((await link.getAttribute('href'))!, page.url()).toString())
    expect(res.status()).toBe(200)
    expect(res.headers()['content-disposition']).toMatch(/^attachment; filename=".+\.zip"$/)
    const zip = await res.body()
    const entries = zipEntries(zip)
    const names = entries.map((e) => e.name)
    const manifest = JSON.parse(readEntry(zip, entries.find((e) => e.name === 'manifest.json')!).toString('utf8'))
    expect(manifest.arrays.length).toBeGreaterThan(5)
    for (const a of manifest.arrays) expect(names).toContain(a.file)
    expect(names).toEqual(expect.arrayContaining(['README.txt', 'ch1_traces.csv']))
    const npy = readEntry(zip, entries.find((e) => e.name === manifest.arrays[0].file)!)
    expect(npy.subarray(0, 6).toString('latin1')).toBe('\x93NUMPY') // NPY format magic (numpy NEP 1)
  })

  it('an invalid field shows its message next to it and blocks submit', async () => {
    const page = await pageAs(DEMO.editor)
    await page.goto('/simulations/new')
    const peak = page.getByLabel('Peak power').first()
    await peak.fill('-1')
    await peak.blur()
    const row = page.locator('li.simulation-pulse-row').first()
    const fieldMessage = (await row.locator('.v-messages__message').first().textContent())?.trim()
    expect(fieldMessage).toBeTruthy()
    await page.getByText(/fields? needs? attention/).waitFor()
    expect(await page.getByRole('button', { name: 'Queue run' }).isDisabled()).toBe(true)
  })

  it('a long run fills its maps live; a viewer sees no queue or cancel controls; the editor cancels it', async () => {
    const editor = await pageAs(DEMO.editor)
    const me = await (await editor.request.get('/api/me')).json()
    const cw = JSON.parse(readFileSync('solver/examples/cw-amplifier-silica-fibre.json', 'utf8'))
    // About 1e9 cell updates: a minute of solver time, so it is still running while we look.
    const config = { ...cw, waveguide: { ...cw.waveguide, lengthM: 500 }, windowNs: 20_000, grid: { ...cw.grid, mapRows: 128, mapCols: 128 }, energyWindows: [] }
    const res = await editor.request.post('/api/runs', { data: { groupId: me.currentGroupId ?? me.memberships[0].groupId, title: 'E2E long CW run', config } })
    expect(res.status()).toBe(202)
    const runId = (await res.json()).id as string

    await editor.goto(`/runs/${runId}`)
    await statusIs(editor, 'Running')
    await expect.poll(async () => Number(await editor.locator('section.space-time-map').first().getAttribute('data-rows-filled')), { timeout: 60_000 }).toBeGreaterThan(0)
    const live = await mapFill(editor)
    expect(live[0].filled).toBeLessThan(live[0].rows)
    await screenshot(editor, 'run-live')

    const viewer = await pageAs(DEMO.viewer, 'dark')
    await viewer.goto('/simulations/new')
    await viewer.getByText(/is viewer: editors and owners queue runs/).waitFor()
    expect(await viewer.getByRole('button', { name: 'Queue run' }).isDisabled()).toBe(true)
    await viewer.goto(`/runs/${runId}`)
    await statusIs(viewer, 'Running')
    expect(await viewer.getByRole('button', { name: 'Cancel run' }).count()).toBe(0)
    await viewer.getByRole('button', { name: 'Clone' }).click()
    await viewer.getByText('Open a copy in the form').waitFor()
    expect(await viewer.getByText('Queue an identical run').count()).toBe(0)
    await viewer.keyboard.press('Escape')
    await screenshot(viewer, 'run-live-viewer-dark')

    await editor.getByRole('button', { name: 'Cancel run' }).click()
    await editor.getByRole('dialog').getByRole('button', { name: 'Cancel run' }).click()
    await statusIs(editor, 'Cancelled', 20_000)
  })

  it('the runs list filters on the server and compares two runs; the dashboard shows recent runs and the queue', async () => {
    const page = await pageAs(DEMO.editor)
    await page.goto('/runs')
    const table = page.getByRole('table')
    await table.locator('tbody tr', { hasText: 'Succeeded' }).first().waitFor()
    await page.locator('.runs-page__status .v-field').click()
    await page.getByRole('option', { name: 'Succeeded' }).click()
    await page.locator('tbody tr', { hasText: 'Cancelled' }).first().waitFor({ state: 'detached' })
    const rows = table.locator('tbody tr')
    await rows.nth(0).locator('input[type=checkbox]').check()
    await rows.nth(1).locator('input[type=checkbox]').check()
    await screenshot(page, 'runs-list')
    await page.getByRole('button', { name: /Compare 2/ }).click()
    await page.getByRole('img', { name: 'Output power of the compared runs against time' }).waitFor()
    // Only the settings that differ, in words: no configuration path reaches the table.
    const diff = page.getByTestId('compare-diff').or(page.getByTestId('compare-same'))
    await diff.waitFor()
    expect(await diff.innerText()).not.toMatch(/channels\.|\.pulses|centreNs|fwhmNs/)
    await page.waitForTimeout(300)
    await screenshot(page, 'runs-compare')
    await page.keyboard.press('Escape')

    await page.goto('/')
    await page.locator('[aria-label="Recent runs"]').locator('.v-list-item').first().waitFor()
    await page.locator('[aria-label="Examples"]').waitFor()
    expect(Number(await page.getByTestId('queue-running').textContent())).toBeGreaterThanOrEqual(0)
    await screenshot(page, 'dashboard')

    const dark = await pageAs(DEMO.editor, 'dark')
    await dark.goto('/')
    await dark.locator('[aria-label="Recent runs"]').locator('.v-list-item').first().waitFor()
    await screenshot(dark, 'dashboard-dark')
    await dark.locator('[aria-label="Recent runs"]').locator('.v-list-item', { hasText: 'E2E store and retrieve' }).first().click()
    await statusIs(dark, 'Succeeded')
    await dark.getByRole('img', { name: /Output power and phase/ }).waitFor()
    await dark.waitForTimeout(300)
    await screenshot(dark, 'run-finished-dark')
  })
})
