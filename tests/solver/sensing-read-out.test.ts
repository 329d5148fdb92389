// Time-of-flight read-out of a sensing scan on a short fibre: a Gaussian pump pulse of power FWHM τ = 50 ns
// (≫ the phonon lifetime 1/Γ_B ≈ 5 ns, so the acoustic build-up barely reshapes the pulse's footprint), a
// CW probe from the far end, 41 pump–probe detunings. The fibre carries a small shift step (to measure the
// resolution on), a hot spot of about 3 resolutions and one of 0.3 resolutions.
import { beforeAll, describe, expect, it } from 'vitest'
import { assembleSensingMap, type AssembledSensingMap } from '@shared/analysis/sensing-map'
import { sensingFigures } from '@shared/analysis/sensing-figures'
import type { ProfileSegment } from '@shared/physics/longitudinal-profile'
import { FIBRE, runScan, scanTiming, sensingConfig, VG_M_PER_NS, type ScanSetup } from './sensing-fixtures'

const TAU_NS = 50
/** Nominal resolution v_g τ/2 ≈ 5.1 m. */
const DZ = (VG_M_PER_NS * TAU_NS) / 2
const SETUP: ScanSetup = {
  lengthM: 30 * DZ,
  pumpFwhmNs: TAU_NS,
  pumpPowerW: 0.2 / DZ,
  probePowerW: 1e-4,
  segments: [
    { startM: 8 * DZ, endM: 14 * DZ, shiftOffsetMHz: 5 },
    { startM: 18 * DZ, endM: 21 * DZ, temperatureOffsetK: 40 },
    { startM: 25 * DZ, endM: 25.3 * DZ, temperatureOffsetK: 40 },
  ],
}
const DETUNINGS = Array.from({ length: 41 }, (_, i) => -80 + 4 * i)

let points: ReturnType<typeof runScan>['points']
let dtNs: number
let segments: ProfileSegment[]
const assemble = (relativeNoiseRms: number): AssembledSensingMap =>
  assembleSensingMap(points, { dtNs, groupIndex: FIBRE.groupIndex, lengthM: SETUP.lengthM, linewidthMHz: FIBRE.linewidthMHz, pumpCentreNs: scanTiming(SETUP).pumpCentreNs, pumpFwhmNs: TAU_NS, relativeNoiseRms, noiseSeed: 5 })

beforeAll(() => {
  ;({ points, dtNs } = runScan(SETUP, DETUNINGS))
  segments = sensingConfig(SETUP, 0).waveguide.profile!.segments
})

describe('time-of-flight sensing read-out', () => {
  it('resolves v_g τ/2 within 10 %, as the 10–90 % width of the fitted shift across a shift step', () => {
    // Common practice: a pump pulse of duration τ resolves δz = v_g τ/2 (e.g. Horiguchi & Tateda 1989, J. Lightwave
    // Technol. 7, 1170, for Brillouin optical time-domain analysis). For a Gaussian footprint the 10–90 % width of
    // its step response is 2·1.2816σ = 1.088 FWHM (the normal distribution's quantiles), inside the 10 %.
    const fig = sensingFigures(assemble(0), segments, FIBRE.groupIndex, TAU_NS, FIBRE.linewidthMHz)
    expect(fig.nominalResolutionM).toBeCloseTo(DZ, 9)
    expect(fig.measuredResolutionM).not.toBeNull()
    expect(Math.abs(fig.measuredResolutionM! / DZ - 1)).toBeLessThan(0.1)
    expect(fig.rangeM).toBeCloseTo(SETUP.lengthM, 6)
  })

  it('recovers a hot spot of ≥ 2 resolutions within 3σ and reports one of 0.3 resolutions as not resolved', () => {
    // Detector noise 0.1 % of the probe power, seeded: the 1σ of the fit then scales as Δν_B/(√2·SNR) (common practice).
    const fig = sensingFigures(assemble(1e-3), segments, FIBRE.groupIndex, TAU_NS, FIBRE.linewidthMHz)
    const [step, wide, narrow] = fig.hotSpots
    expect(wide.endM - wide.startM).toBeGreaterThanOrEqual(2 * fig.resolutionM)
    expect(wide.status).toBe('detected')
    expect(Math.abs(wide.fittedShiftMHz! - 40)).toBeLessThanOrEqual(3 * wide.sigmaMHz!)
    expect(wide.sigmaMHz!).toBeGreaterThan(0.01)
    expect(wide.sigmaMHz!).toBeLessThan(3)
    expect(step.status).toBe('detected')
    expect(narrow.status).toBe('not resolved')
    expect(narrow.fittedShiftMHz).toBeNull()
  })

  it('calls a hot spot missed when the fibre does not have the shift the profile claims', () => {
    const claimed = segments.map((s, i) => (i === 1 ? { ...s, temperatureOffsetK: 50 } : s))
    const fig = sensingFigures(assemble(1e-3), claimed, FIBRE.groupIndex, TAU_NS, FIBRE.linewidthMHz)
    expect(fig.hotSpots[1].status).toBe('missed')
  })
})
