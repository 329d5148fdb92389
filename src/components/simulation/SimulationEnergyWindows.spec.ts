// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import { flushPromises } from '@vue/test-utils'
import type { z } from 'zod'
import type { EnergyWindow, SimulationConfigInput } from '@shared/physics/simulation-config'
import { mountWithApp } from '@/test-utils/mount'
import example from '../../../solver/examples/store-and-retrieve-chalcogenide-rib.json'
import SimulationEnergyWindows from './SimulationEnergyWindows.vue'

type WindowDraft = z.input<typeof EnergyWindow>

afterEach(() => {
  document.body.innerHTML = ''
})

function harness(initial: WindowDraft[], config: SimulationConfigInput) {
  const windows = ref<WindowDraft[]>(initial)
  const Host = defineComponent({
    setup: () => () =>
      h(SimulationEnergyWindows, { modelValue: windows.value, windowNs: config.windowNs, config, 'onUpdate:modelValue': (v: WindowDraft[]) => (windows.value = v) }),
  })
  return { Host, windows }
}

/** L = 7 cm, n_g = 2.44: one transit is 0.5697 ns; the read-out reaches the pump output at t_r + T − (t_w − t_d). */
const TRANSIT_NS = (0.07 * 2.44) / 0.299792458

describe('SimulationEnergyWindows', () => {
  it('anchors a window to the read pulse, says where it lies now, and turns back into fixed times in place', async () => {
    const config = structuredClone(example) as SimulationConfigInput
    const { Host, windows } = harness([{ label: 'read-out', port: 'pumpOut', startNs: 4, endNs: 5.5 }], config)
    const { wrapper } = await mountWithApp(Host)
    const [, timing] = wrapper.findAllComponents({ name: 'VSelect' })
    timing.vm.$emit('update:modelValue', 'pulse')
    await flushPromises()
    // The first pulse in the list is the data pulse; pick the read pulse (Stokes pulse 2).
    expect(windows.value[0].anchor).toMatchObject({ channel: 0, port: 'pump', pulseIndex: 0, fromFwhm: -2, toFwhm: 2 })
    const pulse = wrapper.findAllComponents({ name: 'VSelect' })[2]
    pulse.vm.$emit('update:modelValue', '0:stokes:1')
    await flushPromises()
    expect(windows.value[0]).toMatchObject({ label: 'read-out', port: 'pumpOut', anchor: { port: 'stokes', pulseIndex: 1 } })
    expect(windows.value[0].startNs).toBeUndefined()
    const hint = () => wrapper.find('[data-testid="energy-window-anchor-hint"]').text()
    expect(hint()).toContain(`expected at this port at ${Number((4 + TRANSIT_NS).toPrecision(3))} ns`)

    // Back to fixed times: the window keeps where it was.
    wrapper.findAllComponents({ name: 'VSelect' })[1].vm.$emit('update:modelValue', 'fixed')
    await flushPromises()
    expect(windows.value[0].anchor).toBeUndefined()
    expect(windows.value[0].startNs).toBeCloseTo(4 + TRANSIT_NS - 4 * 0.2 * Math.sqrt(3) / 2, 6)
  })

  it('warns when the anchored window leaves the simulated time', async () => {
    const config = structuredClone(example) as SimulationConfigInput
    config.channels[0].stokes!.pulses![1].centreNs = 5.5
    const { Host } = harness([{ label: 'read-out', port: 'pumpOut', anchor: { port: 'stokes', pulseIndex: 1 } }], config)
    const { wrapper } = await mountWithApp(Host)
    expect(wrapper.find('[data-testid="energy-window-anchor-hint"]').text()).toMatch(/partly outside the simulated time.*not determined/)
  })
})
