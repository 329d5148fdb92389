// Figures of a correlation sensing map on a synthetic map: nominal width and spacing after Hotate & Hasegawa 2000
// (IEICE Trans. Electron. E83-C, 405), the range read, and the hot-spot verdicts.
import { describe, expect, it } from 'vitest'
import { ProfileSegment } from '../physics/longitudinal-profile'
import type { AssembledSensingMap, SensingFitRow } from './sensing-map'
import { correlationSensingFigures } from './correlation-sensing-figures'

const N_G = 1.468
const VG = 299_792_458 / N_G
const MOD = { rateMHz: 8, excursionMHz: 100 }
/** Δz = v_g Δν_B/(2π f_m Δf) = 1.22 m for Δν_B = 30 MHz. */
const DZ = (VG * 30e6) / (2 * Math.PI * 8e6 * 100e6)

const segment = (startM: number, endM: number, shiftOffsetMHz: number) => ProfileSegment.parse({ startM, endM, shiftOffsetMHz })

/** A map on 0.1 m steps from fromM to toM whose fitted shift is `shift(z)` ± sigma. */
function mapOf(fromM: number, toM: number, shift: (z: number) => number | null, sigmaMHz = 0.5): AssembledSensingMap {
  const positionsM = Array.from({ length: Math.round((toM - fromM) / 0.1) + 1 }, (_, i) => fromM + i * 0.1)
  const fits: SensingFitRow[] = positionsM.map((z) => {
    const s = shift(z)
    return s === null ? { shiftMHz: null, sigmaMHz: null, peakGain: null, usable: false, outsideScan: true } : { shiftMHz: s, sigmaMHz, peakGain: 0.05, usable: true, outsideScan: false }
  })
  return { positionsM, detuningsMHz: [0], gain: positionsM.map(() => [0]), fits }
}

describe('correlation sensing figures', () => {
  it('gives Hotate & Hasegawa’s width and spacing, and the range from the first to the last usable fit', () => {
    const fig = correlationSensingFigures(mapOf(1, 9, () => 0), [], N_G, 30, MOD)
    expect(fig.nominalResolutionM).toBeCloseTo(DZ, 9)
    expect(fig.peakSpacingM).toBeCloseTo(VG / (2 * 8e6), 9)
    expect(fig.measuredResolutionM).toBeNull()
    expect(fig.resolutionM).toBeCloseTo(DZ, 9)
    expect(fig.rangeStartM).toBeCloseTo(1, 9)
    expect(fig.rangeM).toBeCloseTo(8, 9)
  })

  it('measures the 10–90 % width across a small step, and decides hot spots on the larger of measured and nominal', () => {
    // A linear ramp over 0.6 m across a 5 MHz step at 5 m: 10–90 % over 0.48 m, below the nominal Δz.
    const ramp = (z: number) => 5 * Math.min(1, Math.max(0, (z - 4.7) / 0.6))
    const fig = correlationSensingFigures(mapOf(1, 9, ramp), [segment(5, 10, 5)], N_G, 30, MOD)
    expect(fig.measuredResolutionM).toBeCloseTo(0.48, 6)
    expect(fig.resolutionM).toBeCloseTo(DZ, 9)
  })

  it('calls hot spots detected, missed, not resolved, outside the scan or outside the range read', () => {
    const shiftAt = (z: number) => (z >= 2 && z < 5 ? 20 : z >= 6 && z < 6.3 ? 20 : z >= 7 && z < 9.5 ? 19 : 0)
    const segments = [segment(2, 5, 20), segment(6, 6.3, 20), segment(7, 9.5, 22), segment(12, 14, 20)]
    const fig = correlationSensingFigures(mapOf(0.5, 9.8, (z) => (Math.abs(z - 8.25) < 0.11 ? null : shiftAt(z))), segments, N_G, 30, MOD)
    expect(fig.hotSpots.map((h) => h.status)).toEqual(['detected', 'not resolved', 'outside scan', 'outside range'])
    expect(fig.hotSpots[1].fittedShiftMHz).toBeNull()
    const shifted = correlationSensingFigures(mapOf(0.5, 9.8, shiftAt), segments, N_G, 30, MOD)
    // 19 MHz read against a true 22 MHz at σ = 0.5 MHz: more than 3σ off.
    expect(shifted.hotSpots[2].status).toBe('missed')
  })
})
