// A hot spot whose local Brillouin shift lies outside the scanned detunings: a 4-resolution section 35 K warmer
// (+35 MHz at about 1 MHz/K, common practice) on a short fibre, a 20 ns Gaussian pump pulse, a CW probe. Scanned
// over −60…+20 MHz its gain peak sits on the scan's last detuning and the read-out reports it as outside the
// scanned range instead of a number; over the one-click plan's range (gain-scan.ts: the profile's shift span
// ± 3 linewidths) it is recovered within 3σ.
import { beforeAll, describe, expect, it } from 'vitest'
import { assembleSensingMap } from '@shared/analysis/sensing-map'
import { sensingFigures } from '@shared/analysis/sensing-figures'
import { gainScanPlan } from '@shared/physics/gain-scan'
import { pulseDurationNs } from '@shared/physics/pulse-duration'
import { FIBRE, runScan, scanTiming, sensingConfig, VG_M_PER_NS, type ScanSetup } from './sensing-fixtures'

const TAU_NS = 20
const DZ = (VG_M_PER_NS * TAU_NS) / 2
const SETUP: ScanSetup = { lengthM: 14 * DZ, pumpFwhmNs: TAU_NS, pumpPowerW: 0.2 / DZ, probePowerW: 1e-4, segments: [{ startM: 6 * DZ, endM: 10 * DZ, temperatureOffsetK: 35 }] }
const config = sensingConfig(SETUP, 0)

function figures(detuningsMHz: number[]) {
  const { points, dtNs } = runScan(SETUP, detuningsMHz)
  const map = assembleSensingMap(points, { dtNs, groupIndex: FIBRE.groupIndex, lengthM: SETUP.lengthM, linewidthMHz: FIBRE.linewidthMHz, pumpCentreNs: scanTiming(SETUP).pumpCentreNs, pumpFwhmNs: TAU_NS, relativeNoiseRms: 1e-3, noiseSeed: 3 })
  return { map, fig: sensingFigures(map, config.waveguide.profile!.segments, FIBRE.groupIndex, pulseDurationNs(config.channels[0].pump.pulses[0]), FIBRE.linewidthMHz) }
}

let narrow: ReturnType<typeof figures>
let planned: ReturnType<typeof figures>
beforeAll(() => {
  narrow = figures(Array.from({ length: 17 }, (_, i) => -60 + 5 * i))
  const plan = gainScanPlan(config.waveguide)
  planned = figures(Array.from({ length: plan.count }, (_, i) => plan.startMHz + i * plan.stepMHz))
})

describe('scan range against the profile', () => {
  it('plans the one-click range over the hot spot’s shift plus three linewidths', () => {
    const plan = gainScanPlan(config.waveguide)
    expect(plan.startMHz).toBe(-3 * FIBRE.linewidthMHz)
    expect(plan.stopMHz).toBe(35 + 3 * FIBRE.linewidthMHz)
  })

  it('reports the hot spot outside the scanned range, with no number, when the scan stops short of it', () => {
    const spot = narrow.fig.hotSpots[0]
    expect(spot.status).toBe('outside scan')
    expect(spot.fittedShiftMHz).toBeNull()
    const centre = narrow.map.positionsM.findIndex((z) => z >= 8 * DZ)
    expect(narrow.map.fits[centre].outsideScan).toBe(true)
    expect(narrow.map.fits[centre].shiftMHz).toBeNull()
    // Away from the hot spot the line is inside the scan and fitted.
    const before = narrow.map.positionsM.findIndex((z) => z >= 3 * DZ)
    expect(narrow.map.fits[before].outsideScan).toBe(false)
    expect(narrow.map.fits[before].usable).toBe(true)
  })

  it('recovers the hot spot within 3σ over the planned range', () => {
    const spot = planned.fig.hotSpots[0]
    expect(spot.status).toBe('detected')
    expect(Math.abs(spot.fittedShiftMHz! - 35)).toBeLessThanOrEqual(3 * spot.sigmaMHz!)
    expect(planned.map.fits.some((f) => f.outsideScan)).toBe(false)
  })

  it('does not call a row of detector noise alone outside the scan', () => {
    // A probe the pump never touched, with 0.1 % white noise: no row has a line, so none is outside the scan.
    const flat = Array.from({ length: 17 }, (_, i) => ({ detuningMHz: -60 + 5 * i, stokesOutW: new Float64Array(400).fill(1e-4) }))
    const transitNs = 20 / VG_M_PER_NS
    const map = assembleSensingMap(flat, { dtNs: 1, groupIndex: FIBRE.groupIndex, lengthM: 20, linewidthMHz: FIBRE.linewidthMHz, pumpCentreNs: transitNs + 40, pumpFwhmNs: 10, relativeNoiseRms: 1e-3, noiseSeed: 11 })
    expect(map.fits.length).toBeGreaterThan(150)
    expect(map.fits.filter((f) => f.outsideScan)).toHaveLength(0)
  })
})
