/*
 * Correlation read-out of a sensing scan (docs/analysis.md, sensing map, correlation read-out). CW pump (z = 0)
 * and CW probe (z = L) share a sinusoidal frequency modulation of rate f_m; the probe's modulation is delayed by
 * t_d relative to the pump's. The two are in step where z/v_g = (L − z)/v_g + t_d (mod 1/f_m), so a correlation
 * peak sits at
 *
 *   z_p = L/2 + v_g t_d/2   (mod d_m),   d_m = v_g/(2 f_m)          (Hotate & Hasegawa 2000, IEICE E83-C, 405)
 *
 * and each delay reads the one peak in the window L/2 ± d_m/2 (the unambiguous range; a guide longer than d_m
 * holds further peaks whose gain adds to every reading). Per scan point the gain is
 *
 *   g(z_p, ν) = ln(⟨P_s⟩/P_ref),
 *
 * ⟨P_s⟩ the probe output at z = 0 averaged over whole modulation periods once the light has crossed the guide
 * twice and the sound has settled, P_ref the probe without pump (launched power less the guide's loss). The peak
 * gives a Lorentzian line at the local shift; the rest of the guide, where the beat sweeps over ±2Δf, adds a
 * pedestal broad against the scan, so each position is fitted with a Lorentzian on a quadratic baseline
 * (lorentzian-baseline-fit.ts).
 */
import { SeededNormal } from '../physics/seeded-normal'
import { fitLorentzianOnBaseline } from './lorentzian-baseline-fit'
import { SensingSetupError, type AssembledSensingMap, type SensingFitRow } from './sensing-map'

export interface CorrelationScanPoint {
  detuningMHz: number
  /** Probe modulation delay relative to the pump's (ns). */
  delayNs: number
  /** Probe (Stokes) output power at z = 0, sampled every dtNs from t = 0 (W). */
  stokesOutW: ArrayLike<number>
}

export interface CorrelationScanSetup {
  dtNs: number
  groupIndex: number
  lengthM: number
  linewidthMHz: number
  rateMHz: number
  /** Probe power at z = 0 without pump: launched power times the guide's transmission (W). */
  probeReferenceW: number
  relativeNoiseRms?: number
  noiseSeed?: number
}

const C_M_PER_NS = 0.299792458
/** Amplitude lifetimes 1/(πΔν_B) the sound gets to settle after the light has crossed the guide twice. */
const SETTLE_LIFETIMES = 8

/** Peak spacing d_m = v_g/(2 f_m) (m). */
export const peakSpacingM = (groupIndex: number, rateMHz: number): number => C_M_PER_NS / groupIndex / (2 * rateMHz * 1e-3)

/** Position of the correlation peak a delay reads, in L/2 ± d_m/2; null when it lies outside the guide. */
export function correlationPeakM(delayNs: number, groupIndex: number, lengthM: number, rateMHz: number): number | null {
  const dm = peakSpacingM(groupIndex, rateMHz)
  const offset = (C_M_PER_NS / groupIndex) * delayNs / 2
  const z = lengthM / 2 + offset - Math.round(offset / dm) * dm
  // A nanometre of rounding in the delay still reads the guide's end.
  return z >= -1e-9 && z <= lengthM + 1e-9 ? Math.min(lengthM, Math.max(0, z)) : null
}

/** Start of the averaging: two crossings of the guide plus the settling of the sound (ns). */
export const steadyFromNs = (groupIndex: number, lengthM: number, linewidthMHz: number): number =>
  (2 * lengthM) / (C_M_PER_NS / groupIndex) + (SETTLE_LIFETIMES * 1e3) / (Math.PI * linewidthMHz)

function meanOverPeriods(p: CorrelationScanPoint, setup: CorrelationScanSetup, fromNs: number): number {
  const periodNs = 1e3 / setup.rateMHz
  const endNs = (p.stokesOutW.length - 1) * setup.dtNs
  const periods = Math.floor((endNs - fromNs) / periodNs)
  if (periods < 1) throw new SensingSetupError(`The window must last at least ${(fromNs + periodNs).toPrecision(4)} ns: two crossings of the guide, the settling of the sound and one modulation period`)
  const i0 = Math.ceil((endNs - periods * periodNs) / setup.dtNs)
  const i1 = p.stokesOutW.length - 1
  let s = 0
  for (let i = i0; i < i1; i++) s += p.stokesOutW[i]
  return s / (i1 - i0)
}

export function assembleCorrelationMap(points: readonly CorrelationScanPoint[], setup: CorrelationScanSetup): AssembledSensingMap {
  if (!(setup.probeReferenceW > 0)) throw new SensingSetupError('The probe (continuous Stokes input) must be on for a sensing scan')
  const fromNs = steadyFromNs(setup.groupIndex, setup.lengthM, setup.linewidthMHz)
  const detuningsMHz = [...new Set(points.map((p) => p.detuningMHz))].sort((a, b) => a - b)
  if (detuningsMHz.length < 8) throw new SensingSetupError('A correlation scan needs at least 8 detunings to fit a line on its background')
  const rows = new Map<number, Map<number, number>>()
  const rng = new SeededNormal(setup.noiseSeed ?? 1)
  const noise = setup.relativeNoiseRms ?? 0
  for (const p of [...points].sort((a, b) => a.delayNs - b.delayNs || a.detuningMHz - b.detuningMHz)) {
    const z = correlationPeakM(p.delayNs, setup.groupIndex, setup.lengthM, setup.rateMHz)
    if (z === null) continue
    // Positions to 0.1 mm (a delay typed to a few digits reads 1.500005 m); two delays one modulation period
    // apart read the same peak: the first one read counts.
    const key = Math.round(z * 1e4) / 1e4
    const row = rows.get(key) ?? new Map<number, number>()
    rows.set(key, row)
    if (row.has(p.detuningMHz)) continue
    const power = meanOverPeriods(p, setup, fromNs) + (noise > 0 ? noise * setup.probeReferenceW * rng.normal() : 0)
    row.set(p.detuningMHz, Math.log(Math.max(power, 1e-300) / setup.probeReferenceW))
  }
  // Only positions read at every detuning make a row of the map (a sweep still running leaves gaps).
  const complete = [...rows.entries()].filter(([, r]) => detuningsMHz.every((d) => r.has(d))).sort((a, b) => a[0] - b[0])
  if (complete.length < 2) throw new SensingSetupError('The map needs at least 2 modulation delays whose correlation peak lies in the guide, each read at every detuning')
  const gain = complete.map(([, r]) => detuningsMHz.map((d) => r.get(d)!))
  return { positionsM: complete.map(([z]) => z), detuningsMHz, gain, fits: gain.map((y) => fitRow(detuningsMHz, y, setup.linewidthMHz)) }
}

function fitRow(nu: number[], y: number[], linewidthMHz: number): SensingFitRow {
  const f = fitLorentzianOnBaseline(nu, y, linewidthMHz / 2)
  if (!f || f.centreSigma === null) return { shiftMHz: null, sigmaMHz: null, peakGain: null, usable: false, outsideScan: false }
  // A line centred beyond the scan is not measured: no shift is given (the scan must be widened).
  if (f.centre < nu[0] || f.centre > nu[nu.length - 1]) return { shiftMHz: null, sigmaMHz: null, peakGain: null, usable: false, outsideScan: true }
  // A line counts when it stands out of the residual and is narrower than the scan (a wider one is the
  // background, not the peak).
  const span = nu[nu.length - 1] - nu[0]
  const usable = f.amplitude > 3 * f.rmsResidual && f.centreSigma < linewidthMHz && 2 * f.halfWidth < span / 2
  return { shiftMHz: f.centre, sigmaMHz: f.centreSigma, peakGain: f.amplitude, usable, outsideScan: false }
}
