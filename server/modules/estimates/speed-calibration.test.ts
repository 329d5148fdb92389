// The speed calibration against hand-computed medians and quantiles of made-up observations (no timing: the
// wall and CPU times are inputs here). The median and the linear-interpolation quantile are the textbook
// definitions (common practice; numpy.quantile's default "linear" method).
import { describe, expect, it } from 'vitest'
import type { KernelClass } from '@shared/physics/kernel-class'
import { calibrate, kernelSpeed, MIN_WALL_S, type CostObservation } from './speed-calibration'

const wasmPlain: KernelClass = { engine: 'wasm', threads: 1, path: 'plain' }
const tsNoise: KernelClass = { engine: 'ts', threads: 1, path: 'noise' }
const t0 = Date.parse('2026-12-01T12:00:00Z')

/** A run of `speedM` M cell-updates/s that took `wallS`, `minutesAgo` before t0+1 day; its thread busy all along unless cpuS is given. */
function obs(kernel: KernelClass, speedM: number, minutesAgo: number, over: Partial<CostObservation> = {}): CostObservation {
  const wallS = over.wallS ?? 4
  return { kernel, cellUpdates: speedM * 1e6 * wallS, envelopeRatio: 1, wallS, cpuS: wallS, at: new Date(t0 + 86_400_000 - minutesAgo * 60_000), ...over }
}

describe('speed calibration', () => {
  it('gives each kernel class its own speed, from its own runs only', () => {
    const c = calibrate([obs(wasmPlain, 80, 1), obs(tsNoise, 10, 2), obs(wasmPlain, 80, 3), obs(tsNoise, 10, 4), obs(wasmPlain, 80, 5)])
    const plain = c.kernels.find((k) => k.kernel.engine === 'wasm')!
    const noise = c.kernels.find((k) => k.kernel.path === 'noise')!
    expect(c.kernels).toHaveLength(2)
    expect(plain).toMatchObject({ cellUpdatesPerS: 80e6, runs: 3, kernel: wasmPlain })
    expect(noise).toMatchObject({ cellUpdatesPerS: 10e6, runs: 2, kernel: tsNoise })
    expect(plain.newestAt).toBe(new Date(t0 + 86_400_000 - 60_000).toISOString())
  })

  it('leaves out a paused run (its thread computed a fraction of its wall time) and a stalled one (3× off the median)', () => {
    const steady = [40, 42, 44, 46, 48].map((s, i) => obs(wasmPlain, s, 10 + i))
    // Paused: 2 s of CPU in 60 s of wall time, a speed of 4 M/s the machine never had.
    const paused = obs(wasmPlain, 4, 1, { wallS: 60, cpuS: 2 })
    // Stalled without a CPU figure (the system gave none): caught by its distance from the median.
    const stalled = obs(wasmPlain, 5, 2, { cpuS: null })
    const s = kernelSpeed([paused, stalled, ...steady])!
    expect(s.runs).toBe(5)
    expect(s.slowPerS).toBeGreaterThanOrEqual(40e6)
    expect(s.cellUpdatesPerS).toBeGreaterThanOrEqual(40e6)
    expect(s.cellUpdatesPerS).toBeLessThanOrEqual(48e6)
  })

  it('ignores runs too short to show the speed', () => {
    const short = obs(wasmPlain, 1, 0, { wallS: MIN_WALL_S / 2 })
    expect(kernelSpeed([short])).toBeNull()
    expect(kernelSpeed([short, obs(wasmPlain, 30, 5)])!.cellUpdatesPerS).toBe(30e6)
  })

  it('weights recent runs more: a machine that became busy is seen before half the history has turned', () => {
    // 8 old fast runs, then 6 new slow ones: the plain median (8 of 14 fast) says fast, the weighted one slow.
    const old = Array.from({ length: 8 }, (_, i) => obs(wasmPlain, 60, 100 + i))
    const recent = Array.from({ length: 6 }, (_, i) => obs(wasmPlain, 30, i))
    const s = kernelSpeed([...old, ...recent])!
    expect(s.cellUpdatesPerS).toBe(30e6)
    // The range covers both regimes: 10th and 90th percentile of [30×6, 60×8].
    expect(s.slowPerS).toBe(30e6)
    expect(s.fastPerS).toBe(60e6)
  })

  it('counts a multi-wave run in plain-scheme cell-updates (× envelopes / 3)', () => {
    const net: KernelClass = { engine: 'ts', threads: 1, path: 'network' }
    const s = kernelSpeed([obs(net, 10, 0, { envelopeRatio: 5 / 3 })])!
    expect(s.cellUpdatesPerS).toBeCloseTo((10e6 * 5) / 3, 0)
  })

  it('interpolates the range linearly between the kept speeds (10th and 90th percentile)', () => {
    const s = kernelSpeed([10, 20, 30, 40, 50].map((v, i) => obs(tsNoise, v, i)))!
    // Sorted [10..50]: q = 0.1 → index 0.4 → 14; q = 0.9 → index 3.6 → 46.
    expect(s.slowPerS).toBeCloseTo(14e6, 0)
    expect(s.fastPerS).toBeCloseTo(46e6, 0)
  })
})
