// The one-click sensing scan in a real browser: a run of a 10 ns Gaussian pump and a CW probe on a 12 m fibre with a
// section 35 K warmer (+35 MHz at about 1 MHz/K, common practice) and a 5 MHz shift step. Its "Scan gain spectrum"
// button opens the sweep form on a detuning range widened over the hot spot's shift and offers the rectangular pulse
// of time-domain analysers; taking it and queueing the scan, the sweep page shows the measured resolution beside
// v_g·τ/2 and says why they differ. Screenshots at 1440 and 390 px.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let context: BrowserContext
let page: Page
let runId = ''

const VG_M_PER_NS = 0.299792458 / 1.468
const TAU_NS = 10
const DZ = (VG_M_PER_NS * TAU_NS) / 2
const LENGTH_M = 12 * DZ
const TRANSIT_NS = LENGTH_M / VG_M_PER_NS
const CENTRE_NS = TRANSIT_NS + 4 * TAU_NS
const config = {
  waveguide: {
    name: 'E2E short sensing fibre',
    lengthM: LENGTH_M,
    groupIndex: 1.468,
    effectiveAreaUm2: 80,
    gainCoefficientMPerW: 5e-11,
    brillouinShiftGHz: 10.8,
    linewidthMHz: 30,
    profile: { segments: [{ startM: 1.5 * DZ, endM: 3 * DZ, temperatureOffsetK: 35 }, { startM: 6 * DZ, endM: LENGTH_M, shiftOffsetMHz: 5 }] },
  },
  channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.2 / DZ, centreNs: CENTRE_NS, fwhmNs: TAU_NS, label: 'pump' }] }, stokes: { backgroundPowerW: 1e-4 } }],
  windowNs: CENTRE_NS + 2 * TRANSIT_NS + 4 * TAU_NS,
  grid: { mapRows: 64, mapCols: 64 },
  options: { errorEstimate: false },
}

async function poll<T>(read: () => Promise<T>, done: (v: T) => boolean, what: string, timeoutMs = 300_000): Promise<T> {
  const t0 = Date.now()
  for (;;) {
    const v = await read()
    if (done(v)) return v
    if (Date.now() - t0 > timeoutMs) throw new Error(`gave up waiting for ${what}`)
    await new Promise((r) => setTimeout(r, 1000))
  }
}

beforeAll(async () => {
  browser = await launchBrowser()
  context = await newContext(browser, base)
  page = await context.newPage()
  await signIn(page, DEMO.editor)
  const me = await (await page.request.get('/api/me')).json()
  const res = await page.request.post('/api/runs', { data: { groupId: me.currentGroupId ?? me.memberships[0].groupId, title: 'E2E short sensing fibre', config } })
  expect(res.status()).toBe(202)
  runId = (await res.json()).id
  await poll(async () => (await (await page.request.get(`/api/runs/${runId}`)).json()).status as string, (s) => s !== 'queued' && s !== 'running', 'the run')
}, 360_000)

afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('one-click sensing scan', () => {
  it('widens the range over the hot spot, offers a rectangular pump, and shows measured against nominal resolution', { timeout: 480_000 }, async () => {
    const errors: string[] = []
    page.on('pageerror', (e) => errors.push(e.message))
    await page.setViewportSize({ width: 1440, height: 1000 })
    await page.goto(`/runs/${runId}`)
    await page.getByRole('link', { name: 'Scan gain spectrum' }).click()
    await page.waitForURL(/\/sweeps\/new\?.*scan=gain/)
    const plan = page.getByTestId('gain-scan-plan')
    await expect.poll(() => plan.textContent()).toContain('Detuning from -90 to 125 MHz in 41 points')
    expect(await plan.textContent()).toContain("widened to the profile's local shift changes (0 to 35 MHz) ± 3 linewidths")
    const offer = page.getByTestId('gain-scan-pulse-offer')
    expect(await offer.textContent()).toContain('Use one of τ = 10.64 ns')
    await screenshot(page, 'sensing-scan-setup-1440')
    await page.setViewportSize({ width: 390, height: 1400 })
    await plan.scrollIntoViewIfNeeded()
    await screenshot(page, 'sensing-scan-setup-390')
    await page.setViewportSize({ width: 1440, height: 1000 })
    await page.getByTestId('use-rectangular-pulse').click()
    await expect.poll(() => offer.count()).toBe(0)

    await page.getByRole('button', { name: 'Queue 41 runs' }).click()
    await page.waitForURL(/\/sweeps\/[0-9a-f-]{36}$/, { timeout: 30_000 })
    const sweepId = new URL(page.url()).pathname.split('/').pop()!
    const done = await poll(async () => (await (await page.request.get(`/api/sweeps/${sweepId}`)).json()), (s) => s.status !== 'running' && s.status !== 'queued', 'the sweep', 400_000)
    expect(done.counts.succeeded).toBe(41)
    expect(done.baseConfig.channels[0].pump.pulses[0]).toMatchObject({ shape: 'rectangular', fwhmNs: 10.64, riseNs: 2.13 })

    await page.goto(`/sweeps/${sweepId}`)
    const view = page.getByTestId('sensing-map')
    const note = view.getByTestId('sensing-resolution-note')
    // Without detector noise the 10–90 % crossings of a 5 MHz step are the pulse's, not the noise's.
    await view.getByLabel('Detector noise (% of probe power)').fill('0')
    // A 10 ns rectangular pulse resolves about 0.6 of v_g·τ/2 (docs/analysis.md, sensing map): said beside both.
    await expect.poll(() => note.count(), { timeout: 60_000 }).toBe(1)
    await expect.poll(() => note.textContent(), { timeout: 30_000 }).toMatch(/Measured 0\.[5-7]\d? × nominal, sharper than nominal/)
    expect(await view.textContent()).not.toContain('Outside the scanned range')
    await note.scrollIntoViewIfNeeded()
    await screenshot(page, 'sensing-scan-resolution-1440')
    await page.setViewportSize({ width: 390, height: 1400 })
    await note.scrollIntoViewIfNeeded()
    await screenshot(page, 'sensing-scan-resolution-390')
    expect(errors).toEqual([])
  })
})
