import { describe, expect, it } from 'vitest'
import { SimulationConfig, type SimulationConfigInput } from './simulation-config'
import {
  CELL_UPDATES_PER_S_SVEA,
  checkLimits,
  DEFAULT_RESOURCE_LIMITS,
  estimateResources,
  SPEED_FACTOR_HIGHER_ORDER,
  STATE_BYTES_PER_CELL,
} from './resource-estimate'

const config = (over: Partial<SimulationConfigInput> = {}) =>
  SimulationConfig.parse({
    waveguide: { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 7e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }],
    windowNs: 150,
    ...over,
  })

describe('estimateResources', () => {
  it('counts cell-updates as N_ch·N_nodes·N_samples·N_real (physics.md §4), nodes = nz + 1, samples = nt + 1', () => {
    const two = config({ channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }] })
    const e = estimateResources(two, { dtS: 5e-12, nz: 2000, nt: 20000 }, 3)
    expect(e.cellUpdates).toBe(2 * 2001 * 20001 * 3)
    expect(e.expectedSeconds).toBeCloseTo(e.cellUpdates / CELL_UPDATES_PER_S_SVEA, 9)
  })

  it('keeps memory O(N_z) for state and O(N_t) for traces, never O(N_z·N_t)', () => {
    const c = config()
    const a = estimateResources(c, { dtS: 5e-12, nz: 1000, nt: 10000 })
    const b = estimateResources(c, { dtS: 5e-12, nz: 2000, nt: 20000 })
    expect(b.memoryBytes.state / a.memoryBytes.state).toBeCloseTo(2, 2)
    expect(a.memoryBytes.state).toBe(1001 * STATE_BYTES_PER_CELL)
    // Maps are capped at mapRows × mapCols (512 × 512 by default), so they stop growing.
    expect(b.memoryBytes.maps).toBe(a.memoryBytes.maps)
    expect(b.memoryBytes.total).toBeLessThan(2.1 * a.memoryBytes.total)
  })

  it('assumes a slower throughput with the higher-order term', () => {
    const e = estimateResources(config({ options: { higherOrderAcoustic: true } }), { dtS: 5e-12, nz: 100, nt: 100 })
    expect(e.cellUpdatesPerS).toBe(CELL_UPDATES_PER_S_SVEA * SPEED_FACTOR_HIGHER_ORDER)
  })
})

describe('checkLimits', () => {
  it('accepts a run under the default limits', () => {
    expect(checkLimits(estimateResources(config(), { dtS: 5e-12, nz: 8000, nt: 40000 }))).toEqual({ ok: true })
  })

  it('refuses 4e10 cell-updates and proposes a halved window, a step √2 coarser and a halved guide', () => {
    const e = estimateResources(config({ windowNs: 1000 }), { dtS: 10e-12, nz: 99_999, nt: 399_999 })
    const r = checkLimits(e)
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.message).toMatch(/4\.00e\+10 cell-updates/)
    expect(r.message).toMatch(/window from 1\.00e\+3 ns to ≤ 500 ns/)
    expect(r.message).toMatch(/≥ 14\.1 ps instead of 10\.0 ps/)
    expect(r.message).toMatch(/≤ 0\.0250 m instead of 0\.0500 m/)
  })

  it('does not propose a coarser step beyond 1/(20 ν_B) with the higher-order term', () => {
    const e = estimateResources(config({ options: { higherOrderAcoustic: true } }), { dtS: 6e-12, nz: 100_000, nt: 400_000 })
    const r = checkLimits(e)
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.message).not.toMatch(/coarser time step/)
  })

  it('proposes fewer channels when that is enough', () => {
    const c = config({ channels: [0, 5, 10, 15].map((offsetGHz) => ({ offsetGHz })) })
    const r = checkLimits(estimateResources(c, { dtS: 5e-12, nz: 9_999, nt: 999_999 })) // 4e10
    expect(r.ok).toBe(false)
    if (!r.ok) expect(r.message).toMatch(/use 2 channels instead of 4/)
  })

  it('refuses a run whose traces exceed the memory limit and names the window', () => {
    const e = estimateResources(config(), { dtS: 5e-12, nz: 10, nt: 50_000_000 })
    const r = checkLimits(e, { ...DEFAULT_RESOURCE_LIMITS, maxCellUpdates: 1e12 })
    expect(r.ok).toBe(false)
    if (!r.ok) {
      expect(r.reasons).toHaveLength(1)
      expect(r.message).toMatch(/traces dominate: shorten the window/)
    }
  })
})
