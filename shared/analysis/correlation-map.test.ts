// Assembly of a correlation sensing map from synthetic probe traces: the delay-to-position rule, the averaging,
// the reference and the fit of a Lorentzian on a broad background.
import { describe, expect, it } from 'vitest'
import { SensingSetupError } from './sensing-map'
import { assembleCorrelationMap, correlationPeakM, peakSpacingM, steadyFromNs, type CorrelationScanPoint, type CorrelationScanSetup } from './correlation-map'
import { fitLorentzianOnBaseline } from './lorentzian-baseline-fit'

const N_G = 1.5
const VG = 0.299792458 / N_G
const SETUP: CorrelationScanSetup = { dtNs: 0.5, groupIndex: N_G, lengthM: 10, linewidthMHz: 30, rateMHz: 8, probeReferenceW: 1e-4 }
const DETUNINGS = Array.from({ length: 17 }, (_, i) => -80 + 10 * i)
/** Samples enough for the steady part plus two modulation periods. */
const SAMPLES = Math.ceil((steadyFromNs(N_G, 10, 30) + 250) / 0.5)

/** A trace whose steady part carries exp(g) of the reference; the first part holds junk the average must skip. */
function trace(g: number): Float64Array {
  const from = steadyFromNs(N_G, 10, 30) / 0.5
  return Float64Array.from({ length: SAMPLES }, (_, i) => (i < from - 10 ? 7e-3 : 1e-4 * Math.exp(g)))
}

/** Local line of 0.05 nepers at the shift change `shift(z)` on a curved background. */
const gainAt = (nu: number, shiftMHz: number) => 0.05 / (1 + ((nu - shiftMHz) / 15) ** 2) + 0.08 - 2e-6 * nu * nu + 1e-4 * nu

describe('correlation map assembly', () => {
  it('puts the peak of delay t_d at L/2 + v_g t_d/2, folded into one peak spacing around mid-guide', () => {
    const dm = peakSpacingM(N_G, 8)
    expect(dm).toBeCloseTo(VG / 2 / 8e-3, 9) // d_m = v_g/(2 f_m) (Hotate & Hasegawa 2000)
    expect(correlationPeakM(0, N_G, 10, 8)).toBeCloseTo(5, 12)
    expect(correlationPeakM(20, N_G, 10, 8)).toBeCloseTo(5 + VG * 10, 12)
    // One modulation period later the next peak stands where this one stood.
    expect(correlationPeakM(20 + 125, N_G, 10, 8)).toBeCloseTo(5 + VG * 10, 9)
    // A delay whose peak falls beyond the guide's end reads nothing.
    expect(correlationPeakM(0.45 * 125, N_G, 10, 8)).toBeNull()
  })

  it('averages the steady part, divides by the reference and fits the line on its background', () => {
    const shiftAt = (z: number) => (z > 5 ? 12 : 0)
    const delays = [-30, -10, 10, 30]
    const points: CorrelationScanPoint[] = delays.flatMap((delayNs) =>
      DETUNINGS.map((d) => ({ detuningMHz: d, delayNs, stokesOutW: trace(gainAt(d, shiftAt(correlationPeakM(delayNs, N_G, 10, 8)!))) })),
    )
    const map = assembleCorrelationMap(points, SETUP)
    map.positionsM.forEach((z, i) => expect(z).toBeCloseTo(correlationPeakM(delays[i], N_G, 10, 8)!, 3))
    expect(map.detuningsMHz).toEqual(DETUNINGS)
    expect(map.gain[0][8]).toBeCloseTo(gainAt(0, 0), 9)
    map.fits.forEach((f, i) => {
      expect(f.usable).toBe(true)
      expect(f.shiftMHz!).toBeCloseTo(shiftAt(map.positionsM[i]), 4)
      expect(f.peakGain!).toBeCloseTo(0.05, 4)
    })
  })

  it('keeps only positions read at every detuning, and the first of two delays one period apart', () => {
    const points: CorrelationScanPoint[] = [0, 125, 20, 10].flatMap((delayNs) => DETUNINGS.map((d) => ({ detuningMHz: d, delayNs, stokesOutW: trace(gainAt(d, delayNs === 125 ? 30 : 0)) })))
    // The delay 10 ns lacks its last detuning (a sweep still running); 0 and 125 ns read the same peak, 0 ns first.
    const full = assembleCorrelationMap(points, SETUP)
    expect(full.positionsM).toHaveLength(3)
    full.positionsM.forEach((z, i) => expect(z).toBeCloseTo([5, 5 + VG * 5, 5 + VG * 10][i], 3))
    expect(full.fits[0].shiftMHz!).toBeCloseTo(0, 4)
    const partial = assembleCorrelationMap(points.slice(0, -1), SETUP)
    expect(partial.positionsM).toHaveLength(2)
    expect(partial.positionsM[1]).toBeCloseTo(5 + VG * 10, 3)
    expect(() => assembleCorrelationMap(points.filter((p) => p.delayNs === 0 || p.delayNs === 125), SETUP)).toThrow(/at least 2 modulation delays/)
  })

  it('refuses a scan it cannot read, in words', () => {
    const few = [0, 10].flatMap((delayNs) => DETUNINGS.slice(0, 6).map((d) => ({ detuningMHz: d, delayNs, stokesOutW: trace(0) })))
    expect(() => assembleCorrelationMap(few, SETUP)).toThrow(/at least 8 detunings/)
    const short = [0, 10].flatMap((delayNs) => DETUNINGS.map((d) => ({ detuningMHz: d, delayNs, stokesOutW: new Float64Array(100).fill(1e-4) })))
    expect(() => assembleCorrelationMap(short, SETUP)).toThrow(SensingSetupError)
    expect(() => assembleCorrelationMap(short, SETUP)).toThrow(/window must last at least/)
    expect(() => assembleCorrelationMap(short, { ...SETUP, probeReferenceW: 0 })).toThrow(/probe/)
  })

  it('fits a Lorentzian on a quadratic background to its centre and width', () => {
    const nu = DETUNINGS
    const y = nu.map((v) => 0.3 / (1 + ((v - 7) / 12) ** 2) + 1 - 0.004 * v + 3e-5 * v * v)
    const f = fitLorentzianOnBaseline(nu, y, 20)!
    expect(f.centre).toBeCloseTo(7, 6)
    expect(f.halfWidth).toBeCloseTo(12, 6)
    expect(f.amplitude).toBeCloseTo(0.3, 6)
  })
})
