// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import type { FiguresOfMerit } from '@shared/physics/simulation-result'
import { WaveFigures } from '@shared/physics/wave-figures'
import { mountWithApp } from '@/test-utils/mount'
import RunFigures from './RunFigures.vue'

afterEach(() => {
  document.body.innerHTML = ''
})

// Hand-made figures of a lossless chip run (G_B = 300 /(W m), L = 5 cm, 50 mW CW pump, the V6 case of
// docs/validation.md) with a 1 µW probe launched both ways at the Stokes frequency. The counter-propagating probe
// gains e^{0.75} = 2.117 (Agrawal, Nonlinear Fiber Optics, ch. 9: exp(G_B P L_eff)); the co-propagating one sees
// no backward gain, transmission 1. The isolation is their ratio, 10·log10(2.117) = 3.257 dB.
const counter = Math.exp(0.75)
const waves = WaveFigures.parse({
  waves: [
    { key: 'pump', label: 'Pump', direction: 1, offsetGHz: 0, energyInJ: 1e-9, energyOutJ: 0.99e-9, transmission: 0.99, gainDb: 10 * Math.log10(0.99) },
    { key: 'stokes', label: 'Stokes', direction: -1, offsetGHz: -7.7, energyInJ: 2e-14, energyOutJ: 2e-14 * counter, transmission: counter, gainDb: 10 * Math.log10(counter) },
    { key: 'co_probe', label: 'Co-propagating probe', direction: 1, offsetGHz: -7.7, energyInJ: 2e-14, energyOutJ: 2e-14, transmission: 1, gainDb: 0 },
    { key: 'forward_stokes_1', label: 'Forward Stokes', direction: 1, offsetGHz: -0.32, energyInJ: 0, energyOutJ: 0, transmission: null, gainDb: null },
  ],
  photonBalanceResidual: 3.1e-13,
  nonReciprocity: { counterTransmission: counter, coTransmission: 1, isolationDb: 10 * Math.log10(counter) },
})
const channel = {
  channel: 0, scheme: 'amplifier' as const,
  energyJ: { pumpIn: 1e-9, stokesIn: 2e-14, pumpOut: 0.99e-9, stokesOut: 4.2e-14 },
  peakStokesGainDb: 3.26, reflectivity: 4e-5, pumpDelayNs: null, stokesDelayNs: null, pumpOutFwhmNs: null, stokesOutFwhmNs: null,
  manleyRoweResidual: 3e-13, retrievalEfficiency: null, leakThrough: null, retrievedPhaseRad: null, readWindowNs: null, retrievalWindow: null, notDetermined: [],
}
const figures = (w?: WaveFigures): FiguresOfMerit => ({ channels: [channel], windows: [], wallTimeS: 0.1, cellUpdatesPerS: 1e8, ...(w ? { waves: w } : {}) })

async function render(f: FiguresOfMerit) {
  const Host = defineComponent({ setup: () => () => h(RunFigures, { figures: f, channelLabels: [''] }) })
  await mountWithApp(Host)
  await flushPromises()
  return document.body
}
const waveTable = (root: Element) => root.querySelector('table[aria-label="Energies and gain of each optical wave"]')
const rowOf = (root: Element, label: string) => Array.from(waveTable(root)!.querySelectorAll('tbody tr')).find((r) => r.querySelector('th')!.textContent!.trim() === label)!

describe('RunFigures with per-wave figures', () => {
  it('lists each wave with its direction in words, carrier offset, energies and gain', async () => {
    const root = await render(figures(waves))
    const stokes = rowOf(root, 'Stokes').textContent!
    expect(stokes).toContain('← −z')
    expect(stokes).toContain('against the pump: in at z = L, out at z = 0')
    expect(stokes).toContain('−7.7 GHz')
    expect(stokes).toContain('20 fJ')
    expect(rowOf(root, 'Stokes').querySelector('td:last-child')!.getAttribute('title')).toBe('Transmission 2.117')
    expect(stokes).toContain('+3.257')
    const probe = Array.from(rowOf(root, 'Co-propagating probe').querySelectorAll('td')).map((td) => td.textContent!.trim())
    expect(probe[0]).toContain('→ +zwith the pump: in at z = 0, out at z = L')
    expect(probe.slice(-3)).toEqual(['20 fJ', '20 fJ', '0'])
    expect(rowOf(root, 'Forward Stokes').textContent).toContain('−320 MHz')
    expect(rowOf(root, 'Forward Stokes').textContent).toContain('none launched')
    expect(rowOf(root, 'Pump').querySelectorAll('td')[1].textContent!.trim()).toBe('0')
  })

  it('shows the isolation with both transmissions and the photon balance over all waves', async () => {
    const root = await render(figures(waves))
    const iso = root.querySelector('[data-testid="wave-isolation"]')!.textContent!
    expect(iso).toContain('+3.257 dB')
    expect(iso).toContain('against the pump 2.117, with the pump 1')
    expect(root.textContent).toContain('Isolation (co vs counter probe)')
    expect(root.querySelector('[data-testid="wave-photon-balance"]')!.textContent).toContain('3.10e-13')
  })

  it('says why the photon balance is missing with loss and leaves out the isolation without a probe pair', async () => {
    const root = await render(figures({ ...waves, photonBalanceResidual: null, nonReciprocity: null }))
    expect(root.querySelector('[data-testid="wave-photon-balance"]')!.textContent).toContain('n/a')
    expect(root.querySelector('[data-testid="wave-isolation"]')).toBeNull()
  })

  it('shows no wave table for a plain pump–Stokes run', async () => {
    const root = await render(figures())
    expect(waveTable(root)).toBeNull()
  })
})
