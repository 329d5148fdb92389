import { describe, expect, it } from 'vitest'
import { SimulationConfig, type SimulationConfigInput } from './simulation-config'
import { chooseGrid } from './grid-step'
import { MIN_WINDOW_NS } from './grid-limits'
import {
  CELL_UPDATES_PER_S_SVEA,
  checkLimits,
  DEFAULT_RESOURCE_LIMITS,
  estimateResources,
  SPEED_FACTOR_HIGHER_ORDER,
  SPEED_FACTOR_SEVERAL_CHANNELS,
  SPEED_FACTOR_WASM_ENGINE,
  SPEED_FACTOR_WAVE_NETWORK,
  STATE_BYTES_PER_CELL,
  TRACE_BYTES_PER_STEP,
} from './resource-estimate'

const config = (over: Partial<SimulationConfigInput> = {}) =>
  SimulationConfig.parse({
    waveguide: { lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 7e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34 },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }],
    windowNs: 150,
    ...over,
  })

describe('estimateResources', () => {
  it('counts cell-updates as N_ch·N_nodes·N_samples·N_real (docs/numerics.md), nodes = nz + 1, samples = nt + 1', () => {
    const two = config({ channels: [{ offsetGHz: 0 }, { offsetGHz: 5 }], options: { errorEstimate: false } })
    const e = estimateResources(two, { dtS: 5e-12, nz: 2000, nt: 20000 }, 3)
    expect(e.cellUpdates).toBe(2 * 2001 * 20001 * 3)
    // Two channels take the flat several-channel kernel (SPEED_FACTOR_SEVERAL_CHANNELS of the plain path).
    expect(e.expectedSeconds).toBeCloseTo(e.cellUpdates / (CELL_UPDATES_PER_S_SVEA * SPEED_FACTOR_SEVERAL_CHANNELS), 9)
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

  it('adds the error estimate: the same run on the grid with twice the step, about a quarter of the node-steps', () => {
    // Companion grid: Δt' = 2Δt tiles L with nz/2 cells, and nt' = ⌈T/Δt'⌉ (shared/physics/grid-step.ts tiling rule).
    const on = config({ grid: { timeStepPs: 4 } })
    const off = config({ grid: { timeStepPs: 4 }, options: { errorEstimate: false } })
    const g = chooseGrid(on)
    const a = estimateResources(on, g)
    const b = estimateResources(off, g)
    const cells = Math.ceil(g.nz / 2 - 1e-9)
    const steps = Math.ceil(150e-9 / ((g.dtS * g.nz) / cells) - 1e-9)
    expect(a.errorEstimate).toMatchObject({ cells, steps, cellUpdates: (cells + 1) * (steps + 1) })
    expect(a.errorEstimate!.timeStepPs).toBeCloseTo((g.dtS * 1e12 * g.nz) / cells, 6)
    expect(a.cellUpdates).toBe(b.cellUpdates + (cells + 1) * (steps + 1))
    expect(a.cellUpdates / b.cellUpdates).toBeGreaterThan(1.24)
    expect(a.cellUpdates / b.cellUpdates).toBeLessThan(1.27)
    expect(a.expectedSeconds / b.expectedSeconds).toBeCloseTo(a.cellUpdates / b.cellUpdates, 9)
    expect(a.memoryBytes.errorEstimate).toBeGreaterThan(0)
    expect(a.memoryBytes.total).toBe(a.memoryBytes.state + a.memoryBytes.maps + a.memoryBytes.traces + a.memoryBytes.errorEstimate)
    expect(b.errorEstimate).toBeNull()
    expect(b.memoryBytes.errorEstimate).toBe(0)
    expect(b.errorEstimateSkipped).toMatch(/switched off/)
  })

  it('adds nothing for a noise run, whose companion would draw another random field, and says why', () => {
    const c = config({ options: { noise: { enabled: true } } })
    const g = chooseGrid(c)
    const e = estimateResources(c, g)
    expect(e.errorEstimate).toBeNull()
    expect(e.cellUpdates).toBe((g.nz + 1) * (g.nt + 1))
    expect(e.errorEstimateSkipped).toMatch(/thermal noise/)
  })

  it('assumes a slower throughput with the higher-order term', () => {
    const e = estimateResources(config({ options: { higherOrderAcoustic: true } }), { dtS: 5e-12, nz: 100, nt: 100 })
    expect(e.cellUpdatesPerS).toBe(CELL_UPDATES_PER_S_SVEA * SPEED_FACTOR_HIGHER_ORDER)
  })
})

describe('the cost of further waves and acoustic fields', () => {
  // Counted by hand from the carrier list of shared/physics/wave-set.ts: pump, 1st- and 2nd-order Stokes, a
  // co-propagating probe, forward Stokes and anti-Stokes = 6 waves; 2 backward resonances × 2 orders + 1 forward
  // field = 5 acoustic fields.
  const many = config({
    waveguide: {
      lengthM: 0.05, groupIndex: 2.44, effectiveAreaUm2: 2.3, gainCoefficientMPerW: 7e-10, brillouinShiftGHz: 7.7, linewidthMHz: 34,
      additionalResonances: [{ shiftGHz: 7.9, linewidthMHz: 40, gainCoefficientMPerW: 2e-10 }],
      forwardResonances: [{ frequencyMHz: 4000, linewidthMHz: 10, gainCoefficientMPerW: 1e-10 }],
    },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 }, coProbe: { pulses: [], backgroundPowerW: 1e-6 } }],
    options: { cascade: { stokesOrders: 2, seedPowerW: 1e-9 }, errorEstimate: false },
  })
  const grid = { dtS: 5e-12, nz: 1000, nt: 10000 }

  it('counts 2 waves and 1 field for the plain pump–Stokes pair, unchanged cost (on the WebAssembly engine)', () => {
    const e = estimateResources(config({ options: { errorEstimate: false } }), grid)
    expect([e.waves, e.acousticFields]).toEqual([2, 1])
    expect(e.cellUpdatesPerS).toBe(CELL_UPDATES_PER_S_SVEA * SPEED_FACTOR_WASM_ENGINE)
    expect(e.memoryBytes.state).toBe(1001 * STATE_BYTES_PER_CELL)
  })

  it('scales state, traces and throughput with the waves and fields of the wave set', () => {
    const e = estimateResources(many, grid)
    expect([e.waves, e.acousticFields]).toEqual([6, 5])
    expect(e.memoryBytes.state).toBeCloseTo((1001 * STATE_BYTES_PER_CELL * 11) / 3, 6)
    expect(e.memoryBytes.traces).toBe(10001 * TRACE_BYTES_PER_STEP * 3 + 8 * (10001 + 1001))
    expect(e.cellUpdatesPerS).toBeCloseTo((CELL_UPDATES_PER_S_SVEA * SPEED_FACTOR_WAVE_NETWORK * 3) / 11, 6)
    // Node-steps stay the solver's count of nodes × samples; the extra envelopes cost through the throughput.
    expect(e.cellUpdates).toBe(1001 * 10001)
  })

  it('counts one field per forward resonance and drops the anti-Stokes wave when it is off', () => {
    const off = SimulationConfig.parse({ ...many, options: { ...many.options, forwardAntiStokes: false } })
    const e = estimateResources(off, grid)
    expect([e.waves, e.acousticFields]).toEqual([5, 5])
  })
})

describe('checkLimits', () => {
  it('accepts a run under the default limits', () => {
    expect(checkLimits(estimateResources(config(), { dtS: 5e-12, nz: 8000, nt: 40000 }))).toEqual({ ok: true })
  })

  it('refuses 4e10 cell-updates and proposes a halved window, a step √2 coarser and a halved guide', () => {
    const e = estimateResources(config({ windowNs: 1000, options: { errorEstimate: false } }), { dtS: 10e-12, nz: 99_999, nt: 399_999 })
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

  it('counts the error estimate against the limit and proposes switching it off when that is enough', () => {
    // Δt = 0.1 ps over L/v_g = 0.407 ns and 450 ns: 1.83e10 for the run itself (under 2e10), 2.29e10 with the companion.
    const c = config({ windowNs: 450, grid: { timeStepPs: 0.1 } })
    const e = estimateResources(c, chooseGrid(c))
    const r = checkLimits(e)
    expect(r.ok).toBe(false)
    if (r.ok) return
    expect(r.message).toMatch(/plus 4\.5\de\+9 for the error estimate on the grid with twice the step/)
    expect(r.message).toMatch(/switch off the error estimate/)
  })

  it('proposes fewer channels when that is enough', () => {
    const c = config({ channels: [0, 5, 10, 15].map((offsetGHz) => ({ offsetGHz })), options: { errorEstimate: false } })
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

describe('the time-step floor', () => {
  it('refuses a grid whose binding rule asks for a step below MIN_TIME_STEP_PS, on the field that rule depends on', () => {
    // 1 GW continuous pump: G_B·P_max·Δz ≤ 0.05 (docs/numerics.md) asks for Δz of nanometres, Δt ≈ 1e-8 ps.
    const c = config({ channels: [{ pump: { pulses: [], backgroundPowerW: 1e6 } }] })
    const check = checkLimits(estimateResources(c, chooseGrid(c)))

    expect(check.ok).toBe(false)
    if (check.ok) return
    expect(check.fields?.map((f) => f.path)).toEqual(['channels.0.pump.backgroundPowerW'])
    expect(check.message).toMatch(/below the smallest step the solver takes, 0\.001 ps/)
    expect(check.message).not.toMatch(/Infinity|NaN/)
  })

  it('accepts the shortest window the schema allows, whose automatic step sits at the floor', () => {
    const c = config({ windowNs: MIN_WINDOW_NS, channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 } }] })
    const e = estimateResources(c, chooseGrid(c))

    expect(checkLimits(e)).toEqual({ ok: true })
    expect(e.stepBinding?.field).toBe('windowNs')
  })

  it('refuses the window and the step below their floors in the schema itself', () => {
    const tiny = SimulationConfig.safeParse({ ...config(), windowNs: 5e-324 })
    const fine = SimulationConfig.safeParse({ ...config(), grid: { timeStepPs: 1e-6 } })
    const fewSteps = SimulationConfig.safeParse({ ...config(), windowNs: 0.05, grid: { timeStepPs: 10 } })

    expect(tiny.error?.issues.map((i) => i.path.join('.'))).toContain('windowNs')
    expect(fine.error?.issues.map((i) => i.path.join('.'))).toContain('grid.timeStepPs')
    expect(fewSteps.error?.issues.find((i) => i.path.join('.') === 'windowNs')?.message).toMatch(/at least 10 time steps/)
  })
})
