import { describe, expect, it } from 'vitest'
import { runKeyFigure } from './runs'
import type { ChannelFigures, FiguresOfMerit } from '../physics/simulation-result'

const channel = (over: Partial<ChannelFigures>): ChannelFigures => ({
  channel: 0,
  scheme: 'other',
  energyJ: { pumpIn: 1e-12, stokesIn: 1e-12, pumpOut: 1e-12, stokesOut: 1e-12 },
  peakStokesGainDb: null,
  reflectivity: null,
  pumpDelayNs: null,
  stokesDelayNs: null,
  pumpOutFwhmNs: null,
  stokesOutFwhmNs: null,
  manleyRoweResidual: null,
  retrievalEfficiency: null,
  retrievedPhaseRad: null,
  readWindowNs: null,
  leakThrough: null,
  retrievalWindow: null,
  notDetermined: [],
  ...over,
})
const figures = (c: ChannelFigures): FiguresOfMerit => ({ channels: [c], windows: [], wallTimeS: 1, cellUpdatesPerS: 1 })

describe('runKeyFigure', () => {
  it('prefers retrieval (a storage run), then Stokes gain, then reflectivity; energy ratios as fractions, as everywhere else', () => {
    expect(runKeyFigure(figures(channel({ retrievalEfficiency: 0.0939, peakStokesGainDb: 3, reflectivity: 0.2 })))).toEqual({ label: 'retrieval', value: 0.0939, unit: '' })
    expect(runKeyFigure(figures(channel({ peakStokesGainDb: 3.25, reflectivity: 0.2 })))).toEqual({ label: 'Stokes gain', value: 3.25, unit: 'dB' })
    expect(runKeyFigure(figures(channel({ reflectivity: 0.25 })))).toEqual({ label: 'reflectivity', value: 0.25, unit: '' })
  })

  it('has nothing to show for a run without figures', () => {
    expect(runKeyFigure(null)).toBeNull()
    expect(runKeyFigure(figures(channel({})))).toBeNull()
  })
})
