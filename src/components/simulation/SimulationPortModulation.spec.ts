// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import { flushPromises } from '@vue/test-utils'
import { mountWithApp } from '@/test-utils/mount'
import { getByRole, queryAllByRole } from '@/test-utils/by-role'
import SimulationPortModulation from './SimulationPortModulation.vue'
import type { PortDraft } from './pulse-drafts'

afterEach(() => {
  document.body.innerHTML = ''
})

// Standard silica fibre figures (Agrawal, Nonlinear Fiber Optics, ch. 9; values from memory).
const FIBRE = { groupIndex: 1.468, linewidthMHz: 25 }

function harness(initial: PortDraft) {
  const port = ref<PortDraft>(initial)
  const Host = defineComponent({
    setup: () => () =>
      h(SimulationPortModulation, {
        modelValue: port.value,
        path: ['channels', 0, 'pump'],
        portName: 'Pump',
        waveguide: FIBRE,
        'onUpdate:modelValue': (v: PortDraft) => (port.value = v),
      }),
  })
  return { Host, port }
}

async function typeInto(input: HTMLElement, text: string) {
  const el = input as HTMLInputElement
  el.value = text
  el.dispatchEvent(new Event('input'))
  await flushPromises()
}

describe('SimulationPortModulation', () => {
  it('turns on a frequency modulation and edits its rate, keeping the pulses and background', async () => {
    const { Host, port } = harness({ pulses: [], backgroundPowerW: 0.01 })
    const { wrapper } = await mountWithApp(Host)
    expect(queryAllByRole(wrapper.element, 'textbox', 'Rate f_m')).toHaveLength(0)

    wrapper.findComponent({ name: 'VSelect' }).vm.$emit('update:modelValue', 'fm')
    await flushPromises()
    expect(port.value).toMatchObject({ backgroundPowerW: 0.01, modulation: { rateMHz: 10, excursionMHz: 1000, delayNs: 0 } })

    await typeInto(getByRole(wrapper.element, 'textbox', 'Rate f_m'), '5')
    expect(port.value.modulation?.rateMHz).toBe(5)
    expect(port.value.broadband).toBeUndefined()
  })

  it('shows β, the peak spacing v_g/(2f_m) and the width v_g Δν_B/(2π f_m Δf) of Hotate & Hasegawa 2000 on this fibre', async () => {
    // v_g = c/1.468 = 204 218 296 m/s: d_m = v_g/(2·10 MHz) = 10.21 m; Δz = v_g·25 MHz/(2π·10 MHz·1 GHz) = 8.126 cm
    const { Host } = harness({ pulses: [], modulation: { rateMHz: 10, excursionMHz: 1000 } })
    const { wrapper } = await mountWithApp(Host)
    const text = wrapper.text()
    expect(text).toContain('β = Δf/f_m = 100 rad')
    expect(text).toContain('every 10.2 m')
    expect(text).toContain('about 81.3 mm wide')
  })

  it('switches to a broadband source, dropping the modulation, and shows its correlation length', async () => {
    const { Host, port } = harness({ pulses: [], modulation: { rateMHz: 10, excursionMHz: 1000 } })
    const { wrapper } = await mountWithApp(Host)
    wrapper.findComponent({ name: 'VSelect' }).vm.$emit('update:modelValue', 'broadband')
    await flushPromises()
    expect(port.value.modulation).toBeUndefined()
    expect(port.value.broadband).toEqual({ linewidthMHz: 100, seed: 1 })
    // v_g/(π·100 MHz) = 0.650 m
    expect(wrapper.text()).toContain('Correlation length v_g/(πΔν) = 650 mm')
    // v_g ln 2/(π(25 + 200) MHz) = 200.3 mm; floor 25/225 = 11 %
    expect(wrapper.text()).toContain('one correlation peak about 200 mm wide')
    expect(wrapper.text()).toContain('gain floor of 11 % of the peak')
  })
})
