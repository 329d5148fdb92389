// The multi-wave solver (solver/network/) run on a plain pump–Stokes configuration against the plain kernel
// (solver/steppers/interaction-kernel.ts): two independent implementations of the same equations and scheme
// (Agrawal, Nonlinear Fiber Optics, ch. 9; method of characteristics, Damzen et al. 2003, §3.4) must agree
// to round-off, sample by sample.
import { describe, expect, it } from 'vitest'
import { planGrid, SimulationRun } from '../../solver/driver'
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
})
