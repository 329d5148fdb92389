// Fits a one-axis sweep supports, chosen from what the axis varies and the run scheme:
//
// - storage time: the read pulse's centre swept in a storage run. The retrieval efficiency decays with the
//   write–read delay τ as η(τ) = η₀·exp(−Γτ): the stored phonon energy decays at Γ_B (docs/model.md,
//   conventions: energy lifetime 1/Γ_B, amplitude lifetime 2/Γ_B; Agrawal, Nonlinear Fiber Optics, ch. 9).
//   The waveguide's nominal energy lifetime is 1/Γ_B with Γ_B = 2π·Δν_B.
// - pump power in an amplifier: the small-signal slope of the peak Stokes gain in dB (gain-slope-fit.ts). For
//   a CW pump the closed-form slope is 10·log10(e)·η g(ν) L_eff/A_eff dB/W, g(ν) the gain line(s) at the run's
//   detuning (shared/physics/gain-spectrum.ts; Agrawal, ch. 9).
import type { SweepDetail } from '../api/sweeps'
import { channelScheme, storageRoles } from '../physics/pulse-roles'
import { smallSignalExponent } from '../physics/gain-spectrum'
import { criticalPowerOf } from '../physics/sweep-derived'
import { DB_PER_NEPER_POWER } from '../physics/units'
import { fitExponentialDecay, type ExponentialDecayResult } from './exponential-decay-fit'
import { fitSmallSignalGainSlope, type GainSlopeResult } from './gain-slope-fit'

type Sweep = Pick<SweepDetail, 'axes' | 'baseConfig' | 'metrics' | 'points'>

export interface LifetimeAnalysis {
  kind: 'lifetime'
  metricKey: string
  /**
   * τ = axis value − offsetNs: the delay after the write pulse (or the data pulse when none is labelled write);
   * 0 when the axis is the write–read delay itself.
   */
  offsetNs: number
  /** Which pulse's centre offsetNs is, or 'axis' when the axis is τ. */
  anchor: 'write' | 'data' | 'axis'
  result: ExponentialDecayResult
  /** 1/Γ_B of the waveguide (ns). */
  nominalEnergyLifetimeNs: number
}

export interface GainSlopeAnalysis {
  kind: 'gainSlope'
  metricKey: string
  result: GainSlopeResult
  /** Watts per unit of the axis: 1, or P_cr for an axis in units of the critical power. */
  wattsPerAxisUnit: number
  /** The CW closed form (dB/W), or null when the pump is pulsed. */
  nominalSlopeDbPerW: number | null
}

export type SweepAnalysis = LifetimeAnalysis | GainSlopeAnalysis

const sameLabel = (a: string | undefined, b: string | undefined) => (a ?? '').trim().toLowerCase() === (b ?? '').trim().toLowerCase()

/** The metric's values at the finished points, against the axis value. */
function series(s: Sweep, key: string): { x: number[]; y: number[] } {
  const x: number[] = []
  const y: number[] = []
  for (const p of s.points) {
    const v = p.metrics[key]
    if (p.status !== 'succeeded' || typeof v !== 'number' || !Number.isFinite(v)) continue
    x.push(p.values[0])
    y.push(v)
  }
  return { x, y }
}

const metricKey = (s: Sweep, ci: number, key: string) => (s.baseConfig.channels.length > 1 ? `ch${ci + 1}.${key}` : key)

/** The analyses this sweep supports (none for two axes or for axes no fit applies to). */
export function sweepAnalyses(s: Sweep): SweepAnalysis[] {
  if (s.axes.length !== 1) return []
  const axis = s.axes[0]
  const cfg = s.baseConfig
  const w = cfg.waveguide
  const out: SweepAnalysis[] = []
  cfg.channels.forEach((ch, ci) => {
    const scheme = channelScheme(ch)
    const roles = scheme === 'storage' ? storageRoles(ch) : null
    const readAxis = roles !== null && axis.field === 'pulseCentreNs' && sameLabel(roles.read.label, axis.pulseLabel)
    // The write–read delay axis moves the read pulse of every channel with a write pulse (sweep-derived.ts).
    const delayAxis = roles !== null && roles.write !== null && axis.field === 'storageDelayNs'
    if (roles && (readAxis || delayAxis)) {
      // A write pulse sharing the read's label would move with it; then τ is measured from the data pulse.
      const byWrite = roles.write !== null && !sameLabel(roles.write.label, axis.pulseLabel)
      const anchor = delayAxis ? 'axis' : byWrite ? 'write' : 'data'
      const offsetNs = delayAxis ? 0 : byWrite ? roles.write!.centreNs : roles.data.centreNs
      const key = metricKey(s, ci, 'retrievalEfficiency')
      const { x, y } = series(s, key)
      out.push({ kind: 'lifetime', metricKey: key, offsetNs, anchor, result: fitExponentialDecay(x.map((v) => v - offsetNs), y), nominalEnergyLifetimeNs: 1e3 / (2 * Math.PI * w.linewidthMHz) })
    }
    const pumpPowerAxis =
      axis.field === 'pumpPowerW' ||
      axis.field === 'pumpPowerCritical' ||
      (axis.field === 'pulsePeakPowerW' && ch.pump.pulses.some((p) => sameLabel(p.label, axis.pulseLabel)) && !ch.stokes.pulses.some((p) => sameLabel(p.label, axis.pulseLabel)))
    if (scheme === 'amplifier' && pumpPowerAxis) {
      const key = metricKey(s, ci, 'peakStokesGainDb')
      const { x, y } = series(s, key)
      const wattsPerAxisUnit = axis.field === 'pumpPowerCritical' ? criticalPowerOf(cfg) : 1
      // The closed form holds for CW pump and Stokes; pulses shorter than the phonon lifetime see less gain.
      const cw = (axis.field === 'pumpPowerW' || axis.field === 'pumpPowerCritical') && ch.pump.pulses.length === 0 && ch.stokes.pulses.length === 0
      // The exponent is linear in P: its value at 1 W is the slope in nepers per watt.
      const nominal = cw ? DB_PER_NEPER_POWER * smallSignalExponent(w, 1, cfg.detuningMHz) : null
      const result = fitSmallSignalGainSlope(x.map((v) => v * wattsPerAxisUnit), y)
      out.push({ kind: 'gainSlope', metricKey: key, result, wattsPerAxisUnit, nominalSlopeDbPerW: nominal })
    }
  })
  return out
}
