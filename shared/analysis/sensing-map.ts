/*
 * Time-of-flight read-out of a sensing scan (docs/analysis.md, sensing map). A pump pulse centred at t₀
 * enters at z = 0, a CW probe at z = L; the probe slice leaving z = 0 at time t met the pump at
 *
 *   z = v_g (t − t₀)/2                                                         (common practice)
 *
 * and its log gain there is g = ln(P_s(t)/P_ref), P_ref the probe output before the pump's light arrives.
 * One scan point per pump–probe detuning gives one column of the map g(z, ν). Per position a Lorentzian
 * fit (lorentzian-fit.ts) gives the local shift change δν_B(z) (peak detuning) with its 1σ.
 *
 * Optional detector noise: white, seeded, rms `relativeNoiseRms` of P_ref added to every sample, so the
 * fitted uncertainty reflects an interrogator's signal-to-noise ratio; without it the 1σ reflects only how
 * far the local spectrum departs from a Lorentzian.
 */
import { SeededNormal } from '../physics/seeded-normal'
import { fitLorentzian } from './lorentzian-fit'

export interface SensingScanPoint {
  detuningMHz: number
  /** Probe (Stokes) output power at z = 0, sampled every dtNs from t = 0 (W). */
  stokesOutW: ArrayLike<number>
}

export interface SensingScanSetup {
  dtNs: number
  groupIndex: number
  lengthM: number
  linewidthMHz: number
  pumpCentreNs: number
  pumpFwhmNs: number
  maxPositions?: number
  relativeNoiseRms?: number
  noiseSeed?: number
}

export interface SensingFitRow {
  shiftMHz: number | null
  sigmaMHz: number | null
  peakGain: number | null
  usable: boolean
  /** The largest gain of the row sits on the first or last detuning: the line lies (partly) outside the scan
   *  (absent where a read-out does not check it). */
  outsideScan?: boolean
}

export interface AssembledSensingMap {
  positionsM: number[]
  detuningsMHz: number[]
  /** ln(P_s/P_ref), [position][detuning]. */
  gain: number[][]
  fits: SensingFitRow[]
}

/** A scan whose timing cannot give a map; the message is a sentence for the user. */
export class SensingSetupError extends Error {}

const C_M_PER_NS = 0.299792458

function interpolate(trace: ArrayLike<number>, index: number): number {
  const i = Math.min(trace.length - 2, Math.max(0, Math.floor(index)))
  const f = index - i
  return trace[i] * (1 - f) + trace[i + 1] * f
}

export function assembleSensingMap(points: readonly SensingScanPoint[], setup: SensingScanSetup): AssembledSensingMap {
  if (points.length < 4) throw new SensingSetupError('A sensing scan needs at least 4 detuning points to fit a line')
  const vgMPerNs = C_M_PER_NS / setup.groupIndex
  const transitNs = setup.lengthM / vgMPerNs
  const refFrom = transitNs + setup.pumpFwhmNs
  const refTo = setup.pumpCentreNs - 2 * setup.pumpFwhmNs
  if (refTo - refFrom < 2 * setup.dtNs)
    throw new SensingSetupError(
      `The pump pulse must start after the probe has crossed the fibre: centre it at ≥ ${(transitNs + 3 * setup.pumpFwhmNs).toPrecision(4)} ns so the probe alone can be measured first`,
    )
  const endNs = setup.pumpCentreNs + 2 * transitNs
  const sorted = [...points].sort((a, b) => a.detuningMHz - b.detuningMHz)
  const cells = Math.floor((2 * transitNs) / setup.dtNs)
  const nPos = Math.max(2, Math.min(setup.maxPositions ?? 4000, cells + 1))
  const positionsM = Array.from({ length: nPos }, (_, i) => (i * setup.lengthM) / (nPos - 1))
  const rng = new SeededNormal(setup.noiseSeed ?? 1)
  const noise = setup.relativeNoiseRms ?? 0
  const columns = sorted.map((p) => {
    const n = p.stokesOutW.length
    if ((n - 1) * setup.dtNs < endNs) throw new SensingSetupError(`The window must last until the pump's last echo returns, ${endNs.toPrecision(4)} ns`)
    let ref = 0
    const i0 = Math.ceil(refFrom / setup.dtNs)
    const i1 = Math.floor(refTo / setup.dtNs)
    for (let i = i0; i <= i1; i++) ref += p.stokesOutW[i]
    ref /= i1 - i0 + 1
    if (!(ref > 0)) throw new SensingSetupError('The probe (continuous Stokes input) must be on for a sensing scan')
    return positionsM.map((z) => {
      const power = interpolate(p.stokesOutW, (setup.pumpCentreNs + (2 * z) / vgMPerNs) / setup.dtNs) + (noise > 0 ? noise * ref * rng.normal() : 0)
      return Math.log(Math.max(power, 1e-300) / ref)
    })
  })
  const detuningsMHz = sorted.map((p) => p.detuningMHz)
  const gain = positionsM.map((_, i) => columns.map((col) => col[i]))
  const fits = gain.map((row) => fitRow(detuningsMHz, row, setup.linewidthMHz))
  return { positionsM, detuningsMHz, gain, fits }
}

function fitRow(nu: number[], y: number[], linewidthMHz: number): SensingFitRow {
  let top = 0
  for (let i = 1; i < y.length; i++) if (y[i] > y[top]) top = i
  // A peak on the scan's edge: the fit would extrapolate a line the scan never reached, so no number is given.
  // Only a peak that stands out counts: above the row's mean by 5σ of the noise, σ from successive differences
  // (rms of y[i+1] − y[i] over √2, which a smooth line barely raises), so a row of noise alone is not flagged.
  let mean = 0
  let diff2 = 0
  for (let i = 0; i < y.length; i++) (mean += y[i] / y.length), i > 0 && (diff2 += (y[i] - y[i - 1]) ** 2)
  const noise = Math.sqrt(diff2 / (2 * (y.length - 1)))
  if ((top === 0 || top === y.length - 1) && y[top] - mean > 5 * noise) return { shiftMHz: null, sigmaMHz: null, peakGain: null, usable: false, outsideScan: true }
  const f = fitLorentzian(nu, y, linewidthMHz / 2)
  if (!f || f.centreSigma === null) return { shiftMHz: null, sigmaMHz: null, peakGain: null, usable: false, outsideScan: false }
  // A fit counts when the line stands out of the residual and its centre lies inside the scanned range.
  const inside = f.centre >= nu[0] && f.centre <= nu[nu.length - 1]
  const usable = inside && f.amplitude > 3 * f.rmsResidual && f.centreSigma < linewidthMHz
  return { shiftMHz: f.centre, sigmaMHz: f.centreSigma, peakGain: f.amplitude, usable, outsideScan: false }
}
