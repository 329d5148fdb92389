/*
 * Limits of a source that are not step rules: how wide its spectrum may be, and how long a broadband delay.
 *
 * Spectral width. The model carries pump and Stokes as two envelopes on carriers ν_B
 * apart (docs/model.md, equations); a modulated or broadband field whose spectrum reaches halfway to the other
 * carrier would be light the model assigns to the wrong wave.
 *
 * Frequency modulation: by Carson's rule (common practice) the spectrum spans ν ± (Δf + f_m); refuse
 * Δf + f_m ≥ ν_B/2. Broadband: a Lorentzian of FWHM Δν has 1 − (2/π)·atan(ν_B/Δν) of its power beyond ±ν_B/2;
 * refuse Δν > ν_B/10, where that reaches 6 %.
 *
 * Channels: cross beats between channels are dropped (docs/model.md, options), which needs their spectra apart.
 * Besides the ten Brillouin linewidths every channel keeps, channels with modulated or broadband inputs keep
 * each one's spectral half-width: Δf + f_m for a modulation (Carson), 5Δν for a broadband source (the ±5Δν that
 * hold 94 % of a Lorentzian, the same cut as above).
 *
 * Broadband delay: a port delayed by t_d reads its source's random walk from t = −t_d, one walk step per
 * 10⁻³ rad² of diffusion (source-phase.ts); |t_d| is held to the simulated window so that costs no more than
 * the window itself.
 */
import type { SimulationConfig } from './simulation-config'
import { channelInputs } from './source-grid-rules'

export const MAX_LINEWIDTH_PER_SHIFT = 0.1

export interface SourceLimitIssue {
  path: (string | number)[]
  message: string
}

export function sourceLimitIssues(config: SimulationConfig): SourceLimitIssue[] {
  const halfShiftMHz = (config.waveguide.brillouinShiftGHz * 1000) / 2
  const out: SourceLimitIssue[] = []
  config.channels.forEach((ch, ci) => {
    for (const [at, { modulation, broadband }] of channelInputs(ch)) {
      const path = ['channels', ci, ...at]
      // Forward waves sit ν_F, not ν_B, from the pump; their spacing is the forward resonance's to check.
      const backwardPair = at[0] !== 'forwardInputs'
      if (backwardPair && modulation && modulation.excursionMHz + modulation.rateMHz >= halfShiftMHz) {
        out.push({
          path: [...path, 'modulation', 'excursionMHz'],
          message: `Excursion plus rate must stay below half the Brillouin shift (${halfShiftMHz.toPrecision(4)} MHz): a wider modulation reaches the other wave's carrier, which this model of two separate waves does not describe`,
        })
      }
      if (backwardPair && broadband && broadband.linewidthMHz > MAX_LINEWIDTH_PER_SHIFT * 2 * halfShiftMHz) {
        out.push({
          path: [...path, 'broadband', 'linewidthMHz'],
          message: `The linewidth must be at most a tenth of the Brillouin shift (${(MAX_LINEWIDTH_PER_SHIFT * 2 * halfShiftMHz).toPrecision(4)} MHz): a broader source puts light at the other wave's carrier, which this model of two separate waves does not describe`,
        })
      }
      if (broadband && Math.abs(broadband.delayNs) > config.windowNs) {
        out.push({ path: [...path, 'broadband', 'delayNs'], message: `The delay must lie within ±${config.windowNs} ns, the simulated window` })
      }
    }
  })
  const halfWidthsMHz = config.channels.map((ch) =>
    Math.max(0, ...channelInputs(ch).map(([, p]) => Math.max(p.modulation ? p.modulation.excursionMHz + p.modulation.rateMHz : 0, p.broadband ? 5 * p.broadband.linewidthMHz : 0))),
  )
  for (let i = 0; i < config.channels.length; i++) {
    for (let j = i + 1; j < config.channels.length; j++) {
      const extraMHz = halfWidthsMHz[i] + halfWidthsMHz[j]
      const needGHz = (10 * config.waveguide.linewidthMHz + extraMHz) / 1000
      if (extraMHz > 0 && Math.abs(config.channels[i].offsetGHz - config.channels[j].offsetGHz) < needGHz) {
        out.push({
          path: ['channels', j, 'offsetGHz'],
          message: `Channels ${i + 1} and ${j + 1} must be at least ${needGHz.toPrecision(3)} GHz apart: 10 linewidths plus the spectral half-width of each one's modulated or broadband inputs`,
        })
      }
    }
  }
  return out
}
