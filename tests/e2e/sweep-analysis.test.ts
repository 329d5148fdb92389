// Sweep analysis in a real browser: a storage-time sweep of a lossless rib shows an exp(−Γτ) lifetime fit
// whose energy lifetime matches the waveguide's 1/Γ_B, a CW pump-power sweep shows its small-signal gain
// slope beside the closed form, and the log-axis switches redraw the chart's scale; the runs list shows each
// sweep as one row that unfolds to its points.
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let context: BrowserContext
let page: Page
const ids = { storage: '', gain: '' }

const example = (name: string) => JSON.parse(readFileSync(`solver/examples/${name}.json`, 'utf8'))

/** Text of the chart drawn with the SVG renderer (the image-format switch set to SVG). */
async function chartTexts(p: Page): Promise<string[]> {
  return p.locator('.sweep-chart__plot svg text').allTextContents()
}

/** Tick labels of the chart that are numbers strictly between 0 and 1. */
async function fractionTicks(p: Page): Promise<number[]> {
  return (await chartTexts(p)).map(Number).filter((v) => Number.isFinite(v) && v > 0 && v < 1)
}
const isDecade = (v: number) => Math.abs(Math.log10(v) - Math.round(Math.log10(v))) < 1e-9

beforeAll(async () => {
  browser = await launchBrowser()
  context = await newContext(browser, base)
  page = await context.newPage()
  await signIn(page, DEMO.editor)
  const me = await (await page.request.get('/api/me')).json()
  const groupId = me.currentGroupId ?? me.memberships[0].groupId

  // Lossless, so nothing but the phonon decay depends on the delay. The write–read delay axis moves the read
  // pulse; a second, one-value axis ties the data and write widths together; the 6 ns base window is too short for
  // the longer delays' echoes, so those points get a longer window.
  const storage = example('store-and-retrieve-chalcogenide-rib')
  storage.waveguide.lossDbPerM = 0
  Object.assign(storage, { windowNs: 6, energyWindows: [] })
  const s1 = await page.request.post('/api/sweeps', {
    data: {
      groupId,
      title: 'E2E storage time',
      baseConfig: storage,
      axes: [
        { field: 'storageDelayNs', values: { kind: 'linear', start: 1, stop: 5, count: 5 } },
        { field: 'pulseFwhmNs', pulseLabel: 'data', tiedLabels: ['write'], values: { kind: 'list', values: [0.15] } },
      ],
    },
  })
  expect(s1.status()).toBe(202)
  ids.storage = (await s1.json()).id

  const amp = example('cw-amplifier-silica-fibre')
  const s2 = await page.request.post('/api/sweeps', {
    data: { groupId, title: 'E2E pump power', baseConfig: amp, axes: [{ field: 'pumpPowerW', values: { kind: 'list', values: [0.02, 0.04, 0.06, 0.08, 0.1, 0.3, 0.5] } }] },
  })
  expect(s2.status()).toBe(202)
  ids.gain = (await s2.json()).id

  // Polled here (expect.poll works only inside a test); generous, the machine may be busy.
  for (const id of Object.values(ids)) {
    const t0 = Date.now()
    while ((await (await page.request.get(`/api/sweeps/${id}`)).json()).status !== 'finished') {
      if (Date.now() - t0 > 240_000) throw new Error(`sweep ${id} did not finish`)
      await new Promise((r) => setTimeout(r, 1000))
    }
  }
})
afterAll(async () => {
  await context?.close()
  await browser?.close()
})

describe('sweep analysis', () => {
  it('fits the storage lifetime of a lossless rib to within 2 % of its 1/Γ_B and switches the y-axis to log', async () => {
    await page.goto(`/sweeps/${ids.storage}`)
    const fit = page.getByTestId('lifetime-fit')
    await fit.getByText('Energy lifetime 1/Γ =').waitFor()
    const text = await fit.innerText()
    const lifetimeNs = Number(/Energy lifetime 1\/Γ = ([\d.]+) ± [\d.]+ ns/.exec(text)?.[1])
    // Γ_B = 2π·Δν_B with Δν_B = 34 MHz: energy lifetime 1/Γ_B = 4.681 ns (docs/model.md, conventions).
    const nominalNs = 1 / (2 * Math.PI * 34e6) / 1e-9
    expect(Math.abs(lifetimeNs - nominalNs) / nominalNs).toBeLessThan(0.02)
    expect(text).toContain('amplitude lifetime 2/Γ')
    expect(text).toContain('1/Γ_B = 4.681 ns')

    await page.getByRole('button', { name: 'SVG' }).click()
    await expect.poll(() => chartTexts(page)).toContain('Fit η₀·exp(−Γτ)')
    // The efficiency ticks (numbers between 0 and 1; the delay ticks are 2 … 6 ns): evenly spaced on a linear
    // axis, so not all powers of ten; on a log axis only decades.
    expect((await fractionTicks(page)).every(isDecade)).toBe(false)
    await page.getByLabel('Log y-axis').check()
    await expect.poll(async () => (await fractionTicks(page)).every(isDecade)).toBe(true)
    expect((await fractionTicks(page)).length).toBeGreaterThan(0)
    expect(await chartTexts(page)).toContain('Fit η₀·exp(−Γτ)')
    await screenshot(page, 'sweep-lifetime-fit-log-y')

    // The points table numbers from 1, like the run titles, the run page and the mail.
    const rows = page.locator('.sweep-points tbody tr')
    expect(await rows.first().locator('td').first().innerText()).toBe('1')
    expect(await rows.last().locator('td').first().innerText()).toBe('5')
    // The tied widths are one value for the whole sweep, said above the chart; the longest delays ran in a
    // lengthened window (the 6 ns base window ends before their echoes).
    expect(await page.getByTestId('sweep-constant-axis').innerText()).toBe('The same for every point: Pulse width [data = write] (ns) = 0.15')
    const detail = await (await page.request.get(`/api/sweeps/${ids.storage}`)).json()
    const windowOf = async (i: number) => (await (await page.request.get(`/api/runs/${detail.points[i].runId}`)).json()).config.windowNs as number
    expect(await windowOf(0)).toBe(6)
    expect(await windowOf(4)).toBeGreaterThan(6.5)
    const firstRun = await (await page.request.get(`/api/runs/${detail.points[0].runId}`)).json()
    expect(firstRun.config.channels[0].pump.pulses[0].fwhmNs).toBe(0.15)
    expect(firstRun.config.channels[0].stokes.pulses.map((p: { fwhmNs: number }) => p.fwhmNs)).toEqual([0.15, 0.2])
    await page.getByRole('row', { name: 'Open the run of point 1' }).click()
    await page.getByText('Point 1 of a sweep').waitFor()
    expect(await page.locator('h1').innerText()).toBe('E2E storage time · point 1 (Write–read delay = 1, Pulse width [data = write] = 0.15)')
  })

  it('gives the small-signal gain slope of a CW pump-power sweep beside the closed form and switches the x-axis to log', async () => {
    await page.goto(`/sweeps/${ids.gain}`)
    const fit = page.getByTestId('gain-slope-fit')
    await fit.getByText(/Slope [\d.]+ ± [\d.]+ dB\/W/).waitFor()
    const text = await fit.innerText()
    const slope = Number(/Slope ([\d.]+) ±/.exec(text)?.[1])
    const closedForm = Number(/closed form .* = ([\d.]+) dB\/W/.exec(text)?.[1])
    // 10·log10(e)·g_B·L_eff/A_eff for 50 m of fibre, g_B = 5e-11 m/W, A_eff = 80 µm² (Agrawal, Nonlinear
    // Fiber Optics, ch. 9): 135.6 dB/W.
    expect(closedForm).toBeCloseTo(135.6, 1)
    expect(Math.abs(slope - closedForm) / closedForm).toBeLessThan(0.02)
    // 0.5 W is far into saturation (the gain would be 68 dB): it is left out of the line.
    expect(text).toMatch(/from 0\.(3|5) W the gain lies more than 0\.5 dB below/)

    await page.getByRole('button', { name: 'SVG' }).click()
    // The gain alone (in dB, ticks 0, 10, 20 …), so every tick below 1 is on the power axis.
    await page.locator('.v-chip', { hasText: 'Reflectivity' }).getByRole('button', { name: 'Close' }).click()
    await expect.poll(() => chartTexts(page)).toContain('Fit: small-signal slope')
    expect(await chartTexts(page)).toContain('0.2')
    await page.getByLabel('Log x-axis').check()
    // A log axis from 0.02 to 0.5 W ticks at the decades 0.01, 0.1 and 1 only.
    await expect.poll(async () => (await chartTexts(page)).includes('0.2')).toBe(false)
    expect(await chartTexts(page)).toContain('0.1')
    await screenshot(page, 'sweep-gain-slope-log-x')
  })

  it('folds each sweep into one row of the runs list, which unfolds to its points numbered from 1', async () => {
    await page.goto('/runs')
    const table = page.getByRole('table', { name: 'Runs of the group' })
    await table.getByRole('link', { name: 'E2E storage time', exact: true }).waitFor()
    // One row per sweep, none per point: the point runs' own titles are not listed.
    expect(await table.getByText('E2E storage time · point').count()).toBe(0)
    expect(await table.getByText('5 of 5 succeeded').count()).toBe(1)

    await table.getByRole('button', { name: 'Show the points of the sweep E2E storage time' }).click()
    const points = page.getByRole('list', { name: 'Points of the sweep E2E storage time' })
    await points.waitFor()
    expect(await points.getByRole('link').allInnerTexts()).toEqual(['Point 1', 'Point 2', 'Point 3', 'Point 4', 'Point 5'])
    await screenshot(page, 'runs-sweep-unfolded')

    // The "Sweep points" filter lists the point runs themselves.
    await page.getByRole('button', { name: 'Sweep points' }).click()
    await table.getByText('E2E storage time · point 1 (Write–read delay = 1, Pulse width [data = write] = 0.15)').waitFor()
  })
})
