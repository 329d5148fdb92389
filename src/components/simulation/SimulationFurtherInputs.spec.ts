// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import { flushPromises } from '@vue/test-utils'
import type { SimulationConfigInput } from '@shared/physics/simulation-config'
import { mountWithApp } from '@/test-utils/mount'
import SimulationFurtherInputs from './SimulationFurtherInputs.vue'

type ChannelDraft = SimulationConfigInput['channels'][number]

afterEach(() => {
  document.body.innerHTML = ''
})

function harness(initial: ChannelDraft, forwardLabels: string[] = []) {
  const channel = ref<ChannelDraft>(initial)
  const Host = defineComponent({
    setup: () => () =>
      h(SimulationFurtherInputs, {
        modelValue: channel.value,
        path: ['channels', 0],
        forwardLabels,
        antiStokes: true,
        accents: ['#000', '#111', '#222', '#333', '#444'],
        'onUpdate:modelValue': (v: ChannelDraft) => (channel.value = v),
      }),
  })
  return { Host, channel }
}
const button = (root: { findAll: (s: string) => { text: () => string; trigger: (e: string) => Promise<void>; attributes: (n: string) => string | undefined }[] }, name: string) =>
  root.findAll('button').find((b) => b.text().includes(name))!

describe('SimulationFurtherInputs', () => {
  it('"Compare directions" launches a copy of the Stokes input with the pump, independent of it afterwards', async () => {
    const stokes = { pulses: [{ shape: 'gaussian' as const, peakPowerW: 0.01, centreNs: 2, fwhmNs: 0.3 }], backgroundPowerW: 1e-6 }
    const { Host, channel } = harness({ pump: { pulses: [], backgroundPowerW: 0.05 }, stokes })
    const { wrapper } = await mountWithApp(Host)
    await button(wrapper, 'Compare directions').trigger('click')
    await flushPromises()
    expect(channel.value.coProbe).toEqual(stokes)
    expect(channel.value.coProbe).not.toBe(channel.value.stokes)
    expect(wrapper.find('[aria-label="Co-propagating probe input"]').exists()).toBe(true)
    await button(wrapper, 'Remove co-propagating probe').trigger('click')
    await flushPromises()
    expect('coProbe' in channel.value).toBe(false)
  })

  it('cannot compare directions before a Stokes input is launched, and says so', async () => {
    const { Host } = harness({ pump: { pulses: [], backgroundPowerW: 0.05 }, stokes: { pulses: [], backgroundPowerW: 0 } })
    const { wrapper } = await mountWithApp(Host)
    expect(button(wrapper, 'Compare directions').attributes('disabled')).toBeDefined()
    expect(wrapper.text()).toContain('Launch a Stokes input first to compare directions.')
  })

  it('shows one forward Stokes and one anti-Stokes editor per forward resonance and fills the list as they are edited', async () => {
    const { Host, channel } = harness({ pump: { pulses: [], backgroundPowerW: 0.05 } }, ['chip mode A', 'chip mode B'])
    const { wrapper } = await mountWithApp(Host)
    const cards = wrapper.findAll('section').map((s) => s.attributes('aria-label'))
    expect(cards).toEqual(['Forward Stokes 1 input', 'Forward anti-Stokes 1 input', 'Forward Stokes 2 input', 'Forward anti-Stokes 2 input'])
    const bg = wrapper.find('[aria-label="Forward Stokes 2 input"] input')
    await bg.setValue('1e-6')
    await flushPromises()
    expect(channel.value.forwardInputs).toHaveLength(2)
    expect(channel.value.forwardInputs![1].stokes!.backgroundPowerW).toBe(1e-6)
    expect(channel.value.forwardInputs![0]).toEqual({ stokes: { pulses: [], backgroundPowerW: 0 }, antiStokes: { pulses: [], backgroundPowerW: 0 } })
  })
})
