// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { defineComponent, h, ref } from 'vue'
import { flushPromises } from '@vue/test-utils'
import { mountWithApp } from '@/test-utils/mount'
import { accessibleName, getByRole, queryAllByRole } from '@/test-utils/by-role'
import SimulationPulseList from './SimulationPulseList.vue'
import type { PulseDraft } from './pulse-drafts'

afterEach(() => {
  document.body.innerHTML = ''
})

/** Holds the list the way the form does (v-model) and exposes it for assertions. */
function harness(initial: PulseDraft[]) {
  const pulses = ref<PulseDraft[]>(initial)
  const Host = defineComponent({
    setup: () => () =>
      h(SimulationPulseList, {
        modelValue: pulses.value,
        path: ['channels', 0, 'pump', 'pulses'],
        portName: 'Pump',
        'onUpdate:modelValue': (v: PulseDraft[]) => (pulses.value = v),
      }),
  })
  return { Host, pulses }
}

async function typeInto(input: HTMLElement, text: string) {
  const el = input as HTMLInputElement
  el.value = text
  el.dispatchEvent(new Event('input'))
  await flushPromises()
}

const rows = (root: Element) => Array.from(root.querySelectorAll('li[aria-label^="Pump pulse"]'))

describe('SimulationPulseList', () => {
  it('adds a pulse after the last one, duplicates and removes by row', async () => {
    const { Host, pulses } = harness([{ shape: 'gaussian', label: 'data', peakPowerW: 0.01, centreNs: 1, fwhmNs: 0.2 }])
    const { wrapper } = await mountWithApp(Host)

    getByRole(wrapper.element, 'button', 'Add pump pulse').click()
    await flushPromises()
    expect(pulses.value).toHaveLength(2)
    // The new pulse copies the last one's shape and power and sits five widths later.
    expect(pulses.value[1]).toMatchObject({ shape: 'gaussian', peakPowerW: 0.01, fwhmNs: 0.2, centreNs: 2 })

    getByRole(wrapper.element, 'button', 'Duplicate Pump pulse 1').click()
    await flushPromises()
    expect(pulses.value.map((p) => p.centreNs)).toEqual([1, 1, 2])
    expect(rows(wrapper.element)).toHaveLength(3)

    getByRole(wrapper.element, 'button', 'Remove Pump pulse 1').click()
    await flushPromises()
    expect(pulses.value.map((p) => p.centreNs)).toEqual([1, 2])
    expect(rows(wrapper.element)).toHaveLength(2)
  })

  it('names every field of a pulse after its pulse, with the unit, for screen readers', async () => {
    const { Host } = harness([
      { shape: 'gaussian', peakPowerW: 0.01, centreNs: 1, fwhmNs: 0.2 },
      { shape: 'gaussian', peakPowerW: 0.01, centreNs: 3, fwhmNs: 0.2 },
    ])
    const { wrapper } = await mountWithApp(Host)

    const names = queryAllByRole(rows(wrapper.element)[1], 'textbox').map(accessibleName)

    expect(names).toEqual(['Pump pulse 2 role', 'Pump pulse 2 shape', 'Pump pulse 2 peak power, W', 'Pump pulse 2 centre t₀, ns', 'Pump pulse 2 FWHM, ns', 'Pump pulse 2 phase, rad', 'Pump pulse 2 offset, MHz'])
  })

  it('edits a field of one pulse and leaves the others alone', async () => {
    const { Host, pulses } = harness([
      { shape: 'gaussian', peakPowerW: 0.01, centreNs: 1, fwhmNs: 0.2 },
      { shape: 'gaussian', peakPowerW: 0.01, centreNs: 3, fwhmNs: 0.2 },
    ])
    const { wrapper } = await mountWithApp(Host)

    await typeInto(getByRole(rows(wrapper.element)[1], 'textbox', 'Pump pulse 2 peak power, W'), '2.5e-1')

    expect(pulses.value[1].peakPowerW).toBe(0.25)
    expect(pulses.value[0].peakPowerW).toBe(0.01)
  })

  it('switches a pulse to a rectangular shape with a rise-time field', async () => {
    const { Host, pulses } = harness([{ shape: 'gaussian', peakPowerW: 1, centreNs: 1, fwhmNs: 0.5 }])
    const { wrapper } = await mountWithApp(Host)
    expect(queryAllByRole(wrapper.element, 'textbox', 'Pump pulse 1 rise 10–90 %, ns')).toHaveLength(0)

    // The select's own change path: set the model through the component it renders.
    const select = wrapper.findComponent({ name: 'VSelect' })
    select.vm.$emit('update:modelValue', 'rectangular')
    await flushPromises()

    expect(pulses.value[0]).toMatchObject({ shape: 'rectangular', fwhmNs: 0.5, peakPowerW: 1, centreNs: 1 })
    expect(queryAllByRole(wrapper.element, 'textbox', 'Pump pulse 1 rise 10–90 %, ns')).toHaveLength(1)
  })

  it('adds a train of N pulses every T ns from the first centre', async () => {
    const { Host, pulses } = harness([{ shape: 'gaussian', label: 'data', peakPowerW: 0.01, centreNs: 1, fwhmNs: 0.2 }])
    const { wrapper } = await mountWithApp(Host)

    getByRole(wrapper.element, 'button', 'Add pump train').click()
    await flushPromises()
    const form = wrapper.element.querySelector('form[aria-label="Pulse train for the Pump"]')!
    await typeInto(getByRole(form, 'textbox', 'Pulses N'), '5')
    await typeInto(getByRole(form, 'textbox', 'First centre'), '2.5')
    await typeInto(getByRole(form, 'textbox', 'Every T'), '1.5')
    await typeInto(getByRole(form, 'textbox', 'Peak power'), '0.6')
    getByRole(form, 'button', 'Add 5 pulses').click()
    await flushPromises()

    expect(pulses.value).toHaveLength(6)
    const train = pulses.value.slice(1)
    expect(train.map((p) => p.centreNs)).toEqual([2.5, 4, 5.5, 7, 8.5])
    expect(train.every((p) => p.peakPowerW === 0.6 && p.label === 'refresh' && p.shape === 'gaussian')).toBe(true)
    expect(rows(wrapper.element)).toHaveLength(6)
  })

  it('refuses a train with a non-positive period and says why', async () => {
    const { Host, pulses } = harness([])
    const { wrapper } = await mountWithApp(Host)

    getByRole(wrapper.element, 'button', 'Add pump train').click()
    await flushPromises()
    const form = wrapper.element.querySelector('form[aria-label="Pulse train for the Pump"]')!
    await typeInto(getByRole(form, 'textbox', 'Every T'), '0')

    expect(form.textContent).toContain('Must be above 0 ns')
    expect((queryAllByRole(form, 'button').find((b) => /^Add/.test(b.textContent!.trim())) as HTMLButtonElement).disabled).toBe(true)
    expect(pulses.value).toHaveLength(0)
  })
})
