// The multi-wave solver (solver/network/) run on a plain pump–Stokes configuration against the plain kernel
// (solver/steppers/interaction-kernel.ts): two independent implementations of the same equations and scheme
// (Agrawal, Nonlinear Fiber Optics, ch. 9; method of characteristics, Damzen et al. 2003, §3.4) must agree
// to round-off, sample by sample.
import { describe, expect, it } from 'vitest'
import { planGrid, SimulationRun } from '../../solver/driver'
import { simulateSync } from '../../solver/index'
import { NetworkRun } from '../../solver/network/network-run'
import { chipConfig, gaussian } from './chip-fixtures'

function maxRelDiff(a: Float64Array, b: Float64Array): number {
  let peak = 0, diff = 0
  for (let i = 0; i < a.length; i++) (peak = Math.max(peak, Math.abs(a[i]))), (diff = Math.max(diff, Math.abs(a[i] - b[i])))
  return diff / peak
}

describe('multi-wave solver on a plain configuration', () => {
  it.each([
    ['lossless, detuned, colliding pulses', { lossDbPerM: 0 }, 20],
    ['lossy, CW Stokes seed', { lossDbPerM: 30 }, 0],
  ])('%s: port traces and final acoustic field equal the plain kernel to 1e-12 (relative to their peak)', (_, waveguide, detuningMHz) => {
    const config = chipConfig({
      windowNs: 4,
      detuningMHz,
      waveguide,
      options: { errorEstimate: false },
      channels: [{ pump: { pulses: [gaussian(2, 1.2, 0.2)], backgroundPowerW: 0.02 }, stokes: { pulses: [gaussian(0.05, 1.5, 0.2)], backgroundPowerW: 1e-3 } }],
    })
    const grid = planGrid(config)
    const plain = new SimulationRun(config, grid, { engine: 'ts' })
    const net = new NetworkRun(config, grid)
    plain.advance(grid.nt + 1)
    net.advance(grid.nt + 1)
    expect(plain.done && net.done).toBe(true)
    expect(maxRelDiff(plain.traces[0].pumpOut, net.traces[0].pumpOut)).toBeLessThan(1e-12)
    expect(maxRelDiff(plain.traces[0].stokesOut, net.traces[0].stokesOut)).toBeLessThan(1e-12)
    const joined = (re: Float64Array, im: Float64Array) => Float64Array.from([...re, ...im])
    expect(maxRelDiff(joined(plain.state.bRe, plain.state.bIm), joined(net.state.bRe, net.state.bIm))).toBeLessThan(1e-12)
    // The pump really depleted and the Stokes really grew: the comparison is not between two idle runs.
    const f = plain.figures(0).channels[0].energyJ
    const lossOnly = Math.pow(10, -(waveguide.lossDbPerM * 0.05) / 10)
    expect(f.stokesOut / f.stokesIn).toBeGreaterThan(1.05 * lossOnly)
  })

  it('storage (V7 of docs/validation.md) with a dark co-propagating probe: retrieval figures and the reference run without the read pulse equal the plain run', () => {
    const channel = { pump: { pulses: [gaussian(0.01, 1, 0.1, 'data')] }, stokes: { pulses: [gaussian(10, 1, 0.1, 'write'), gaussian(10, 3, 0.1, 'read')] } }
    const config = (ch: object) => chipConfig({ windowNs: 5.5, options: { errorEstimate: false }, channels: [ch] })
    const plainConfig = config(channel)
    const grid = planGrid(plainConfig)
    const plain = new SimulationRun(plainConfig, grid, { engine: 'ts' })
    const net = new NetworkRun(config({ ...channel, coProbe: { pulses: [], backgroundPowerW: 0 } }), grid)
    plain.advance(grid.nt + 1)
    net.advance(grid.nt + 1)
    expect(net.referenceTraces).not.toBeNull()
    expect(maxRelDiff(plain.referenceTraces![0].pumpOut, net.referenceTraces![0].pumpOut)).toBeLessThan(1e-12)
    expect(net.cellUpdates).toBe(plain.cellUpdates)
    const a = plain.figures(0).channels[0], b = net.figures(0).channels[0]
    expect(a.retrievalEfficiency!).toBeGreaterThan(0.05)
    for (const key of ['retrievalEfficiency', 'retrievedPhaseRad'] as const) expect(Math.abs(b[key]! / a[key]! - 1)).toBeLessThan(1e-10)
    expect(b.leakThrough).toBe(a.leakThrough)
  })

  it('with Kerr on: port traces equal the plain general kernel to 1e-12', () => {
    const config = chipConfig({
      windowNs: 4,
      waveguide: { kerrN2M2PerW: 5e-18, lossDbPerM: 10 },
      options: { kerr: true, errorEstimate: false },
      channels: [{ pump: { pulses: [gaussian(2, 1.2, 0.2)], backgroundPowerW: 0.02 }, stokes: { pulses: [gaussian(0.5, 1.5, 0.2)], backgroundPowerW: 1e-3 } }],
    })
    const grid = planGrid(config)
    const plain = new SimulationRun(config, grid, { engine: 'ts', forceGeneralKernel: true })
    const net = new NetworkRun(config, grid)
    plain.advance(grid.nt + 1)
    net.advance(grid.nt + 1)
    expect(maxRelDiff(plain.traces[0].pumpOut, net.traces[0].pumpOut)).toBeLessThan(1e-12)
    expect(maxRelDiff(plain.traces[0].stokesOut, net.traces[0].stokesOut)).toBeLessThan(1e-12)
  })

  it('cross-phase of a co-propagating probe: 2γ_probe·P_p·L plus its own γ_probe·P_probe·L (Agrawal, Nonlinear Fiber Optics, ch. 7), to 1e-5', () => {
    const config = chipConfig({
      windowNs: 3,
      waveguide: { kerrN2M2PerW: 5e-18, lossDbPerM: 0 },
      options: { kerr: true, errorEstimate: false },
      channels: [{ pump: { pulses: [], backgroundPowerW: 1 }, coProbe: { pulses: [], backgroundPowerW: 1e-3 } }],
    })
    const net = new NetworkRun(config, planGrid(config))
    net.advance(net.net.nt + 1)
    const k = net.net.set.waves.findIndex((w) => w.key === 'co_probe')
    const out = net.waveOut[k], n = out.length / 2 - 1
    const gammaProbe = (5e-18 * net.net.waves[k].omegaRadPerS) / (299_792_458 * 1e-12)
    const expected = gammaProbe * (2 * 1 + 1e-3) * 0.05
    expect(expected).toBeGreaterThan(1)
    expect(Math.abs(Math.atan2(out[2 * n + 1], out[2 * n]) / expected - 1)).toBeLessThan(1e-5)
  })

  it('with thermal noise on: the same draws give port traces and final b equal to the plain general kernel to 1e-12', () => {
    const config = chipConfig({
      windowNs: 3,
      options: { noise: { enabled: true, temperatureK: 300, seed: 11 }, errorEstimate: false },
      channels: [{ pump: { pulses: [], backgroundPowerW: 0.5 } }],
    })
    const grid = planGrid(config)
    const plain = new SimulationRun(config, grid, { engine: 'ts' })
    const net = new NetworkRun(config, grid)
    plain.advance(grid.nt + 1)
    net.advance(grid.nt + 1)
    // Spontaneous Stokes light from the thermal grating: a non-trivial output to compare.
    expect(Math.max(...plain.traces[0].stokesOut.map(Math.abs))).toBeGreaterThan(0)
    expect(maxRelDiff(plain.traces[0].stokesOut, net.traces[0].stokesOut)).toBeLessThan(1e-12)
    expect(maxRelDiff(plain.traces[0].pumpOut, net.traces[0].pumpOut)).toBeLessThan(1e-12)
    const joined = (re: Float64Array, im: Float64Array) => Float64Array.from([...re, ...im])
    expect(maxRelDiff(joined(plain.state.bRe, plain.state.bIm), joined(net.state.bRe, net.state.bIm))).toBeLessThan(1e-12)
  })

  it('dispatch: a co-propagating probe runs in the multi-wave solver; forcing the WebAssembly engine on it is refused, naming the engine', () => {
    const config = chipConfig({ windowNs: 2, options: { errorEstimate: false }, channels: [{ pump: { pulses: [], backgroundPowerW: 0.01 }, coProbe: { pulses: [], backgroundPowerW: 1e-6 } }] })
    const ok = simulateSync(config)
    expect(ok.status).toBe('finished')
    expect(ok.manifest.arrays.map((a) => a.name)).toContain('wave_co_probe_out')
    const refused = simulateSync(config, { engine: 'wasm' })
    expect(refused.status).toBe('failed')
    expect(refused.manifest.issues.map((i) => i.path)).toEqual(['engine'])
  })
})
