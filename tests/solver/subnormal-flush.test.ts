// The flush of amplitudes below 1e-150 to zero (solver/steppers/subnormal-flush.ts, docs/numerics.md "Subnormal
// flush"). IEEE 754 binary64 facts (common practice): the smallest normal double is 2⁻¹⁰²² = 2.2250738585072014e-308,
// nonzero magnitudes below it are subnormal, and the smallest subnormal 2⁻¹⁰⁷⁴ times a factor just below 1 rounds back
// to itself. The interval rule is checked by repeated multiplication in doubles; a long free decay of the acoustic
// field is run on every engine with and without the flush: without it subnormals remain in the state, with it none,
// the engines agree bit for bit, and the port traces and figures equal the unflushed run's to 1e-12 of their peak.
import { describe, expect, it } from 'vitest'
import { planGrid, SimulationRun } from '../../solver/driver'
import { NetworkRun } from '../../solver/network/network-run'
import { fastestDecayNepers, FLUSH_THRESHOLD, flushInterval, flushTiny, flushValue, HEADROOM_NEPERS, MAX_FLUSH_INTERVAL, SMALLEST_NORMAL } from '../../solver/steppers/subnormal-flush'
import { chipConfig, gaussian } from './chip-fixtures'

const isSubnormal = (x: number) => x !== 0 && Math.abs(x) < SMALLEST_NORMAL
const countSubnormal = (arrays: Float64Array[]) => arrays.reduce((k, a) => k + a.filter(isSubnormal).length, 0)

describe('subnormal flush: the interval rule', () => {
  it('the smallest normal is 2⁻¹⁰²², and the smallest subnormal does not decay under a factor just below 1', () => {
    expect(SMALLEST_NORMAL).toBe(2 ** -1022)
    expect(isSubnormal(SMALLEST_NORMAL / 2)).toBe(true)
    expect(5e-324 * 0.99).toBe(5e-324)
  })

  it('a value at the threshold decaying at the fastest rate stays normal over one interval, and the headroom is the real bound', () => {
    for (const d of [1e-4, 0.05, 0.0737, 0.7, 3, 30, 181]) {
      const n = flushInterval(d)
      expect(n).toBe(Math.max(1, Math.min(MAX_FLUSH_INTERVAL, Math.floor(HEADROOM_NEPERS / (2 * d)))))
      const f = Math.exp(-d)
      let x = FLUSH_THRESHOLD
      for (let k = 0; k < n; k++) x *= f
      expect(x).toBeGreaterThanOrEqual(SMALLEST_NORMAL)
      // Decaying for ⌈H/d⌉ + 1 steps instead takes it into the subnormal range (or to 0): the bound is H, not arbitrary.
      let y = FLUSH_THRESHOLD
      for (let k = 0; k < Math.ceil(HEADROOM_NEPERS / d) + 1; k++) y *= f
      expect(Math.abs(y)).toBeLessThan(SMALLEST_NORMAL)
    }
    expect(HEADROOM_NEPERS).toBeCloseTo(Math.log(1e-150) + 1022 * Math.LN2, 12)
  })

  it('the fastest decay reads only factors in (0, 1); no decay gives the longest interval, a fast one a flush every step', () => {
    expect(fastestDecayNepers([1, Math.exp(-0.2), 0, Math.exp(-0.05), 1.5])).toBeCloseTo(0.2, 14)
    expect(flushInterval(fastestDecayNepers([1, 1]))).toBe(MAX_FLUSH_INTERVAL)
    expect(flushInterval(500)).toBe(1)
  })

  it('flushes nonzero |x| < 1e-150 and subnormals to +0; keeps the threshold itself, zeros with their sign, and NaN', () => {
    const a = new Float64Array([1e-151, -1e-200, 5e-324, -5e-324, 1e-150, -1e-150, -0, 0, NaN, 1, -Infinity])
    flushTiny([a])
    expect(Array.from(a)).toEqual([0, 0, 0, 0, 1e-150, -1e-150, -0, 0, NaN, 1, -Infinity])
    expect(Object.is(a[6], -0)).toBe(true)
    expect(Object.is(a[1], 0)).toBe(true)
    expect(flushValue(-3e-170)).toBe(0)
    expect(flushValue(2e-150)).toBe(2e-150)
  })
})

// A pump pulse crosses a CW Stokes seed in a lossy chip with a 1 GHz linewidth; for the 250 ns after it the acoustic
// field decays freely by e^{−Γ_B t/2} ≈ e^{−785}, from ~1e-6 through the whole subnormal range.
const VG = 299_792_458 / 2.44
const decay = chipConfig({
  windowNs: 250,
  waveguide: { linewidthMHz: 1000, lossDbPerM: 30 },
  grid: { timeStepPs: (0.05 / (VG * 24)) * 1e12, mapRows: 16, mapCols: 16 },
  options: { errorEstimate: false },
  channels: [{ pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { backgroundPowerW: 1e-3 } }],
})

function run(options: ConstructorParameters<typeof SimulationRun>[2]) {
  const r = new SimulationRun(decay, planGrid(decay), options)
  r.advance(r.model.nt + 1)
  expect(r.done).toBe(true)
  return r
}
const stateOf = (r: SimulationRun) => [r.state.uRe, r.state.uIm, r.state.vRe, r.state.vIm, r.state.bRe, r.state.bIm]

function maxDiffOverPeak(a: Float64Array, b: Float64Array): number {
  let peak = 0, diff = 0
  for (let i = 0; i < a.length; i++) (peak = Math.max(peak, Math.abs(b[i]))), (diff = Math.max(diff, Math.abs(a[i] - b[i])))
  return diff / peak
}

describe('subnormal flush: a long free decay', () => {
  it('without the flush subnormals remain; with it none, on the TypeScript and WebAssembly engines, two threads and the general kernel; the engines bit for bit alike', () => {
    const plain = run({ engine: 'ts', subnormalFlush: false })
    expect(countSubnormal(stateOf(plain))).toBeGreaterThan(0)
    const ts = run({ engine: 'ts' })
    expect(ts.flushEvery).toBeGreaterThan(1)
    const engines = [ts, run({ engine: 'wasm', threads: 1 }), run({ engine: 'wasm', threads: 2 })]
    expect(engines[2].threads).toBe(2)
    // The general reference kernel is flushed by the same loop (its own bits are compared in flat-kernels.test.ts).
    expect(countSubnormal(stateOf(run({ engine: 'ts', forceGeneralKernel: true })))).toBe(0)
    for (const r of engines) {
      expect(countSubnormal(stateOf(r))).toBe(0)
      for (const [k, a] of stateOf(r).entries()) expect(a.every((x, i) => Object.is(x, stateOf(ts)[k][i]))).toBe(true)
      for (const key of ['pumpOut', 'stokesOut'] as const) expect(r.traces[0][key].every((x, i) => Object.is(x, ts.traces[0][key][i]))).toBe(true)
    }
    for (const key of ['pumpOut', 'stokesOut'] as const) expect(maxDiffOverPeak(ts.traces[0][key], plain.traces[0][key])).toBeLessThan(1e-12)
    const f = ts.figures(0).channels[0], g = plain.figures(0).channels[0]
    for (const key of Object.keys(g) as (keyof typeof g)[])
      if (typeof g[key] === 'number') expect(f[key] as number).toBeCloseTo(g[key] as number, 12)
    engines.forEach((r) => r.close())
  })

  it('the multi-wave solver: no subnormal left with the flush, some without, port traces equal to 1e-12 of their peak', () => {
    const grid = planGrid(decay)
    const [flushed, plain] = [true, false].map((subnormalFlush) => {
      const r = new NetworkRun(decay, grid, { subnormalFlush })
      r.advance(grid.nt + 1)
      return r
    })
    const arrays = (r: NetworkRun) => [...r.wave.aRe, ...r.wave.aIm, ...r.wave.bRe, ...r.wave.bIm]
    expect(countSubnormal(arrays(plain))).toBeGreaterThan(0)
    expect(countSubnormal(arrays(flushed))).toBe(0)
    for (let k = 0; k < flushed.waveOut.length; k++) expect(maxDiffOverPeak(flushed.waveOut[k], plain.waveOut[k])).toBeLessThan(1e-12)
  })
})

describe('subnormal flush: two threads at chunk edges', () => {
  it('a field near the threshold on 1201 cells (three chunks) flushes to the same bits on one and two threads and the TypeScript engine', () => {
    const config = chipConfig({
      windowNs: 3,
      waveguide: { lossDbPerM: 30 },
      grid: { timeStepPs: (0.05 / (VG * 1201)) * 1e12, mapRows: 16, mapCols: 16 },
      options: { errorEstimate: false },
      channels: [{ pump: { pulses: [gaussian(1, 1.5, 0.3)] }, stokes: { backgroundPowerW: 1e-3 } }],
    })
    const start = (options: ConstructorParameters<typeof SimulationRun>[2]) => {
      const r = new SimulationRun(config, planGrid(config), options)
      // Every value of the state within a factor 2 of the threshold, either sign: each flush then clears some of them
      // everywhere, chunk edges included.
      let x = 12345
      for (const a of stateOf(r)) for (let j = 0; j < a.length; j++) {
        x = (Math.imul(x, 1103515245) + 12345) >>> 0
        a[j] = (x & 1 ? 1 : -1) * FLUSH_THRESHOLD * 2 ** ((x / 2 ** 32) * 2 - 1)
      }
      r.advance(600)
      return r
    }
    const ts = start({ engine: 'ts' })
    const unflushed = start({ engine: 'wasm', threads: 2, subnormalFlush: false })
    expect(ts.flushEvery).toBeLessThan(600)
    for (const r of [start({ engine: 'wasm', threads: 1 }), start({ engine: 'wasm', threads: 2 })]) {
      for (const [k, a] of stateOf(r).entries()) expect(a.every((v, i) => Object.is(v, stateOf(ts)[k][i]))).toBe(true)
      r.close()
    }
    expect(stateOf(unflushed)[4].every((v, i) => Object.is(v, ts.state.bRe[i]))).toBe(false)
    unflushed.close()
  })
})
