import { describe, expect, it } from 'vitest'
import { extraWaveTraces, facetOf } from './wave-traces'

const arrays = ['time_ns', 'ch1_pump_in', 'wave_pump_in', 'wave_pump_out', 'wave_stokes_in', 'wave_stokes_out', 'wave_co_probe_in', 'wave_co_probe_out', 'wave_stokes_2_out', 'acoustic_1_1_final'].map((name) => ({ name }))

describe('extra wave traces', () => {
  it('picks the wave_<key>_in/out arrays beyond pump and Stokes, named from the figures', () => {
    const waves = { waves: [{ key: 'co_probe', label: 'Co-propagating probe', direction: 1 as const, offsetGHz: -7.7, energyInJ: 1, energyOutJ: 1, transmission: 1, gainDb: 0 }], photonBalanceResidual: 0, nonReciprocity: null }
    const refs = extraWaveTraces(arrays, waves)
    expect(refs).toEqual([
      { key: 'co_probe', label: 'Co-propagating probe', direction: 1, inName: 'wave_co_probe_in', outName: 'wave_co_probe_out' },
      { key: 'stokes_2', label: 'Stokes 2', direction: null, inName: null, outName: 'wave_stokes_2_out' },
    ])
  })

  it('names the facet a wave enters and leaves by its direction', () => {
    expect(facetOf({ direction: 1 }, 'in')).toBe('in (z = 0)')
    expect(facetOf({ direction: 1 }, 'out')).toBe('out (z = L)')
    expect(facetOf({ direction: -1 }, 'in')).toBe('in (z = L)')
    expect(facetOf({ direction: -1 }, 'out')).toBe('out (z = 0)')
    expect(facetOf({ direction: null }, 'out')).toBe('out')
  })

  it('finds nothing in a plain run', () => {
    expect(extraWaveTraces(arrays.slice(0, 2))).toEqual([])
  })
})
