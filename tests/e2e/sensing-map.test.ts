// The sensing view in a real browser: a detuning sweep of a pulsed pump and a CW probe on a 100 m fibre with a
// 15 m section 30 K warmer (≈ 30 MHz at ≈ 1 MHz/K, common practice) runs on the workers; the sweep page then
// shows the gain map, the fitted shift profile and the hot spot, detected. Screenshots at 1440 and 390 px.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let context: BrowserContext
let page: Page
let sweepId = ''

const VG_M_PER_NS = 0.299792458 / 1.468
const DZ = (VG_M_PER_NS * 50) / 2
const LENGTH_M = 20 * DZ
const CENTRE_NS = LENGTH_M / VG_M_PER_NS + 200
const config = {
  waveguide: {
    name: 'E2E sensing fibre',
    lengthM: LENGTH_M,
    groupIndex: 1.468,
    effectiveAreaUm2: 80,
    gainCoefficientMPerW: 5e-11,
    brillouinShiftGHz: 10.8,
    linewidthMHz: 30,
    profile: { segments: [{ startM: 8 * DZ, endM: 11 * DZ, temperatureOffsetK: 30 }] },
  },
  channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.2 / DZ, centreNs: CENTRE_NS, fwhmNs: 50, label: 'pump' }] }, stokes: { backgroundPowerW: 1e-4 } }],
  windowNs: CENTRE_NS + (2 * LENGTH_M) / VG_M_PER_NS + 150,
  grid: { mapRows: 64, mapCols: 64 },
  options: { errorEstimate: false },
}

beforeAll(async () => {
  browser = await launchBrowser()
  context = await newContext(browser, base)
  page = await context.newPage()
  await signIn(page, DEMO.editor)
  const me = await (await page.request.get('/api/me')).json()
  const groupId = me.currentGroupId ?? me.memberships[0].groupId
  const res = await page.request.post('/api/sweeps', {
    data: { groupId, title: 'E2E hot-spot scan', baseConfig: config, axes: [{ field: 'detuningMHz', values: { kind: 'linear', start: -80, stop: 120, count: 21 } }] },
  })
  expect(res.status()).toBe(202)
  sweepId = (await res.json()).id
  const t0 = Date.now()
  while ((await (await page.request.get(`/api/sweeps/${sweepId}`)).json()).status !== 'finished') {
    if (Date.now() - t0 > 300_000) throw new Error('the scan did not finish')
    await new Promise((r) => setTimeout(r, 1000))
  }
}, 360_000)

afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('sensing view of a sweep', () => {
  it('shows the gain map, the shift profile and the detected hot spot', async () => {
    await page.setViewportSize({ width: 1440, height: 1100 })
    await page.goto(`/sweeps/${sweepId}`)
    const view = page.getByTestId('sensing-map')
    await expect.poll(() => view.getByText('Detected (within 3σ)').count(), { timeout: 60_000 }).toBe(1)
    expect(await view.getByText(/Spatial resolution/).count()).toBe(1)
    expect(await view.locator('a[href*="format=csv"]').count()).toBe(1)
    await view.scrollIntoViewIfNeeded()
    await screenshot(page, 'sensing-map-1440')
    await page.setViewportSize({ width: 390, height: 1400 })
    await view.scrollIntoViewIfNeeded()
    await screenshot(page, 'sensing-map-390')
  }, 120_000)
})
