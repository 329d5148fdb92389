// The correlation sensing scan the sweep form fills in from a run: the Stokes delay moves the correlation peak over
// the guide, z = L/2 + v_g t_d/2 (docs/analysis.md), or over one peak spacing d_m = v_g/(2 f_m) when the guide is
// longer (Hotate & Hasegawa 2000).
import { describe, expect, it } from 'vitest'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { buildSweepPoints } from '@shared/physics/sweep-points'
import { SweepDefinition } from '@shared/api/sweeps'
import { correlationScanStart } from './correlation-scan-draft'
import { toAxis } from './axis-draft'

const VG = 0.299792458 / 1.468
const config = (lengthM: number, stokesModulated = true) =>
  SimulationConfig.parse({
    waveguide: { name: 'Fibre', lengthM, groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.8, linewidthMHz: 30 },
    channels: [{ pump: { backgroundPowerW: 0.1, modulation: { rateMHz: 8, excursionMHz: 100 } }, stokes: { backgroundPowerW: 1e-4, ...(stokesModulated ? { modulation: { rateMHz: 8, excursionMHz: 100 } } : {}) } }],
    windowNs: 100,
  })

describe('correlation scan draft', () => {
  it('moves the peak over a guide shorter than d_m and lengthens a window too short to read', () => {
    const start = correlationScanStart(config(10))!
    expect(Number(start.delay.start)).toBeCloseTo(-10 / VG, 2)
    expect(Number(start.delay.start)).toBeGreaterThanOrEqual(-10 / VG)
    expect(Number(start.delay.stop)).toBeCloseTo(10 / VG, 2)
    expect(Number(start.delay.stop)).toBeLessThanOrEqual(10 / VG)
    expect(start.delay.field).toBe('modulationDelayNs')
    // Two crossings (98 ns), 8 sound lifetimes (85 ns) and one modulation period (125 ns).
    expect(start.config.windowNs).toBeGreaterThan(2 * (10 / VG) + 8e3 / (Math.PI * 30) + 125)
    expect(start.text).toContain('from 0 m to 10 m')
    expect(start.text).toContain('lengthened')
    const def = SweepDefinition.parse({ baseConfig: start.config, axes: [{ field: 'detuningMHz', values: { kind: 'linear', start: -90, stop: 90, count: start.detuningCount } }, toAxis(start.delay)] })
    const built = buildSweepPoints(def)
    expect(built.ok).toBe(true)
  })

  it('keeps to one peak spacing around mid-guide in a longer fibre, and says so', () => {
    const dm = VG / (2 * 8e-3)
    const start = correlationScanStart(config(40))!
    expect((Number(start.delay.stop) - Number(start.delay.start)) * (VG / 2)).toBeCloseTo(dm * (15 / 16), 2)
    expect(start.text).toContain('longer than the peak spacing')
  })

  it('is no correlation scan when the probe is not modulated', () => {
    expect(correlationScanStart(config(10, false))).toBeNull()
  })
})
