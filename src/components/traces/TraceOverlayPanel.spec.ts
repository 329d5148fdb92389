// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import { firstOrderResponse, firstOrderTauNs } from '@shared/analysis/detector-response'
import { mountWithApp } from '@/test-utils/mount'
import TraceOverlayPanel from './TraceOverlayPanel.vue'

vi.mock('@/plugins/echarts', () => ({
  VChart: defineComponent({ props: ['option', 'theme', 'autoresize'], setup: () => () => h('div', { class: 'vchart-stub' }) }),
  chartThemeName: () => 'light',
}))
vi.mock('@/components/fit/FitPanel.vue', () => ({ default: defineComponent({ setup: () => () => h('div') }) }))

// The model: a pulse with a fast rise and a slow tail on 0–20 ns in 5 ps steps, at the pump output.
const STEP_NS = 0.005
const modelTime = Float64Array.from({ length: 4001 }, (_, i) => i * STEP_NS)
const pulse = (t: number) => (t <= 5 ? 0 : ((t - 5) / 0.4) * Math.exp(1 - (t - 5) / 0.4))
const modelPower = Float64Array.from(modelTime, pulse)
// The measurement: 2.5 × the model as a 1 GHz single-pole detector records it, 1.5 ns later, every 20 ps.
const detected = firstOrderResponse({ timeNs: modelTime, values: modelPower }, firstOrderTauNs(1))
const measuredTime = Array.from({ length: 800 }, (_, i) => 2 + i * 0.02)
const measuredValues = measuredTime.map((t) => {
  const x = (t - 1.5) / STEP_NS
  const j = Math.floor(x)
  return j < 0 || j >= modelTime.length - 1 ? 0 : 2.5 * (detected[j] + (x - j) * (detected[j + 1] - detected[j]))
})

const GROUP = '00000000-0000-4000-8000-000000000001'
const TRACE = '00000000-0000-4000-8000-000000000002'
vi.mock('@/api/runs', () => ({
  fetchRunArray: async (_id: string, name: string) =>
    name === 'time_ns'
      ? { name, dtype: 'f8', shape: [modelTime.length], units: 'ns', data: modelTime }
      : { name, dtype: 'c16', shape: [modelTime.length], units: '√W', data: Float64Array.from({ length: 2 * modelTime.length }, (_, k) => (k % 2 ? 0 : Math.sqrt(modelPower[k / 2]))) },
}))
vi.mock('@/api/traces', () => ({
  listTraces: async () => ({ items: [{ id: TRACE, groupId: GROUP, authorId: null, authorName: null, name: 'scope 1', fileName: 'scope1.csv', byteSize: 1, format: 'delimited', sampleCount: 800, startNs: 2, endNs: 17.98, signals: [], createdAt: new Date().toISOString() }], total: 1 }),
  fetchTraceData: async () => ({ timeNs: measuredTime, signals: [{ label: 'P', unit: 'W', values: measuredValues }], stride: 1 }),
}))

afterEach(() => {
  document.body.innerHTML = ''
})

async function render() {
  // happy-dom has no visualViewport; Vuetify's menu positioning listens on it.
  vi.stubGlobal('visualViewport', Object.assign(new EventTarget(), { width: 1280, height: 800, scale: 1, offsetLeft: 0, offsetTop: 0 }))
  const { wrapper } = await mountWithApp(defineComponent({ setup: () => () => h(TraceOverlayPanel, { runId: 'r1', groupId: GROUP }) }))
  await vi.waitFor(() => expect(wrapper.findAll('.vchart-stub').length).toBe(1))
  // Choose the trace in the select (its menu is teleported to the body).
  await wrapper.find('.v-select .v-field').trigger('mousedown')
  await flushPromises()
  const option = Array.from(document.body.querySelectorAll('.v-list-item')).find((e) => e.textContent?.includes('scope 1')) as HTMLElement
  option.click()
  await vi.waitFor(() => expect(wrapper.find('.overlay-note').exists()).toBe(true))
  return wrapper
}
const note = (w: Awaited<ReturnType<typeof render>>) => w.find('.overlay-note').text()
const shiftOf = (text: string) => {
  const [, sign, v] = /shifted by ([+−±])([\d.]+)/.exec(text)!
  return sign === '−' ? -Number(v) : Number(v)
}
const rmsOf = (text: string) => Number(/residual rms ([\d.e+-]+) W/.exec(text)![1])

describe('measured-trace overlay', () => {
  it('sets the offset by matching peaks and by matching centroids, and says so over the chart', async () => {
    const w = await render()
    // Peaks: the measured peak is the detected model's, 1.5 ns on; the undetected model peaks earlier by
    // the detector's lag, so the offset found without the detector is more than 1.5 ns.
    expect(note(w)).toContain('(peaks matched)')
    expect(shiftOf(note(w))).toBeGreaterThan(1.5)

    await w.findAll('button').find((b) => b.text() === 'energy')!.trigger('click')
    await vi.waitFor(() => expect(note(w)).toContain('(centroids matched)'))
    // A single pole delays the centroid by exactly τ (the first moment of (1/τ)e^{−t/τ}; common practice).
    expect(Math.abs(shiftOf(note(w)) - (1.5 + firstOrderTauNs(1)))).toBeLessThan(0.01)
  })

  it('compares against the model through the chosen detector: offset 1.5 ns and a far smaller residual', async () => {
    const w = await render()
    await w.findAll('button').find((b) => b.text() === 'least squares')!.trigger('click')
    await vi.waitFor(() => expect(note(w)).toContain('(least squares)'))
    const before = rmsOf(note(w))

    const select = w.findAll('.v-select').find((s) => s.text().includes('Detector response'))!
    await select.find('.v-field').trigger('mousedown')
    await flushPromises()
    ;(Array.from(document.body.querySelectorAll('.v-list-item')).find((e) => e.textContent?.includes('First-order')) as HTMLElement).click()
    await vi.waitFor(() => expect(note(w)).toContain('first-order detector, 1 GHz (τ = 0.159 ns)'))

    await vi.waitFor(() => expect(Math.abs(shiftOf(note(w)) - 1.5)).toBeLessThan(0.005))
    expect(rmsOf(note(w))).toBeLessThan(before / 10)
  })

  it('keeps an offset set by hand and names it so', async () => {
    const w = await render()
    const input = w.findAll('input').find((i) => i.element.closest('.v-input')?.textContent?.includes('Time offset'))!
    await input.setValue('0.25')
    await flushPromises()
    expect(note(w)).toContain('Model shifted by +0.25 ns (set by hand)')
  })
})
