// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import type { ChannelFigures, FiguresOfMerit } from '@shared/physics/simulation-result'
import { mountWithApp } from '@/test-utils/mount'
import RunFigures from './RunFigures.vue'

afterEach(() => {
  document.body.innerHTML = ''
})

const base: ChannelFigures = {
  channel: 0,
  scheme: 'storage',
  energyJ: { pumpIn: 2.13e-12, stokesIn: 3.4e-9, pumpOut: 1.2e-12, stokesOut: 2.1e-9 },
  // A storage run used to print these two: a reflectivity of 986 (Stokes out over data in) and a "gain" of the write pulse.
  peakStokesGainDb: -2.1,
  reflectivity: 986.7,
  pumpDelayNs: null,
  stokesDelayNs: null,
  pumpOutFwhmNs: null,
  stokesOutFwhmNs: null,
  manleyRoweResidual: null,
  retrievalEfficiency: null,
  leakThrough: null,
  retrievedPhaseRad: null,
  readWindowNs: [5.38, 6.76],
  retrievalWindow: { arrivalNs: 6.07, fwhmNs: 0.346, startNs: 5.38, endNs: 6.76 },
  notDetermined: [
    { figure: 'retrievalEfficiency', code: 'window-outside-run', message: 'The retrieved pulse is expected at the pump output at 6.07 ns (window 5.38–6.76 ns), but the run ends at 6 ns.' },
    { figure: 'retrievedPhaseRad', code: 'window-outside-run', message: 'The retrieved pulse is expected at the pump output at 6.07 ns (window 5.38–6.76 ns), but the run ends at 6 ns.' },
  ],
}
const figures = (c: ChannelFigures): FiguresOfMerit => ({ channels: [c], windows: [], wallTimeS: 0.1, cellUpdatesPerS: 1e8 })

async function render(f: FiguresOfMerit) {
  const Host = defineComponent({ setup: () => () => h(RunFigures, { figures: f, channelLabels: [''] }) })
  await mountWithApp(Host)
  await flushPromises()
  return document.body
}
const rowLabels = (root: Element) => Array.from(root.querySelectorAll('table[aria-label="Figures of merit"] th[scope="row"]')).map((t) => t.textContent!.trim())

describe('RunFigures', () => {
  it('shows a storage run its storage figures only: no reflectivity, no Stokes gain', async () => {
    const root = await render(figures(base))
    const labels = rowLabels(root)
    expect(labels).toContain('Retrieval efficiency η')
    expect(labels).toContain('Leak-through')
    expect(labels.some((l) => l.startsWith('Reflectivity'))).toBe(false)
    expect(labels).not.toContain('Peak Stokes gain')
    expect(root.textContent).not.toContain('986')
  })

  it('writes "not determined" with the reason instead of a number', async () => {
    const root = await render(figures(base))
    const row = Array.from(root.querySelectorAll('tr')).find((r) => r.textContent!.includes('Retrieval efficiency'))!
    expect(row.textContent).toContain('not determined')
    // One note for the two figures that share the reason.
    const notes = root.querySelectorAll('ol[aria-label="Why some figures are not determined"] li')
    expect(notes).toHaveLength(1)
    expect(notes[0].textContent).toMatch(/Retrieval efficiency η, Retrieved phase not determined\. The retrieved pulse is expected .* run ends at 6 ns/)
  })

  it('shows an amplifier run its gain figures and efficiency-type ratios as fractions', async () => {
    const amp: ChannelFigures = { ...base, scheme: 'amplifier', notDetermined: [], retrievalWindow: null, readWindowNs: null, peakStokesGainDb: 7.9, reflectivity: 0.0123 }
    const root = await render(figures(amp))
    const labels = rowLabels(root)
    expect(labels).toContain('Peak Stokes gain')
    expect(labels).not.toContain('Retrieval efficiency η')
    const row = Array.from(root.querySelectorAll('tr')).find((r) => r.textContent!.includes('Reflectivity'))!
    expect(row.textContent).toContain('fraction')
    expect(row.textContent).toContain('0.0123')
  })
})
