// Model-validity warnings (docs/model.md, "Not modelled"): where the configured run leaves the ground the equations cover.
import type { Waveguide } from './waveguide'
import { pulseFeatureNs, type SimulationConfig } from './simulation-config'
import type { Advisory } from './laser-safety'
import type { DerivedOptions, DerivedQuantities } from './derived-quantities'

/** Above this G₀ spontaneous scattering from thermal phonons grows to a visible level (common practice; docs/model.md). */
export const NOISE_GAIN_THRESHOLD = 15
/** SVEA needs pulses longer than a few acoustic periods (common practice; docs/model.md). */
export const MIN_ACOUSTIC_PERIODS_SVEA = 5
/** Dispersion is negligible while L < L_D/10 (common practice). */
export const DISPERSION_LENGTH_FRACTION = 0.1
/** Channels must sit ≥ 10 Δν_B apart for the dropped cross beats to be off resonance (docs/model.md, options). */
export const MIN_CHANNEL_SPACING_LINEWIDTHS = 10
/**
 * Below this thermal occupation the classical Langevin source leaves its range: spontaneous Stokes emission
 * goes with n_th + 1, not n_th (common practice; e.g. Boyd, Rzążewski & Narum, Phys. Rev. A 42, 5514, 1990).
 */
export const CLASSICAL_NOISE_MIN_OCCUPATION = 10
/** A CW run reaches steady state after about 20/Γ_B, since b relaxes at Γ_B/2 (docs/numerics.md). */
export const CW_STEADY_STATE_DECAY_TIMES = 20
/** |β₂| ≈ 20 ps²/km, standard single-mode silica fibre at 1550 nm (from memory; Agrawal, Nonlinear Fiber Optics ch. 1). */
export const DEFAULT_DISPERSION_PS2_PER_KM = 20
/** Fewer time steps than this across the shortest pulse feature under-resolves it (docs/numerics.md asks for ≥ 20). */
export const MIN_CELLS_PER_PULSE = 10
/** Gaussian power FWHM = 2√(ln 2)·T for A ∝ exp(−t²/2T²). */
const FWHM_PER_RMS = 2 * Math.sqrt(Math.LN2)

export function physicsAdvisories(
  d: DerivedQuantities,
  w: Waveguide,
  cfg: SimulationConfig | undefined,
  options: DerivedOptions,
): Advisory[] {
  const out: Advisory[] = []
  const noiseOn = cfg?.options.noise.enabled ?? false
  if (d.smallSignalGainNepers > NOISE_GAIN_THRESHOLD && !noiseOn) {
    out.push({
      code: 'gain-without-noise',
      severity: 'warning',
      message: `G₀ = ${d.smallSignalGainNepers.toFixed(1)} > ${NOISE_GAIN_THRESHOLD}: Stokes light grown from thermal phonons would be significant, but thermal noise is off.`,
    })
  }
  if (noiseOn && d.thermalOccupation < CLASSICAL_NOISE_MIN_OCCUPATION) {
    const zeroPoint = cfg?.options.noise.zeroPoint ?? false
    const nTh = d.thermalOccupation.toPrecision(2)
    out.push({
      code: 'cold-noise',
      severity: zeroPoint ? 'info' : 'warning',
      message: zeroPoint
        ? `n_th = ${nTh} at ${d.temperatureK} K: spontaneous emission uses n_th + 1, but with so few thermal phonons the classical noise model is only approximate.`
        : `n_th = ${nTh} at ${d.temperatureK} K: the classical noise model undercounts spontaneous Stokes emission, which goes with n_th + 1. Switch on the zero-point term.`,
    })
  }
  if (d.grid?.cellsAcrossShortestPulse !== undefined && d.grid.cellsAcrossShortestPulse < MIN_CELLS_PER_PULSE) {
    out.push({
      code: 'coarse-grid',
      severity: 'warning',
      message: `The shortest pulse feature spans only ${d.grid.cellsAcrossShortestPulse.toFixed(1)} time steps (keep ≥ ${MIN_CELLS_PER_PULSE}); use a smaller time step.`,
    })
  }
  if (!cfg) return out

  const pulses = cfg.channels.flatMap((ch) => [...ch.pump.pulses, ...ch.stokes.pulses])
  if (pulses.length > 0) {
    const shortestNs = Math.min(...pulses.map(pulseFeatureNs))
    const periodNs = 1 / w.brillouinShiftGHz
    if (!cfg.options.higherOrderAcoustic && shortestNs < MIN_ACOUSTIC_PERIODS_SVEA * periodNs) {
      out.push({
        code: 'svea-short-pulse',
        severity: 'warning',
        message: `The shortest pulse feature (${(shortestNs * 1000).toFixed(0)} ps) is under ${MIN_ACOUSTIC_PERIODS_SVEA} acoustic periods (${(MIN_ACOUSTIC_PERIODS_SVEA * periodNs * 1000).toFixed(0)} ps); consider the higher-order acoustic term.`,
      })
    }
    const widths = pulses.filter((p) => 'fwhmNs' in p).map((p) => (p as { fwhmNs: number }).fwhmNs)
    if (widths.length > 0) {
      const beta2S2PerM = (options.dispersionPs2PerKm ?? DEFAULT_DISPERSION_PS2_PER_KM) * 1e-27
      const t0S = (Math.min(...widths) * 1e-9) / FWHM_PER_RMS
      const dispersionLengthM = (t0S * t0S) / beta2S2PerM
      if (w.lengthM > DISPERSION_LENGTH_FRACTION * dispersionLengthM) {
        out.push({
          code: 'dispersion-not-modelled',
          severity: 'warning',
          message: `The waveguide (${w.lengthM} m) is longer than a tenth of the dispersion length L_D ≈ ${dispersionLengthM.toPrecision(3)} m of the shortest pulse (|β₂| = ${options.dispersionPs2PerKm ?? DEFAULT_DISPERSION_PS2_PER_KM} ps²/km); group-velocity dispersion is not modelled.`,
        })
      }
    }
  }
  if (pulses.length === 0 && cfg.windowNs * 1e-9 < CW_STEADY_STATE_DECAY_TIMES / d.gammaBRadPerS) {
    out.push({
      code: 'short-cw-window',
      severity: 'warning',
      message: `A CW steady state needs a window of at least 20/Γ_B = ${((CW_STEADY_STATE_DECAY_TIMES / d.gammaBRadPerS) * 1e9).toPrecision(3)} ns; the outputs at ${cfg.windowNs} ns are still settling.`,
    })
  }
  const spacingLimitGHz = (MIN_CHANNEL_SPACING_LINEWIDTHS * w.linewidthMHz) / 1000
  for (let i = 0; i < cfg.channels.length; i++) {
    for (let j = i + 1; j < cfg.channels.length; j++) {
      if (Math.abs(cfg.channels[i].offsetGHz - cfg.channels[j].offsetGHz) < spacingLimitGHz) {
        out.push({
          code: 'channel-spacing',
          severity: 'warning',
          message: `Channels ${i + 1} and ${j + 1} are closer than ${MIN_CHANNEL_SPACING_LINEWIDTHS} linewidths (${spacingLimitGHz.toPrecision(3)} GHz); their cross beats are not modelled.`,
        })
      }
    }
  }
  out.push({
    code: 'effects-not-modelled',
    severity: 'info',
    message: 'Not modelled: stimulated Raman scattering, modulation instability, two-photon and free-carrier absorption, thermal effects.',
  })
  return out
}
