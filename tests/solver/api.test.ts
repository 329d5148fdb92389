// The solver's public door: progress, frames, cancellation, refusal of bad input, agreement of the fast
// kernel with the general one (common practice: a fast implementation checked against a reference one).
import { describe, expect, it } from 'vitest'
import { simulate, simulateSync } from '../../solver/index'
import { SimulationManifest } from '@shared/physics/simulation-result'
import { chipConfig, gaussian, CHIP_WAVEGUIDE } from './chip-fixtures'

const pulsed = () => chipConfig({ windowNs: 6, channels: [{ pump: { pulses: [gaussian(1, 2, 0.3)] }, stokes: { pulses: [gaussian(0.05, 2, 0.3, undefined)] } }] })

describe('simulate()', () => {
  it('reports progress at least every 1 % and hands out every map row once, in order', async () => {
    const fractions: number[] = []
    let nextRow = 0
    const r = await simulate(pulsed(), {
      onProgress: (f) => fractions.push(f),
      onFrame: (fr) => {
        expect(fr.rowStart).toBe(nextRow)
        expect(fr.maps.pumpPowerW.length).toBe(fr.rowCount * fr.cols)
        nextRow += fr.rowCount
      },
    })
    expect(r.status).toBe('finished')
    expect(nextRow).toBe(r.manifest.grid!.mapRows)
    expect(fractions.at(-1)).toBe(1)
    for (let i = 1; i < fractions.length; i++) expect(fractions[i] - fractions[i - 1]).toBeLessThanOrEqual(0.01 + 1e-12)
    expect(fractions[0]).toBeLessThanOrEqual(0.01)
  })

  it('stops promptly with status "aborted" when the signal fires', async () => {
    // A CW run of ≈ 1.7e8 cell updates that would take several seconds.
    const big = chipConfig({ windowNs: 3000, channels: [{ pump: { backgroundPowerW: 0.5 }, stokes: { backgroundPowerW: 1e-3 } }] })
    const ctl = new AbortController()
    let firedAt = 0
    setTimeout(() => {
      firedAt = performance.now()
      ctl.abort()
    }, 150)
    const r = await simulate(big, { signal: ctl.signal })
    const lag = performance.now() - firedAt
    expect(r.status).toBe('aborted')
    expect(lag).toBeLessThan(100)
    expect(r.manifest.figures).toBeNull()
  })

  it('stops through shouldAbort() in the synchronous form', () => {
    let calls = 0
    const r = simulateSync(pulsed(), { shouldAbort: () => ++calls > 3 })
    expect(r.status).toBe('aborted')
  })

  it('refuses bad configurations with field paths and returns no arrays (never NaN)', () => {
    const bad = [
      { waveguide: { ...CHIP_WAVEGUIDE, lengthM: -1 }, channels: [{}], windowNs: 5 },
      { waveguide: { ...CHIP_WAVEGUIDE, lengthM: 0 }, channels: [{}], windowNs: 5 },
      { waveguide: { ...CHIP_WAVEGUIDE, groupIndex: NaN }, channels: [{}], windowNs: 5 },
      { waveguide: CHIP_WAVEGUIDE, channels: [{ pump: { pulses: [gaussian(1, 50, 0.3)] } }], windowNs: 5 },
      { waveguide: CHIP_WAVEGUIDE, channels: [{ pump: { pulses: [gaussian(1, 2, 0.3)] } }], windowNs: 5, grid: { timeStepPs: 400 } },
    ]
    const paths = ['waveguide.lengthM', 'waveguide.lengthM', 'waveguide.groupIndex', 'channels.0.pump.pulses.0.centreNs', 'grid.timeStepPs']
    bad.forEach((cfg, i) => {
      const r = simulateSync(cfg as never)
      expect(r.status).toBe('failed')
      expect(r.manifest.issues.map((x) => x.path)).toContain(paths[i])
      expect(Object.keys(r.arrays)).toHaveLength(0)
    })
  })

  it('refuses a run over the solver limits, naming the knob', () => {
    const r = simulateSync(chipConfig({ windowNs: 1e7, grid: { timeStepPs: 0.01 }, waveguide: { lengthM: 1000 } }))
    expect(r.status).toBe('failed')
    expect(r.message).toMatch(/limits/)
    expect(r.manifest.issues.length).toBeGreaterThan(0)
  })

  it('produces a manifest that parses with the shared schema and describes every array', () => {
    const r = simulateSync(pulsed())
    const m = SimulationManifest.parse(JSON.parse(JSON.stringify(r.manifest)))
    for (const d of m.arrays) {
      const n = d.shape.reduce((a, b) => a * b, 1) * (d.dtype === 'c16' ? 2 : 1)
      expect(r.arrays[d.name].length).toBe(n)
      for (const x of r.arrays[d.name]) if (!Number.isFinite(x)) throw new Error(`${d.name} has a non-finite value`)
    }
  })

  it('fast single-channel kernel and general kernel agree to round-off', () => {
    const a = simulateSync(pulsed()).channels[0]
    const b = simulateSync(pulsed(), { forceGeneralKernel: true }).channels[0]
    let e = 0, s = 0
    for (let i = 0; i < a.stokesOut.length; i++) (e = Math.max(e, Math.abs(a.stokesOut[i] - b.stokesOut[i]))), (s = Math.max(s, Math.abs(a.stokesOut[i])))
    expect(e / s).toBeLessThan(1e-12)
  })

  it('retrieval figures are null unless pulses are labelled data and read', () => {
    expect(simulateSync(pulsed()).manifest.figures!.channels[0].retrievalEfficiency).toBeNull()
  })
})
