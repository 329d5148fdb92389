// Every finished run carries the power spectrum of each optical port trace (solver/observers/port-spectra.ts,
// estimator in shared/analysis/power-spectrum.ts, whose own tests hold the closed-form checks).
import { describe, expect, it } from 'vitest'
import { simulateSync } from '../../solver/index'
import { portSpectra, SPECTRUM_AXIS_ARRAY } from '../../solver/observers/port-spectra'
import { chipConfig, gaussian } from './chip-fixtures'

const wPerHz = (dbmPerGHz: number) => 10 ** ((dbmPerGHz - 120) / 10)

describe('port spectra in the result', () => {
  it('adds a PSD in dBm/GHz for every lit port, integrating to the port mean power, and names the dark ones', () => {
    const r = simulateSync(chipConfig({ windowNs: 6, channels: [{ pump: { pulses: [gaussian(1, 2, 0.3)] } }] }))
    expect(r.status).toBe('finished')
    const byName = new Map(r.manifest.arrays.map((d) => [d.name, d]))
    const axis = byName.get(SPECTRUM_AXIS_ARRAY)!
    expect(axis.units).toBe('GHz')
    expect(axis.description).toMatch(/Hann .*window, \d+-sample segments overlapping 75 %, resolution bandwidth [\d.]+ [MG]Hz, sampled every [\d.]+ [MG]Hz/)
    // Nothing is launched into the Stokes port and nothing seeds it (no noise): both Stokes ports are dark.
    expect(axis.description).toContain('no light, so no spectrum, at ch1_stokes_in, ch1_stokes_out')
    expect(byName.has('ch1_stokes_in_psd_dbm_per_ghz')).toBe(false)
    const offsetGHz = r.arrays[SPECTRUM_AXIS_ARRAY]
    expect(offsetGHz.length).toBeLessThanOrEqual(4096)
    for (let i = 1; i < offsetGHz.length; i++) expect(offsetGHz[i]).toBeGreaterThan(offsetGHz[i - 1])
    const binHz = (offsetGHz[1] - offsetGHz[0]) * 1e9
    for (const port of ['pump_in', 'pump_out']) {
      const d = byName.get(`ch1_${port}_psd_dbm_per_ghz`)!
      expect(d.units).toBe('dBm/GHz')
      expect(d.shape).toEqual([offsetGHz.length])
      const psd = Array.from(r.arrays[d.name])
      expect(psd.every(Number.isFinite)).toBe(true)
      // Parseval's theorem: the spectrum integrates to the trace's mean power.
      const field = r.arrays[`ch1_${port}`]
      let mean = 0
      for (let i = 0; i < field.length; i++) mean += field[i] ** 2
      mean /= field.length / 2
      expect(psd.reduce((s, v) => s + wPerHz(v) * binHz, 0) / mean).toBeCloseTo(1, 8)
    }
    // The launched pulse carries no frequency offset: its spectrum peaks at the carrier.
    const pumpIn = Array.from(r.arrays.ch1_pump_in_psd_dbm_per_ghz)
    const peak = pumpIn.reduce((best, v, i) => (v > pumpIn[best] ? i : best), 0)
    expect(Math.abs(offsetGHz[peak] * 1e9)).toBeLessThanOrEqual(binHz)
  })

  it('takes any list of traces, such as further waves, and returns nothing when all are dark', () => {
    const n = 1000
    const lit = new Float64Array(2 * n).map((_, i) => (i % 2 === 0 ? 0.1 : 0))
    const out = portSpectra(
      [
        { name: 'ch1_probe_out', label: 'Probe leaving at z = L', data: lit },
        { name: 'ch1_anti_stokes_out', label: 'Anti-Stokes leaving at z = L', data: new Float64Array(2 * n) },
      ],
      1e-12,
    )
    expect(out.map((a) => a.name)).toEqual([SPECTRUM_AXIS_ARRAY, 'ch1_probe_out_psd_dbm_per_ghz'])
    expect(out[0].descriptor.description).toContain('no light, so no spectrum, at ch1_anti_stokes_out')
    expect(out[1].descriptor.description).toContain('Probe leaving at z = L')
    expect(portSpectra([{ name: 'x', label: 'x', data: new Float64Array(8) }], 1e-12)).toEqual([])
  })
})
