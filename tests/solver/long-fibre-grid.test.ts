// The automatic step of a time-of-flight sensing run on a long fibre (shared/physics/sensing-grid-rules.ts) and
// the 10 km point of benchmarks/long-fibre.ts: accepted by the checks the API runs before it queues a run
// (the configuration schema, the grid rules and the resource limits), without running it.
import { describe, expect, it } from 'vitest'
import { chooseGrid } from '@shared/physics/grid-step'
import { checkLimits, DEFAULT_RESOURCE_LIMITS, estimateResources } from '@shared/physics/resource-estimate'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { sensingStepBound } from '@shared/physics/sensing-grid-rules'
import { gainScanPlan } from '@shared/physics/gain-scan'
import { buildSweepPoints, checkSweepLimits } from '@shared/physics/sweep-points'
import { fibre, TAU_NS, VG_M_PER_NS } from '../../benchmarks/sensing-fibre'

/** PostgreSQL's largest field value, 1 GB (PostgreSQL documentation, "Appendix K. PostgreSQL Limits"). */
const PG_MAX_VALUE_BYTES = 1024 ** 3
const RESOLUTION_M = (VG_M_PER_NS * TAU_NS) / 2

describe('automatic step of a long time-of-flight sensing fibre', () => {
  it('accepts the 10 km point with ≥ 5 cells per resolution and ≥ 2 cells on the 2 m hot spot', () => {
    const config = SimulationConfig.parse(fibre(10_000, 8000))
    const grid = chooseGrid(config)
    expect(grid.dzM).toBeLessThanOrEqual(RESOLUTION_M / 5)
    expect(2 / grid.dzM).toBeGreaterThanOrEqual(2)
    const e = estimateResources(config, grid)
    expect(e.cellUpdates).toBeLessThanOrEqual(DEFAULT_RESOURCE_LIMITS.maxCellUpdates)
    expect(checkLimits(e)).toEqual({ ok: true })
    // Every stored array far below PostgreSQL's value limit: all traces together, and the maps, under 5 % of it.
    expect(e.memoryBytes.traces).toBeLessThan(0.05 * PG_MAX_VALUE_BYTES)
    expect(e.memoryBytes.maps).toBeLessThan(0.05 * PG_MAX_VALUE_BYTES)
  })

  it('accepts the one-click sensing scan of the 10 km fibre, error estimate on, as one sweep', () => {
    const base = SimulationConfig.parse({ ...fibre(10_000, 8000), options: { errorEstimate: true } })
    const plan = gainScanPlan(base.waveguide)
    expect(plan.count).toBeGreaterThanOrEqual(41)
    const built = buildSweepPoints({ baseConfig: base, axes: [plan.axis] })
    if (!built.ok) throw new Error(JSON.stringify(built.issues))
    expect(built.points).toHaveLength(plan.count)
    expect(checkSweepLimits(built.points)).toEqual({ ok: true })
  })

  it('keeps the general rule (20 steps per pulse feature) on a fibre of fewer than 100 resolutions', () => {
    const short = fibre(50, 20)
    expect(sensingStepBound(short)).toBeNull()
    expect(chooseGrid(short).reasons[0]).toMatch(/shortest pulse feature\/20/)
    // A uniform profile and none get the same grid (the rule does not look at the profile).
    expect(chooseGrid(fibre(10_000, 8000, { profile: false })).dtS).toBe(chooseGrid(fibre(10_000, 8000)).dtS)
  })

  it('bounds the step by τ/10, and by half the edge of a rectangular pulse', () => {
    const bound = sensingStepBound(fibre(10_000, 8000))!
    // A Gaussian's duration is √(π/(4 ln 2))·FWHM (the Gaussian integral).
    expect(bound.dtS).toBeCloseTo((TAU_NS * 1e-9 * Math.sqrt(Math.PI / (4 * Math.LN2))) / 10, 15)
    const c = fibre(10_000, 8000)
    const p = c.channels[0].pump.pulses[0]
    const rect = SimulationConfig.parse({ ...c, channels: [{ ...c.channels[0], pump: { pulses: [{ ...p, shape: 'rectangular', riseNs: 1 }] } }] })
    expect(sensingStepBound(rect)!.dtS).toBeCloseTo(0.5e-9, 15)
    // A pulsed probe is not a time-of-flight read-out: the general rule holds.
    const pulsedProbe = SimulationConfig.parse({ ...c, channels: [{ ...c.channels[0], stokes: { pulses: [{ ...p, peakPowerW: 1e-3 }] } }] })
    expect(sensingStepBound(pulsedProbe)).toBeNull()
  })
})
