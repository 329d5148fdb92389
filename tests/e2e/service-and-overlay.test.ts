// In a real browser: the admin's service page (tiles, the hour's chart, one card per worker) at a laptop and a
// phone width in both themes; and a measured trace laid over a finished run, aligned by least squares through a
// first-order detector, with the fitted offset stated over the chart.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { firstOrderResponse, firstOrderTauNs } from '@shared/analysis/detector-response'
import { hashPassword } from '../../server/modules/auth/passwords'
import { ARTIFACTS, DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
const dbUrl = inject('e2eDatabaseUrl')
let browser: Browser
const contexts: BrowserContext[] = []
const pool = new pg.Pool({ connectionString: dbUrl, max: 2 })
const ADMIN = { email: 'service.admin@halden-lab.example', password: 'service-admin-passphrase' }

async function freshPage(theme: 'light' | 'dark', width = 1440): Promise<Page> {
  const ctx = await newContext(browser, base, theme)
  contexts.push(ctx)
  const page = await ctx.newPage()
  await page.setViewportSize({ width, height: width < 600 ? 844 : 900 })
  return page
}

/** Nothing sticks out past the right edge of the viewport. */
async function overflowPx(page: Page): Promise<number> {
  // The test side has no DOM types: the page's root is described by the two widths read.
  return page.locator('html').evaluate((node) => {
    const root = node as unknown as { scrollWidth: number; clientWidth: number }
    return root.scrollWidth - root.clientWidth
  })
}

beforeAll(async () => {
  browser = await launchBrowser()
  await pool.query(
    `insert into users (email, name, password_hash, email_confirmed_at, is_admin) values ($1, 'Service Admin', $2, now(), true) on conflict do nothing`,
    [ADMIN.email, await hashPassword(ADMIN.password)],
  )
})
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {})
  await browser?.close()
  await pool.end()
})

describe('admin service page', () => {
  for (const theme of ['light', 'dark'] as const) {
    for (const width of [1440, 390]) {
      it(`shows the tiles, the last hour and a card for the embedded worker (${theme}, ${width} px)`, async () => {
        const page = await freshPage(theme, width)
        await signIn(page, ADMIN)
        await page.goto('/admin')

        const card = page.locator('ul[aria-label="Worker processes"] > li').first()
        await card.waitFor({ timeout: 20_000 })
        // The e2e server runs one embedded worker with one solver thread.
        expect(await card.getByTestId('worker-busy').innerText()).toMatch(/^[01] of 1 thread$/)
        expect(await page.getByTestId('admin-chart-summary').innerText()).toMatch(/^Since .*: up to \d+ runs? waiting, up to \d+ of \d+ solver threads busy/)
        expect(await page.locator('.admin-queue-chart canvas').count()).toBeGreaterThan(0)
        expect(await overflowPx(page)).toBeLessThanOrEqual(0)
        await screenshot(page, `admin-service-${theme}-${width}`)
      })
    }
  }
})

/** Chooses the uploaded trace on the run page, a 1 GHz first-order detector and least squares; returns the stated offset (ns). */
async function alignWithDetector(page: Page, runId: string): Promise<number> {
  await page.goto(`/runs/${runId}`)
  const panel = page.locator('.v-card', { hasText: 'Measured traces' }).first()
  await panel.scrollIntoViewIfNeeded()
  const traceSelect = panel.locator('.v-select', { hasText: 'Traces' }).first()
  const traceOption = page.getByRole('option', { name: 'Scope, pump out' })
  const matched = panel.locator('.overlay-note', { hasText: 'peaks matched' })
  // On a busy machine the option's click can land while the menu is still opening and select nothing:
  // the choice is repeated until the overlay's note shows.
  for (let i = 0; i < 6 && !(await matched.isVisible()); i++) {
    if (!(await traceOption.isVisible())) await traceSelect.click({ timeout: 10_000 }).catch(() => {})
    await traceOption.waitFor({ timeout: 10_000 }).catch(() => {})
    const picked = await traceOption.getAttribute('aria-selected', { timeout: 5_000 }).catch(() => null)
    if (picked !== 'true') await traceOption.click({ timeout: 10_000 }).catch(() => {})
    await page.keyboard.press('Escape')
    // The multiple select's menu stays open until Escape; the next menu opens only once it has gone.
    await traceOption.waitFor({ state: 'hidden', timeout: 10_000 }).catch(() => {})
    await matched.waitFor({ timeout: 10_000 }).catch(() => {})
  }
  await matched.waitFor()
  const detector = panel.locator('.v-select', { hasText: 'Detector response' })
  // Mid-screen, so its menu does not open under the fixed app bar.
  await detector.evaluate((node) => (node as unknown as { scrollIntoView(o: { block: string }): void }).scrollIntoView({ block: 'center' }))
  const option = page.getByRole('option', { name: 'First-order (RC)' })
  const chosen = detector.filter({ hasText: 'First-order' })
  // On a busy machine a click can land while the menu is still opening: repeated until the choice shows.
  for (let i = 0; i < 6 && (await chosen.count()) === 0; i++) {
    if (!(await option.isVisible())) await detector.click({ timeout: 10_000 }).catch(() => {})
    await option.waitFor({ timeout: 10_000 }).catch(() => {})
    if (await option.isVisible()) await option.click({ timeout: 10_000 }).catch(() => {})
    await chosen.waitFor({ timeout: 10_000 }).catch(() => {})
  }
  await chosen.waitFor()
  await panel.getByRole('button', { name: 'least squares' }).click()
  const note = panel.locator('.overlay-note', { hasText: 'least squares' })
  await note.locator('text=first-order detector, 1 GHz').waitFor()
  return Number(/Model shifted by \+([\d.]+)/.exec(await note.innerText())![1])
}

describe('measured-trace overlay', () => {
  it('aligns a trace by least squares through a 1 GHz first-order detector and states the offset', async () => {
    const editor = await freshPage('light')
    await signIn(editor, DEMO.editor)
    const me = await (await editor.request.get('/api/me')).json()
    const groupId = me.currentGroupId ?? me.memberships[0].groupId
    const config = JSON.parse(readFileSync('solver/examples/store-and-retrieve-chalcogenide-rib.json', 'utf8'))
    const res = await editor.request.post('/api/runs', { data: { groupId, title: 'E2E overlay with a detector', config } })
    expect(res.status()).toBe(202)
    const runId = (await res.json()).id
    for (let i = 0; i < 240; i++) {
      const st = (await (await editor.request.get(`/api/runs/${runId}`)).json()).status
      if (st === 'succeeded') break
      expect(st).not.toMatch(/failed|cancelled/)
      await editor.waitForTimeout(500)
    }

    // The "measurement": 0.8 × the pump output as a 1 GHz single-pole detector records it, 1.2 ns later.
    const t = (await (await editor.request.get(`/api/runs/${runId}/arrays/time_ns?format=json`)).json()).data as number[]
    const a = (await (await editor.request.get(`/api/runs/${runId}/arrays/ch1_pump_out?format=json`)).json()) as { re: number[]; im: number[] }
    const p = Float64Array.from(a.re, (re, i) => re * re + a.im[i] * a.im[i])
    const det = firstOrderResponse({ timeNs: Float64Array.from(t), values: p }, firstOrderTauNs(1))
    const rows = ['Time (ns),P (W)']
    for (let i = 0; i < t.length; i += Math.max(1, Math.floor(t.length / 800))) rows.push(`${(t[i] + 1.2).toFixed(5)},${(0.8 * det[i]).toExponential(6)}`)
    const upload = await editor.request.post('/api/traces', {
      multipart: {
        file: { name: 'scope pump out.csv', mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n')) },
        settings: JSON.stringify({ groupId, name: 'Scope, pump out', timeColumn: 0, timeUnit: 'ns', signalColumns: [1], signalUnit: 'W' }),
      },
    })
    expect(upload.status()).toBe(201)

    for (const [theme, width] of [['light', 1440], ['dark', 1440], ['light', 390], ['dark', 390]] as const) {
      const page = width === 1440 && theme === 'light' ? editor : await freshPage(theme, width)
      if (page !== editor) await signIn(page, DEMO.editor)
      const shift = await alignWithDetector(page, runId).catch(async (e) => {
        await screenshot(page, `trace-overlay-failed-${theme}-${width}`)
        throw e
      })
      expect(Math.abs(shift - 1.2)).toBeLessThan(0.02)
      // The overlay card (its controls and chart) keeps inside the viewport.
      const card = page.locator('.v-card', { hasText: 'Measured traces' }).first()
      const box = (await card.boundingBox())!
      expect(box.x + box.width).toBeLessThanOrEqual(width + 0.5)
      await card.screenshot({ path: join(ARTIFACTS, `trace-overlay-detector-${theme}-${width}.png`) })
    }
  })
})

describe('words a user reads', () => {
  for (const theme of ['light', 'dark'] as const) {
    for (const width of [1440, 390]) {
      it(`names a pulse field for screen readers and says what is wrong with its unit; presets say their values are typical (${theme}, ${width} px)`, async () => {
        const page = await freshPage(theme, width)
        await signIn(page, DEMO.editor)
        await page.goto('/simulations/new')
        const power = page.getByRole('textbox', { name: 'Pump pulse 1 peak power, W', exact: true }).first()
        await power.fill('-1')
        await power.blur()
        const row = power.locator('xpath=ancestor::li[1]')
        await row.locator('.v-messages__message', { hasText: 'must be at least 0 W' }).waitFor()
        await page.getByText(/[Pp]ump pulse 1, peak power: must be at least 0 W/).first().waitFor()
        expect(await page.locator('main').innerText()).not.toMatch(/Too small|expected number|Invalid input|channels\.\d/)
        await row.scrollIntoViewIfNeeded()
        await screenshot(page, `words-pulse-field-${theme}-${width}`)

        await page.goto('/waveguides')
        const source = page.locator('.waveguides-page__source')
        await source.getByText(/typical values; check against the paper/i).waitFor()
        expect(await source.innerText()).not.toMatch(/from memory|validation case|docs\//)
        await screenshot(page, `words-waveguide-source-${theme}-${width}`)
      })
    }
  }
})
