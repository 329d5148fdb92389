// The main pages on a phone (390 px wide) and a laptop, in both themes: nothing sticks out of the viewport or
// past the right edge of its card (tables scroll inside theirs), and the app bar keeps its theme toggle and
// account menu on screen even for a member of two groups with long names.
import { readFileSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO, launchBrowser, newContext, screenshot, signIn } from './browser'

const base = inject('e2eBaseUrl')
let browser: Browser
let editor: BrowserContext
const paths: Record<string, string> = {}

/** The little of the DOM the check uses (the Node-side type check has no DOM library). */
interface El {
  tagName: string
  classList: Iterable<string>
  parentElement: El | null
  getBoundingClientRect(): { right: number; width: number; height: number }
  closest(selector: string): El | null
  querySelectorAll(selector: string): Iterable<El>
  ownerDocument: { documentElement: { clientWidth: number }; defaultView: { getComputedStyle(e: El): { visibility: string } } }
}

/** Elements whose right edge passes the viewport's or their card's; scrolling table wrappers and overlays excepted. */
function overflowing(page: Page): Promise<string[]> {
  return page.locator('body').evaluate((node) => {
    const body = node as unknown as El
    const vw = body.ownerDocument.documentElement.clientWidth
    const name = (el: El) => `${el.tagName.toLowerCase()}${[...el.classList].slice(0, 2).map((c) => `.${c}`).join('')}`
    const out: string[] = []
    for (const el of body.querySelectorAll('*')) {
      const r = el.getBoundingClientRect()
      if (r.width === 0 || r.height === 0 || body.ownerDocument.defaultView.getComputedStyle(el).visibility === 'hidden') continue
      if (el.closest('.v-table__wrapper, .v-slide-group__container, .v-overlay-container, .v-navigation-drawer')) continue
      if (r.right > vw + 1) out.push(`${name(el)} ends at ${Math.round(r.right)} px, the viewport at ${vw}`)
      const card = el.parentElement?.closest('.v-card')
      if (card && r.right > card.getBoundingClientRect().right + 1) out.push(`${name(el)} passes the right edge of its card`)
    }
    return out
  })
}

async function poll<T>(read: () => Promise<T>, done: (v: T) => boolean, what: string, timeoutMs = 120_000): Promise<T> {
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
  editor = await newContext(browser, base)
  const page = await editor.newPage()
  await signIn(page, DEMO.editor)
  const api = page.request
  // A second group, so the group name in the app bar is a menu button (the widest form it takes).
  expect((await api.post('/api/groups', { data: { name: 'Nonlinear Photonics Reading Group of the Halden Lab' } })).status()).toBe(201)
  const me = await (await api.get('/api/me')).json()
  const groupId = me.memberships.find((m: { groupName: string }) => m.groupName.startsWith('Halden')).groupId
  const config = JSON.parse(readFileSync('solver/examples/store-and-retrieve-chalcogenide-rib.json', 'utf8'))
  const run = await (await api.post('/api/runs', { data: { groupId, title: 'Narrow layout store and retrieve', config } })).json()
  const sweep = await (
    await api.post('/api/sweeps', {
      data: { groupId, title: 'Narrow layout storage time', baseConfig: { ...config, energyWindows: [] }, axes: [{ field: 'pulseCentreNs', pulseLabel: 'read', values: { kind: 'list', values: [3, 4, 5] } }] },
    })
  ).json()
  const csv = 'time_ns,power_w\n' + Array.from({ length: 300 }, (_, i) => `${(i * 0.02).toFixed(2)},${(1e-3 * Math.exp(-(((i - 150) / 30) ** 2))).toExponential(4)}`).join('\n')
  const trace = await (
    await api.post('/api/traces', { multipart: { file: { name: 'probe.csv', mimeType: 'text/csv', buffer: Buffer.from(csv) }, settings: JSON.stringify({ groupId, name: 'Probe pulse', signalColumns: [1] }) } })
  ).json()
  await poll(async () => (await (await api.get(`/api/runs/${run.id}`)).json()).status, (s) => s === 'succeeded', 'the run')
  await poll(async () => (await (await api.get(`/api/sweeps/${sweep.id}`)).json()).status, (s) => s === 'finished', 'the sweep')
  Object.assign(paths, { dashboard: '/', runs: '/runs', run: `/runs/${run.id}`, sweeps: '/sweeps', sweep: `/sweeps/${sweep.id}`, traces: '/traces', trace: `/traces/${trace.id}` })
  await page.close()
})
afterAll(async () => {
  await editor?.close()
  await browser?.close()
})

describe('layout at phone and laptop widths', () => {
  for (const theme of ['light', 'dark'] as const) {
    for (const width of [390, 1440]) {
      it(`keeps every element of the main pages inside the viewport and its card at ${width} px, ${theme} theme`, async () => {
        const ctx = await newContext(browser, base, theme, editor)
        const page = await ctx.newPage()
        await page.setViewportSize({ width, height: 900 })
        try {
          for (const [name, path] of Object.entries(paths)) {
            await page.goto(path)
            await page.locator('h1').first().waitFor()
            // Charts size themselves after the first paint; lists and tables fill in from the API.
            await page.waitForTimeout(1500)
            expect(await overflowing(page), `${name} at ${width} px`).toEqual([])
            const toggle = await page.getByRole('button', { name: /^Switch to (dark|light) theme$/ }).boundingBox()
            const account = await page.getByRole('button', { name: /^Account menu for / }).boundingBox()
            expect(toggle!.x + toggle!.width).toBeLessThanOrEqual(width)
            expect(account!.x + account!.width).toBeLessThanOrEqual(width)
            // The group button ends before the toggle starts: they do not overlap.
            const group = await page.getByRole('button', { name: /^Current group: / }).boundingBox()
            expect(group!.x + group!.width).toBeLessThanOrEqual(toggle!.x)
            if (width === 390) await screenshot(page, `narrow-${name}-${theme}`)
          }
        } finally {
          await ctx.close()
        }
      })
    }
  }
})
