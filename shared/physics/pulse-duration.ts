/*
 * Duration τ of a pump pulse in the time-of-flight resolution δz = v_g·τ/2 (docs/analysis.md, sensing map).
 * The trade's formula is written for a rectangular pulse of duration τ (Horiguchi & Tateda 1989, J. Lightwave
 * Technol. 7, 1170; common practice). For any other shape the duration that keeps the formula's meaning (the
 * length of fibre the pulse's energy occupies) is the equivalent rectangular duration
 *
 *   τ_eq = ∫ P(t) dt / P_peak
 *
 * the width of a rectangle of the same peak power and energy: the width at half power for a rectangular pulse
 * (its tanh edges add only terms exponentially small in width/rise), √(π/(4 ln 2))·FWHM = 1.0645·FWHM for a Gaussian, FWHM/ln(1+√2) =
 * 1.1346·FWHM for sech².
 */
import type { Pulse } from './pulse'
import { pulseAmplitude } from './pulse-envelope'

/** Samples per FWHM of the numerical integral; the tails are followed to 8 FWHM (plus the edges) each side. */
const SAMPLES_PER_FWHM = 400
const TAIL_FWHM = 8

export function pulseDurationNs(p: Pulse): number {
  if (p.shape === 'sampled') {
    const peak = p.powerShape.reduce((a, b) => Math.max(a, b), 0)
    return peak > 0 ? (p.powerShape.reduce((a, b) => a + b, 0) * p.sampleIntervalNs) / peak : 0
  }
  if (p.shape === 'rectangular') return p.fwhmNs
  const half = TAIL_FWHM * p.fwhmNs
  const dt = p.fwhmNs / SAMPLES_PER_FWHM
  let energy = 0
  for (let t = -half; t <= half; t += dt) energy += pulseAmplitude({ ...p, centreNs: 0 }, t) ** 2 * dt
  return energy
}
