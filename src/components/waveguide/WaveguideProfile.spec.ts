// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import type { WaveguideInput } from '@shared/physics/waveguide'
import { mountWithApp } from '@/test-utils/mount'
import WaveguideProfile from './WaveguideProfile.vue'

afterEach(() => {
  document.body.innerHTML = ''
})

const fibre: WaveguideInput = { name: 'Spool', lengthM: 1000, groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.8, linewidthMHz: 30 }
type Emitted = WaveguideInput[]

describe('WaveguideProfile', () => {
  it('adds a 2 m section at the start, plots the shift from temperature, and drops the profile with its last section', async () => {
    const { wrapper } = await mountWithApp(WaveguideProfile, { props: { modelValue: fibre } })
    expect(wrapper.find('figure').exists()).toBe(false)
    await wrapper.findAll('button').find((b) => b.text().includes('Add section'))!.trigger('click')
    const added = (wrapper.emitted('update:modelValue') as Emitted[])[0][0]
    expect(added.profile?.segments).toEqual([{ startM: 0, endM: 2 }])

    // "A 2 m section 35 K warmer at 800 m": 35 K × 1 MHz/K = 35 MHz on the plot.
    await wrapper.setProps({ modelValue: { ...fibre, profile: { segments: [{ startM: 800, endM: 802, temperatureOffsetK: 35 }] } } })
    await flushPromises()
    expect(wrapper.find('figcaption').text()).toContain('from 0 to 35 MHz')
    await wrapper.find('button[aria-label="Remove section 1"]').trigger('click')
    const emitted = wrapper.emitted('update:modelValue') as Emitted[]
    expect('profile' in emitted[emitted.length - 1][0]).toBe(false)
  })
})
