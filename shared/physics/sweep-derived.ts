/*
 * Sweep axes that are derived quantities rather than stored fields:
 *   write–read delay τ:     t_read = t_write + τ for the storage pulses of every channel (shared/physics/pulse-roles.ts)
 *   pulse energy E at fixed width:  P_peak = E / ∫(P(t)/P_peak) dt, the integral of the pulse's normalised power
 *     Gaussian  ∫ = F·√(π/(4 ln 2)) ≈ 1.0645 F;  sech²  ∫ = 2T₀ = F/ln(1+√2) ≈ 1.1346 F  (F the power FWHM);
 *     other shapes by Simpson's rule over their support; sampled by the trapezoid rule over the samples
 *   CW pump in units of the critical power:  P = x·P_cr,  P_cr = 21/(G_B·L_eff), G_B = η_pol g_B/A_eff
 *     (Smith 1972, Appl. Opt. 11, 2489; L_eff = (1 − e^{−αL})/α).
 */
import type { Pulse } from './pulse'
import { pulseAmplitude } from './pulse-envelope'
import type { SimulationConfig } from './simulation-config'
import { storageRoles } from './pulse-roles'
import { criticalPowerW, effectiveLengthM } from './derived-quantities'
import { dbPerMToPerM, um2ToM2 } from './units'

const SECH2_FWHM_PER_T0 = 2 * Math.log(1 + Math.SQRT2)

/** ∫ P(t)/P_peak dt of a pulse (ns): its energy per watt of peak power, in nJ/W. */
export function energyPerPeakNs(p: Pulse): number {
  switch (p.shape) {
    case 'gaussian':
      return p.fwhmNs * Math.sqrt(Math.PI / (4 * Math.LN2))
    case 'sech2':
      return (2 * p.fwhmNs) / SECH2_FWHM_PER_T0
    case 'sampled': {
      const peak = p.powerShape.reduce((a, b) => Math.max(a, b), 0)
      if (!(peak > 0)) return 0
      let s = 0
      for (let i = 1; i < p.powerShape.length; i++) s += 0.5 * (p.powerShape[i - 1] + p.powerShape[i])
      return (s * p.sampleIntervalNs) / peak
    }
    default: {
      // Composite Simpson over the support, fine enough for 1e-9 on the widest edge the schema allows.
      const half = p.shape === 'rectangular' ? p.fwhmNs / 2 + 12 * p.riseNs : 3 * p.fwhmNs
      const n = 20_000
      const h = (2 * half) / n
      let s = 0
      for (let i = 0; i <= n; i++) {
        const a = pulseAmplitude(p, p.centreNs - half + i * h)
        s += (i === 0 || i === n ? 1 : i % 2 ? 4 : 2) * a * a
      }
      return (s * h) / 3
    }
  }
}

/** P_cr = 21/(G_B L_eff) of the configuration's waveguide (W). */
export function criticalPowerOf(config: SimulationConfig): number {
  const wg = config.waveguide
  const lEff = effectiveLengthM(dbPerMToPerM(wg.lossDbPerM), wg.lengthM)
  return criticalPowerW(um2ToM2(wg.effectiveAreaUm2), wg.polarisationFactor * wg.gainCoefficientMPerW, lEff)
}

/** Write–read delay of the first storing channel (ns), or null without a labelled write and read pulse. */
export function storageDelayNs(config: SimulationConfig): number | null {
  for (const ch of config.channels) {
    const r = storageRoles(ch)
    if (r?.write) return r.read.centreNs - r.write.centreNs
  }
  return null
}

/** Moves every channel's read pulse to t_write + τ (in place). */
export function setStorageDelay(config: SimulationConfig, delayNs: number): void {
  for (const ch of config.channels) {
    const r = storageRoles(ch)
    if (r?.write) r.read.centreNs = r.write.centreNs + delayNs
  }
}
