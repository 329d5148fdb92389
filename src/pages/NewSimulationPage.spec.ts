// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises } from '@vue/test-utils'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import { getByRole } from '@/test-utils/by-role'
import { useSessionStore } from '@/stores/session'
import NewSimulationPage from './NewSimulationPage.vue'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { predictKernel } from '@shared/physics/resource-estimate'
import { startConfig } from '@/components/simulation/simulation-starts'

// Canvas charts do not draw in happy-dom; the preview's own sampling is exercised through the page anyway.
vi.mock('@/plugins/echarts', () => ({
  VChart: defineComponent({ props: ['option'], setup: () => () => h('div', { 'data-chart': 'stub' }) }),
  chartThemeName: () => 'test',
}))

const GROUP_ID = '7d3a5f0e-4a61-4c7e-9d9b-2f1a6c0b8e11'
const RUN_ID = '0b6f1c2a-9e3d-4f5a-8b7c-1d2e3f4a5b6c'
const me = {
  user: { id: '1f0e2d3c-4b5a-4978-8695-a4b3c2d1e0f9', email: 'tomas.reyes@halden.example', displayName: 'Tomas Reyes' },
  memberships: [{ groupId: GROUP_ID, groupName: 'Halden Acousto-Optics Lab', role: 'editor' }],
  currentGroupId: GROUP_ID,
}
const run = {
  id: RUN_ID,
  groupId: GROUP_ID,
  authorId: me.user.id,
  authorName: 'Tomas Reyes',
  title: 'Store and retrieve on a chip',
  status: 'queued',
  progress: 0,
  attempt: 0,
  error: null,
  configHash: 'abc',
  solverVersion: '0.1.0',
  expectedSeconds: 0.02,
  createdAt: '2026-12-01T10:00:00.000Z',
  startedAt: null,
  finishedAt: null,
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

async function mountSignedIn(speed?: unknown) {
  const net = fakeFetch({ 'GET /api/me': { body: me }, 'POST /api/runs': { status: 202, body: run }, ...(speed ? { 'GET /api/runs/speed': { body: speed } } : {}) })
  vi.stubGlobal('fetch', net.fn)
  const mounted = await mountWithApp(NewSimulationPage, { path: '/simulations/new' })
  await useSessionStore().load()
  await flushPromises()
  return { ...mounted, net }
}

async function typeInto(input: HTMLElement, text: string) {
  const el = input as HTMLInputElement
  el.value = text
  el.dispatchEvent(new Event('input'))
  await flushPromises()
}

const submitButton = (root: Element) => getByRole(root, 'button', 'Queue run') as HTMLButtonElement
const stokesRow = (root: Element, n: number) => root.querySelector(`li[aria-label="Stokes pulse ${n}"]`)!

describe('NewSimulationPage validation', () => {
  it('starts from a valid example with submit enabled for an editor', async () => {
    const { wrapper } = await mountSignedIn()

    expect(submitButton(wrapper.element).disabled).toBe(false)
    expect(wrapper.text()).toContain('Cells along z × time steps')
  })

  it('shows the schema message beside a negative peak power and blocks submit until it is corrected', async () => {
    const { wrapper, net } = await mountSignedIn()
    const power = getByRole(stokesRow(wrapper.element, 1), 'textbox', 'Stokes pulse 1 peak power, W')

    await typeInto(power, '-1')

    // shared/physics/pulse.ts: peakPowerW = finite().min(0), worded with its unit by shared/api/issue-messages.ts.
    expect(power.closest('.v-input')!.textContent).toContain('must be at least 0 W')
    expect(submitButton(wrapper.element).disabled).toBe(true)
    expect(wrapper.text()).toMatch(/Stokes pulse 1, peak power: must be at least 0 W/)
    submitButton(wrapper.element).click()
    await flushPromises()
    expect(net.calls.some((c) => c.method === 'POST')).toBe(false)

    await typeInto(power, '10')
    expect(submitButton(wrapper.element).disabled).toBe(false)
  })

  it('flags a pulse centred outside the window with the cross-field message of the shared config', async () => {
    const { wrapper } = await mountSignedIn()
    const centre = getByRole(stokesRow(wrapper.element, 2), 'textbox', 'Stokes pulse 2 centre t₀, ns')

    await typeInto(centre, '40')

    expect(centre.closest('.v-input')!.textContent).toContain('The pulse centre must lie inside the simulated window, 0 to 6 ns')
    expect(submitButton(wrapper.element).disabled).toBe(true)
  })

  it('queues the run for the current group and leaves the form', async () => {
    const { wrapper, net, router } = await mountSignedIn()

    submitButton(wrapper.element).click()
    await flushPromises()

    const post = net.calls.find((c) => c.method === 'POST' && c.url === '/api/runs')
    expect(post).toBeDefined()
    const body = JSON.parse(String(post!.init!.body))
    expect(body.groupId).toBe(GROUP_ID)
    expect(body.title).toBe('Store and retrieve on a chip')
    expect(body.config.channels[0].stokes.pulses.map((p: { label: string }) => p.label)).toEqual(['write', 'read'])
    // The run page comes with the run views; until its route exists the form lands on the dashboard.
    // The run page is a lazy chunk: on a loaded machine its import takes longer than waitFor's 1 s default.
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('run'), { timeout: 15_000 })
  })

  it('keeps submit disabled for a viewer and says why', async () => {
    const net = fakeFetch({ 'GET /api/me': { body: { ...me, memberships: [{ ...me.memberships[0], role: 'viewer' }] } } })
    vi.stubGlobal('fetch', net.fn)
    const { wrapper } = await mountWithApp(NewSimulationPage, { path: '/simulations/new' })
    await useSessionStore().load()
    await flushPromises()

    expect(submitButton(wrapper.element).disabled).toBe(true)
    expect(wrapper.text()).toContain('editors and owners queue runs')
  })

  it('starts from a configuration handed over by a run page and queues it with the copied title', async () => {
    const handed = {
      waveguide: { name: 'Halden rib R7', lengthM: 0.07, groupIndex: 2.44, effectiveAreaUm2: 1, gainCoefficientMPerW: 3e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
      windowNs: 9,
      channels: [{ pump: { pulses: [{ shape: 'gaussian', label: 'data', peakPowerW: 0.01, centreNs: 1, fwhmNs: 0.2 }] }, stokes: { pulses: [] } }],
    }
    history.replaceState({ config: handed, title: 'Halden rib R7 storage (copy)' }, '')
    const { wrapper, net } = await mountSignedIn()
    history.replaceState(null, '')

    submitButton(wrapper.element).click()
    await flushPromises()

    const body = JSON.parse(String(net.calls.find((c) => c.method === 'POST')!.init!.body))
    expect(body.title).toBe('Halden rib R7 storage (copy)')
    expect(body.config.waveguide.lengthM).toBe(0.07)
    expect(body.config.windowNs).toBe(9)
    expect(body.config.channels[0].pump.pulses[0].label).toBe('data')
  })
})

describe('NewSimulationPage expected time', () => {
  const basis = (root: Element) => root.querySelector('[data-testid="estimate-basis"]')!.textContent!

  it('says the time comes from the benchmark figures while the server has no runs of this kind', async () => {
    const { wrapper } = await mountSignedIn({ kernels: [] })
    expect(basis(wrapper.element)).toMatch(/^From the benchmark figures, since this server has not finished enough runs of this kind \(.+engine, .+\) yet: between .+ and .+, depending on how busy the server is\.$/)
  })

  it('takes the speed the server measured on its recent runs of the same kind, and says so', async () => {
    const config = SimulationConfig.parse(startConfig())
    const kernel = predictKernel(config, chooseGrid(config))
    const speed = { kernels: [{ kernel, cellUpdatesPerS: 1e6, slowPerS: 5e5, fastPerS: 2e6, runs: 9, newestAt: '2026-12-03T10:00:00.000Z' }] }
    const { wrapper } = await mountSignedIn(speed)
    expect(basis(wrapper.element)).toMatch(/^Measured on this server: the speed of its last 9 runs of the same kind \(/)
    // No internal names reach the user.
    expect(basis(wrapper.element)).not.toMatch(/wasm|recent-runs|kernel|\/plain/)
  })
})
