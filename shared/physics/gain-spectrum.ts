/*
 * Small-signal backward Brillouin gain spectrum of a waveguide (Agrawal, Nonlinear Fiber Optics, ch. 9).
 *
 * Each backward resonance r (the main one: g_B, ν_B, Δν_B; then waveguide.additionalResonances) is a
 * Lorentzian in the pump–Stokes frequency difference ν = ν_p − ν_s, and the spectrum is their sum:
 *
 *   g(ν) = Σ_r g_r · (Γ_r/2)² / (Δ_r² + (Γ_r/2)²),   Δ_r = 2π(ν − ν_r),  Γ_r = 2π·Δν_r (FWHM)
 *
 * (the 2π cancels: in MHz, (Δν_r/2)² / ((ν − ν_r)² + (Δν_r/2)²)). A run's detuning δ = (ν_p − ν_s) − ν_B
 * puts ν at ν_B + δ, so resonance r sits at δ = ν_r − ν_B on the detuning axis.
 *
 * CW small-signal Stokes gain (undepleted CW pump of power P launched at z = 0, weak CW Stokes launched at
 * z = L and read at z = 0; both waves lose α):
 *
 *   P_s(0)/P_s(L) = exp(η_pol·g(ν)·P·L_eff/A_eff − αL),   L_eff = (1 − e^{−αL})/α
 *   gain (dB)     = 10·log10(e) · (η_pol·g(ν)·P·L_eff/A_eff − αL)
 *
 * That last line is what is plotted as the closed form: the net gain, loss included, which is what a run's
 * "Peak Stokes gain" 10·log10(max P_s,out / max P_s,in) measures when pump and Stokes are both CW.
 *
 * Pulsed pump or Stokes: there is no closed form. What the scan shows then is the "effective gain", the run's
 * own peak Stokes gain at each detuning. It approaches the CW curve at the pulse's peak power only when the
 * pulse is much longer than the phonon lifetime 1/Γ_B and the transit time; shorter pulses see the Lorentzian
 * convolved with their own spectrum (lower, broader), so the CW curve is drawn only as a reference.
 */
import type { Waveguide } from './waveguide'
import type { PortInput } from './pulse'
import type { SimulationConfig } from './simulation-config'
import { effectiveLengthM } from './derived-quantities'
import { DB_PER_NEPER_POWER, dbPerMToPerM } from './units'

/** One backward Lorentzian: position on the detuning axis, FWHM and peak gain coefficient. */
export interface GainLine {
  /** ν_r − ν_B (MHz): where the line peaks on the run's detuning axis. */
  centreMHz: number
  linewidthMHz: number
  gainCoefficientMPerW: number
}

type ResonantGuide = Pick<Waveguide, 'brillouinShiftGHz' | 'linewidthMHz' | 'gainCoefficientMPerW' | 'additionalResonances'>

/** The main resonance followed by the further backward ones, on the detuning axis. */
export function gainLines(w: ResonantGuide): GainLine[] {
  return [
    { centreMHz: 0, linewidthMHz: w.linewidthMHz, gainCoefficientMPerW: w.gainCoefficientMPerW },
    ...(w.additionalResonances ?? []).map((r) => ({
      centreMHz: 1000 * (r.shiftGHz - w.brillouinShiftGHz),
      linewidthMHz: r.linewidthMHz,
      gainCoefficientMPerW: r.gainCoefficientMPerW,
    })),
  ]
}

/** Lorentzian factor (Δν/2)² / (Δ² + (Δν/2)²) of one line at detuning δ: 1 at its centre, 1/2 half a FWHM away. */
export function lorentzian(line: GainLine, detuningMHz: number): number {
  const half = line.linewidthMHz / 2
  const d = detuningMHz - line.centreMHz
  return (half * half) / (d * d + half * half)
}

/** g(ν_B + δ) = Σ_r g_r·L_r(δ) (m/W). */
export function gainCoefficientAt(lines: readonly GainLine[], detuningMHz: number): number {
  let g = 0
  for (const l of lines) g += l.gainCoefficientMPerW * lorentzian(l, detuningMHz)
  return g
}

type GainGuide = ResonantGuide & Pick<Waveguide, 'lengthM' | 'lossDbPerM' | 'effectiveAreaUm2' | 'polarisationFactor'>

/** Small-signal gain exponent η_pol·g(ν)·P·L_eff/A_eff (nepers of power), loss not subtracted. */
export function smallSignalExponent(w: GainGuide, pumpPowerW: number, detuningMHz: number): number {
  const lEff = effectiveLengthM(dbPerMToPerM(w.lossDbPerM), w.lengthM)
  return (w.polarisationFactor * gainCoefficientAt(gainLines(w), detuningMHz) * pumpPowerW * lEff) / (w.effectiveAreaUm2 * 1e-12)
}

/** Net CW small-signal Stokes gain 10·log10(e)·(η_pol·g(ν)·P·L_eff/A_eff − αL) in dB. */
export function cwStokesGainDb(w: GainGuide, pumpPowerW: number, detuningMHz: number): number {
  return DB_PER_NEPER_POWER * (smallSignalExponent(w, pumpPowerW, detuningMHz) - dbPerMToPerM(w.lossDbPerM) * w.lengthM)
}

/** How the pump and Stokes of a run drive the gain: both CW (closed form applies) or otherwise (effective gain). */
export type GainDrive = { kind: 'cw'; pumpPowerW: number } | { kind: 'pulsed'; peakPumpPowerW: number }

/** Continuous and unmodulated: no pulses, no frequency modulation, no broadband phase. */
function isSteady(p: PortInput): boolean {
  const extra = p as { modulation?: unknown; broadband?: unknown }
  return p.pulses.length === 0 && !extra.modulation && !extra.broadband
}

/** The drive of the first channel (the one whose gain a scan plots). */
export function gainDrive(config: Pick<SimulationConfig, 'channels'>): GainDrive {
  const { pump, stokes } = config.channels[0]
  if (isSteady(pump) && isSteady(stokes)) return { kind: 'cw', pumpPowerW: pump.backgroundPowerW }
  return { kind: 'pulsed', peakPumpPowerW: Math.max(0, ...pump.pulses.map((x) => x.peakPowerW)) + pump.backgroundPowerW }
}
