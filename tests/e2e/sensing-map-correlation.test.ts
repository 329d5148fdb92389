// The correlation read-out in a real browser: a run with a CW pump and CW probe sharing one frequency modulation
// (f_m = 8 MHz, Δf = 100 MHz) on a 10 m fibre with a 3 m section 20 K warmer (≈ 20 MHz at ≈ 1 MHz/K, common
// practice). Its run page offers the correlation sensing scan, and the sweep form fills in both axes; a smaller
// scan of the same run (10 detunings × 8 delays) runs on the workers and the sweep page shows its map, the peak
// spacing and the hot spot, detected. Screenshots at 1440 and 390 px.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let context: BrowserContext
let page: Page
let runId = ''
let sweepId = ''

const VG_M_PER_NS = 0.299792458 / 1.468
const modulation = { rateMHz: 8, excursionMHz: 100 }
const config = {
  waveguide: {
    name: 'E2E correlation fibre',
    lengthM: 10,
    groupIndex: 1.468,
    effectiveAreaUm2: 80,
    gainCoefficientMPerW: 5e-11,
    brillouinShiftGHz: 10.8,
    linewidthMHz: 30,
    profile: { segments: [{ startM: 3, endM: 6, temperatureOffsetK: 20 }] },
  },
  channels: [{ pump: { backgroundPowerW: 0.1, modulation }, stokes: { backgroundPowerW: 1e-4, modulation } }],
  windowNs: 320,
  grid: { mapRows: 32, mapCols: 32 },
  options: { errorEstimate: false },
}
/** Delays putting the correlation peak at 1.5, 2.5, …, 8.5 m (the hot spot's centre among them): z = L/2 + v_g t_d/2. */
const DELAYS = Array.from({ length: 8 }, (_, i) => Number(((2 * (1.5 + i - 5)) / VG_M_PER_NS).toFixed(3)))

async function poll<T>(read: () => Promise<T>, done: (v: T) => boolean, what: string, timeoutMs = 300_000): Promise<T> {
  const t0 = Date.now()
  for (;;) {
    const v = await read()
    if (done(v)) return v
    if (Date.now() - t0 > timeoutMs) throw new Error(`${what} did not finish`)
    await new Promise((r) => setTimeout(r, 1000))
  }
}

beforeAll(async () => {
  browser = await launchBrowser()
  context = await newContext(browser, base)
  page = await context.newPage()
  await signIn(page, DEMO.editor)
  const me = await (await page.request.get('/api/me')).json()
  const groupId = me.currentGroupId ?? me.memberships[0].groupId
  const run = await page.request.post('/api/runs', { data: { groupId, title: 'E2E correlation set-up', config } })
  expect(run.status()).toBe(202)
  runId = (await run.json()).id
  const res = await page.request.post('/api/sweeps', {
    data: {
      groupId,
      title: 'E2E correlation scan',
      baseConfig: config,
      axes: [
        { field: 'detuningMHz', values: { kind: 'linear', start: -60, stop: 90, count: 10 } },
        { field: 'modulationDelayNs', values: { kind: 'list', values: DELAYS } },
      ],
    },
  })
  expect(res.status()).toBe(202)
  sweepId = (await res.json()).id
  await poll(async () => (await (await page.request.get(`/api/sweeps/${sweepId}`)).json()).status as string, (s) => s !== 'running', 'the scan')
}, 360_000)

afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('correlation sensing scan', () => {
  it('is offered from the run page and fills in the detuning and the Stokes delay', async () => {
    await page.setViewportSize({ width: 1440, height: 1100 })
    await page.goto(`/runs/${runId}`)
    const link = page.getByRole('link', { name: 'Correlation sensing scan' })
    await link.waitFor({ timeout: 30_000 })
    // A click while the page is still settling can be lost on a busy machine: repeat until the form opens.
    await expect.poll(async () => (page.url().includes('scan=gain') ? true : (await link.click().catch(() => {}), false)), { timeout: 30_000, interval: 1000 }).toBe(true)
    const plan = page.getByTestId('gain-scan-plan')
    await expect.poll(() => plan.textContent(), { timeout: 30_000 }).toContain('16 Stokes delays move the correlation peak from 0 m to 10 m')
    expect(await plan.textContent()).toContain('Correlation sensing scan')
    expect(await plan.textContent()).toMatch(/in 16 points/)
    await expect.poll(() => page.locator('.new-sweep-page__facts').textContent()).toMatch(/Points \(runs\)\s*256/)
    await screenshot(page, 'correlation-scan-form-1440')
  }, 90_000)

  it('shows the correlation map, the peak spacing and the detected hot spot, and the figures of merit over both axes', async () => {
    const errors: string[] = []
    page.on('pageerror', (e) => errors.push(e.message))
    await page.setViewportSize({ width: 1440, height: 1100 })
    await page.goto(`/sweeps/${sweepId}`)
    const view = page.getByTestId('sensing-map')
    await expect.poll(() => view.getByText('Detected (within 3σ)').count(), { timeout: 60_000 }).toBe(1)
    const text = (await view.textContent()) ?? ''
    expect(text).toContain('Sensing map (correlation read-out)')
    expect(text).toContain('Peak spacing (unambiguous range)')
    // d_m = v_g/(2 f_m) = 12.8 m (Hotate & Hasegawa 2000), longer than the fibre: no warning of further peaks.
    expect(text).toContain('12.8 m')
    expect(await view.getByTestId('correlation-several-peaks').count()).toBe(0)
    expect(await view.locator('a[href*="format=csv"]').count()).toBe(1)
    await page.getByRole('img', { name: 'Heatmap of a figure of merit over both axes' }).waitFor({ timeout: 30_000 })
    expect(errors).toEqual([])
    await view.scrollIntoViewIfNeeded()
    await page.waitForTimeout(500)
    await screenshot(page, 'correlation-map-1440')
    await page.setViewportSize({ width: 390, height: 1600 })
    await view.scrollIntoViewIfNeeded()
    await page.waitForTimeout(500)
    await screenshot(page, 'correlation-map-390')
  }, 120_000)
})
