// The gain-spectrum scan in a real browser: a CW chip amplifier with a probe launched both ways runs through the
// multi-wave solver and its page shows the table of waves and the isolation; its "Scan gain spectrum" button
// opens the sweep form on the detuning over ±3 linewidths (41 points, with the cost), queues the sweep, and the
// sweep page plots the settled Stokes gain over the closed-form Lorentzian. Screenshots at 1440 and 390 px in
// both themes.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let editor: BrowserContext
const contexts: BrowserContext[] = []

// The validation chip of docs/validation.md (G_B = 300 /(W m), L = 5 cm, Δν_B = 34 MHz), lossless, 50 mW CW pump:
// 120 ns is 26 phonon lifetimes, enough for the Stokes output to settle.
const config = {
  waveguide: { name: 'Validation chip', lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 6.9e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
  channels: [{ label: 'amplifier', pump: { backgroundPowerW: 0.05 }, stokes: { backgroundPowerW: 1e-6 }, coProbe: { backgroundPowerW: 1e-6 } }],
  windowNs: 120,
  grid: { mapRows: 128, mapCols: 128 },
  options: { errorEstimate: false },
}

async function poll<T>(read: () => Promise<T>, done: (v: T) => boolean, what: string, timeoutMs = 240_000): Promise<T> {
  const t0 = Date.now()
  for (;;) {
    const v = await read()
    if (done(v)) return v
    if (Date.now() - t0 > timeoutMs) throw new Error(`gave up waiting for ${what}`)
    await new Promise((r) => setTimeout(r, 1000))
  }
}

async function pageIn(theme: 'light' | 'dark', width: number): Promise<Page> {
  const ctx = await newContext(browser, base, theme, editor)
  contexts.push(ctx)
  const page = await ctx.newPage()
  await page.setViewportSize({ width, height: 900 })
  return page
}

let runId = ''

beforeAll(async () => {
  browser = await launchBrowser()
  editor = await newContext(browser, base)
  contexts.push(editor)
  const page = await editor.newPage()
  await signIn(page, DEMO.editor)
  const me = await (await page.request.get('/api/me')).json()
  const res = await page.request.post('/api/runs', { data: { groupId: me.currentGroupId ?? me.memberships[0].groupId, title: 'E2E chip amplifier, probe both ways', config } })
  expect(res.status()).toBe(202)
  runId = (await res.json()).id
  await poll(async () => (await (await page.request.get(`/api/runs/${runId}`)).json()).status as string, (s) => s !== 'queued' && s !== 'running', 'the run')
})
afterAll(async () => {
  for (const c of contexts) await c.close().catch(() => {})
  await browser?.close()
})

describe('gain-spectrum scan and per-wave figures', () => {
  it('shows the waves of a multi-wave run: directions in words, the probe without gain, the isolation', { timeout: 180_000 }, async () => {
    for (const [theme, width] of [['light', 1440], ['dark', 1440], ['light', 390], ['dark', 390]] as const) {
      const page = await pageIn(theme, width)
      await page.goto(`/runs/${runId}`)
      const table = page.getByRole('table', { name: 'Energies and gain of each optical wave' })
      await table.waitFor({ timeout: 30_000 })
      const probe = table.locator('tbody tr', { hasText: 'Co-propagating probe' })
      await expect.poll(() => probe.textContent()).toContain('→ +zwith the pump')
      expect(await table.locator('tbody tr', { hasText: /^\s*Stokes/ }).first().textContent()).toContain('← −zagainst the pump')
      // Settled, the probe against the pump gains e^{0.75} (Agrawal ch. 9: exp(G_B P L_eff)) and the one with it
      // nothing: 3.257 dB. The figure compares energies over the whole run, start-up included, so it stays below.
      const iso = await page.getByTestId('wave-isolation').textContent()
      const db = Number(/\+(\d+\.\d+) dB/.exec(iso ?? '')?.[1])
      expect(db).toBeGreaterThan(2.5)
      expect(db).toBeLessThan(3.26)
      await page.getByRole('img', { name: /Output power and phase/ }).waitFor()
      await page.waitForTimeout(400)
      await screenshot(page, `gain-scan-run-${theme}-${width}`)
    }
  })

  it('builds a 41-point detuning sweep from the run page, queues it and plots the gain over the closed form', { timeout: 420_000 }, async () => {
    const page = await pageIn('light', 1440)
    const errors: string[] = []
    page.on('pageerror', (e) => errors.push(e.message))
    await page.goto(`/runs/${runId}`)
    await page.getByRole('link', { name: 'Scan gain spectrum' }).click()
    await page.waitForURL(/\/sweeps\/new\?.*scan=gain/)
    const plan = page.getByTestId('gain-scan-plan')
    await expect.poll(() => plan.textContent()).toContain('Detuning from -102 to 102 MHz in 41 points, 5.1 MHz apart')
    expect(await plan.textContent()).toContain('last 12 ns of each run')
    // The tail windows follow a window edited on the sweep form.
    await page.getByLabel('Window (ns)').fill('150')
    await expect.poll(() => plan.textContent()).toContain('last 15 ns of each run')
    expect(await page.getByTestId('gain-scan-settle').count()).toBe(0)
    await expect.poll(() => page.locator('.new-sweep-page__facts').textContent()).toMatch(/Points \(runs\)\s*41/)
    await screenshot(page, 'gain-scan-new-sweep-light-1440')
    expect(errors).toEqual([])
    const narrow = await pageIn('dark', 390)
    await narrow.goto(`/sweeps/new?fromRun=${runId}&scan=gain`)
    await narrow.getByTestId('gain-scan-plan').waitFor()
    await screenshot(narrow, 'gain-scan-new-sweep-dark-390')

    await page.getByRole('button', { name: 'Queue 41 runs' }).click()
    await page.waitForURL(/\/sweeps\/[0-9a-f-]{36}$/, { timeout: 30_000 })
    const sweepId = new URL(page.url()).pathname.split('/').pop()!
    const done = await poll(async () => (await (await page.request.get(`/api/sweeps/${sweepId}`)).json()), (s) => s.status !== 'running', 'the sweep', 360_000)
    expect(done.counts.succeeded).toBe(41)
    expect(done.baseConfig.energyWindows.map((w: { port: string; startNs: number; endNs: number }) => [w.port, w.startNs, w.endNs])).toEqual([['stokesIn', 135, 150], ['stokesOut', 135, 150]])
    // Every point's settled gain on the Lorentzian: 10·log10(e)·0.75·(17²/(δ² + 17²)) dB (Agrawal ch. 9); 0.5 % or 1e-3 dB.
    for (const p of done.points) {
      const closed = (10 / Math.LN10) * 0.75 * (17 ** 2 / (p.values[0] ** 2 + 17 ** 2))
      expect(Math.abs(p.metrics.settledStokesGainDb - closed)).toBeLessThan(Math.max(5e-3 * closed, 1e-3))
    }

    for (const [theme, width] of [['light', 1440], ['dark', 1440], ['light', 390], ['dark', 390]] as const) {
      const view = await pageIn(theme, width)
      await view.goto(`/sweeps/${sweepId}`)
      await expect.poll(() => view.getByTestId('gain-scan-note').textContent(), { timeout: 30_000 }).toContain('closed-form small-signal gain')
      await view.getByRole('img', { name: 'Figures of merit against the sweep axis' }).waitFor()
      await view.waitForTimeout(500)
      await screenshot(view, `gain-scan-sweep-${theme}-${width}`)
    }
  })
})
