// The estimate's time from this server's measured speeds (speed-calibration.ts) or, without them, from the
// benchmark figures: the right class is used, too few runs fall back, and the basis says which.
import { describe, expect, it } from 'vitest'
import { SimulationConfig, type SimulationConfigInput } from './simulation-config'
import { chooseGrid } from './grid-step'
import { BENCHMARK_FAST_FACTOR, BENCHMARK_SLOW_FACTOR, benchmarkSpeed, RECENT_RUNS_MARGIN, SPEED_FACTOR_WASM_ENGINE, estimateResources, predictKernel, timeBasisSentence } from './resource-estimate'
import { MIN_CALIBRATION_RUNS, type KernelSpeed, type SpeedCalibration } from './speed-calibration'
import type { KernelClass } from './kernel-class'

const config = (over: Partial<SimulationConfigInput> = {}) =>
  SimulationConfig.parse({
    waveguide: { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 7e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }],
    windowNs: 150,
    ...over,
  })

const speed = (kernel: KernelClass, perS: number, runs = 12, newestAt = '2026-12-03T10:00:00.000Z'): KernelSpeed => ({
  kernel,
  cellUpdatesPerS: perS,
  slowPerS: perS / 2,
  fastPerS: perS * 1.25,
  runs,
  newestAt,
})
const wasmPlain: KernelClass = { engine: 'wasm', threads: 1, path: 'plain' }
const tsNoise: KernelClass = { engine: 'ts', threads: 1, path: 'noise' }

describe('estimate calibrated by measured speeds', () => {
  it('takes the measured speed of the run’s own kernel class, and says so', () => {
    const c = config()
    const g = chooseGrid(c)
    const cal: SpeedCalibration = { kernels: [speed(tsNoise, 5e6), speed(wasmPlain, 55e6)] }
    const e = estimateResources(c, g, 1, cal)
    expect(predictKernel(c, g)).toEqual(wasmPlain)
    expect(e.cellUpdatesPerS).toBe(55e6)
    expect(e.expectedSeconds).toBeCloseTo(e.cellUpdates / 55e6, 12)
    expect(e.timeBasis).toMatchObject({ source: 'recent-runs', runs: 12, kernel: wasmPlain })
    // Range: the fast and slow ends of the measured speeds (here 1.25× and 0.5×), at least RECENT_RUNS_MARGIN either way.
    expect(e.timeBasis.fastSeconds).toBeCloseTo(e.cellUpdates / (55e6 * RECENT_RUNS_MARGIN), 12)
    expect(e.timeBasis.slowSeconds).toBeCloseTo(e.cellUpdates / (55e6 / 2), 12)
    // A noise run of the same grid takes the noise class's speed.
    const noisy = config({ options: { noise: { enabled: true } } })
    expect(estimateResources(noisy, g, 1, cal).cellUpdatesPerS).toBe(5e6)
  })

  it('falls back to the benchmark figures without history, with too few runs, or for another class only', () => {
    const c = config()
    const g = chooseGrid(c)
    const bench = benchmarkSpeed(c, g)
    for (const cal of [undefined, null, { kernels: [] }, { kernels: [speed(wasmPlain, 55e6, MIN_CALIBRATION_RUNS - 1)] }, { kernels: [speed(tsNoise, 5e6)] }]) {
      const e = estimateResources(c, g, 1, cal)
      expect(e.cellUpdatesPerS).toBe(bench)
      expect(e.timeBasis).toMatchObject({ source: 'benchmark', runs: 0, kernel: wasmPlain })
      expect(e.timeBasis.fastSeconds).toBeCloseTo(e.expectedSeconds * BENCHMARK_FAST_FACTOR, 9)
      expect(e.timeBasis.slowSeconds).toBeCloseTo(e.expectedSeconds * BENCHMARK_SLOW_FACTOR, 9)
    }
  })

  it('scales a multi-wave class’s speed (plain-scheme cell-updates) to the run’s envelopes', () => {
    const wg = config().waveguide
    const c = config({ waveguide: { ...wg, forwardResonances: [{ frequencyMHz: 2000, linewidthMHz: 80, gainCoefficientMPerW: 3e-10, antiStokesMismatchPerM: 40 }] } })
    const g = chooseGrid(c)
    const e = estimateResources(c, g, 1, { kernels: [speed({ engine: 'ts', threads: 1, path: 'network' }, 30e6)] })
    expect(e.timeBasis.source).toBe('recent-runs')
    expect(e.cellUpdatesPerS).toBeCloseTo((30e6 * 3) / (e.waves + e.acousticFields), 3)
    expect(e.waves + e.acousticFields).toBeGreaterThan(3)
  })

  it('for a two-thread run with no two-thread history, takes the newest one-thread history of the class', () => {
    const c = config({ waveguide: { ...config().waveguide, lengthM: 20 }, windowNs: 400, grid: { timeStepPs: 8 }, options: { errorEstimate: false } })
    const g = chooseGrid(c)
    const k = predictKernel(c, g)
    expect(k).toEqual({ engine: 'wasm', threads: 2, path: 'plain' })
    const e = estimateResources(c, g, 1, { kernels: [speed(wasmPlain, 50e6)] })
    expect(e.timeBasis).toMatchObject({ source: 'recent-runs', kernel: wasmPlain })
    const both = estimateResources(c, g, 1, { kernels: [speed(wasmPlain, 50e6, 12, '2026-12-03T09:00:00.000Z'), speed(k, 80e6, 4, '2026-12-03T11:00:00.000Z')] })
    expect(both.cellUpdatesPerS).toBe(80e6)
  })

  it('states the basis in words, with no internal names', () => {
    const c = config()
    const g = chooseGrid(c)
    const fmt = (s: number) => `${s.toFixed(1)} s`
    const measured = timeBasisSentence(estimateResources(c, g, 1, { kernels: [speed(wasmPlain, 55e6)] }).timeBasis, fmt)
    expect(measured).toMatch(/^Measured on this server: the speed of its last 12 runs of the same kind \(WebAssembly engine, plain scheme, 1 thread\); between [\d.]+ s and [\d.]+ s\.$/)
    const bench = timeBasisSentence(estimateResources(c, g).timeBasis, fmt)
    expect(bench).toMatch(/^From the benchmark figures/)
    expect(bench).not.toMatch(/wasm|ts\/|recent-runs|kernel/)
  })

  it('on a server whose solver threads are set to the TypeScript engine, predicts and calibrates the TypeScript class', () => {
    const c = config()
    const g = chooseGrid(c)
    const tsPlain: KernelClass = { engine: 'ts', threads: 1, path: 'plain' }
    expect(predictKernel(c, g, 'ts')).toEqual(tsPlain)
    // Without history: the benchmark figures without the WebAssembly factor.
    const bench = estimateResources(c, g, 1, { kernels: [], engine: 'ts' })
    expect(bench.timeBasis).toMatchObject({ source: 'benchmark', kernel: tsPlain })
    expect(bench.cellUpdatesPerS).toBe(benchmarkSpeed(c, g, 'ts'))
    expect(benchmarkSpeed(c, g) / benchmarkSpeed(c, g, 'ts')).toBe(SPEED_FACTOR_WASM_ENGINE)
    // With history of both engines, the TypeScript one counts.
    const e = estimateResources(c, g, 1, { kernels: [speed(wasmPlain, 90e6), speed(tsPlain, 45e6)], engine: 'ts' })
    expect(e.cellUpdatesPerS).toBe(45e6)
  })
})
