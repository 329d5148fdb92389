/*
 * Time-step rules for modulated and broadband sources, used by the automatic grid (grid-step.ts) and by the
 * check of a step the user sets (simulation-config.ts).
 *
 * Frequency modulation: by Carson's rule (Carson 1922; common practice) a tone of rate f_m and excursion Δf
 * occupies B = 2(Δf + f_m); the beat of two such waves, which drives the sound, twice that. The grid picks
 * Δt ≤ 1/(10·B) (ten samples per Carson bandwidth) and refuses Δt > 1/(2·B), where the sampled field can no
 * longer hold the modulation's sidebands (the complex envelope needs a sample rate above its bandwidth, and
 * the beat above 2B).
 *
 * Broadband source: the phase moves by 2πΔν·Δt (rad², variance) per step. The grid picks 2πΔν·Δt ≤ 0.05 and
 * refuses 2πΔν·Δt > 0.5: then over 5 % of the Lorentzian's power lies beyond the grid's Nyquist frequency
 * 1/(2Δt) (the tail fraction ≈ 2ΔνΔt/π) and folds back.
 */
import type { BroadbandSource, FrequencyModulation } from './source-modulation'
import type { Channel, SimulationConfig } from './simulation-config'
import type { PortInput } from './pulse'

export const SOURCE_GRID_RULES = {
  /** Automatic grid: samples per Carson bandwidth. */
  samplesPerCarsonBandwidth: 10,
  /** Refusal: fewer samples per Carson bandwidth than this. */
  minSamplesPerCarsonBandwidth: 2,
  /** Automatic grid: phase variance per step of a broadband source (rad²). */
  phaseVariancePerStep: 0.05,
  /** Refusal: more phase variance per step than this (rad²). */
  maxPhaseVariancePerStep: 0.5,
} as const

/** Carson bandwidth 2(Δf + f_m) (Hz). */
export const carsonBandwidthHz = (m: FrequencyModulation): number => 2 * (m.excursionMHz + m.rateMHz) * 1e6

/** Largest step (s) that keeps `samples` per Carson bandwidth. */
export const modulationStepS = (m: FrequencyModulation, samples: number): number => 1 / (samples * carsonBandwidthHz(m))

/** Largest step (s) with at most `variance` rad² of phase diffusion per step. */
export const broadbandStepS = (b: BroadbandSource, variance: number): number => variance / (2 * Math.PI * b.linewidthMHz * 1e6)

/** Every input of a channel with its path below the channel: pump, Stokes, co-propagating probe, forward waves. */
export function channelInputs(ch: Channel): [(string | number)[], PortInput][] {
  const out: [(string | number)[], PortInput][] = [
    [['pump'], ch.pump],
    [['stokes'], ch.stokes],
  ]
  if (ch.coProbe) out.push([['coProbe'], ch.coProbe])
  ch.forwardInputs.forEach((f, fi) => out.push([['forwardInputs', fi, 'stokes'], f.stokes], [['forwardInputs', fi, 'antiStokes'], f.antiStokes]))
  return out
}

export interface SourceStepBound {
  /** Largest step the source allows (s). */
  dtS: number
  /** The field that sets it: an excursion or a linewidth. */
  path: (string | number)[]
  kind: 'modulation' | 'broadband'
}

/** The tightest automatic-grid bound of every modulated or broadband port, or null when there is none. */
export function sourceStepBound(config: SimulationConfig, strict = false): SourceStepBound | null {
  const samples = strict ? SOURCE_GRID_RULES.minSamplesPerCarsonBandwidth : SOURCE_GRID_RULES.samplesPerCarsonBandwidth
  const variance = strict ? SOURCE_GRID_RULES.maxPhaseVariancePerStep : SOURCE_GRID_RULES.phaseVariancePerStep
  let best: SourceStepBound | null = null
  config.channels.forEach((ch, ci) => {
    for (const [at, { modulation, broadband }] of channelInputs(ch)) {
      if (modulation) {
        const dtS = modulationStepS(modulation, samples)
        if (!best || dtS < best.dtS) best = { dtS, path: ['channels', ci, ...at, 'modulation', 'excursionMHz'], kind: 'modulation' }
      }
      if (broadband) {
        const dtS = broadbandStepS(broadband, variance)
        if (!best || dtS < best.dtS) best = { dtS, path: ['channels', ci, ...at, 'broadband', 'linewidthMHz'], kind: 'broadband' }
      }
    }
  })
  return best
}

/** Why a step the user set is too coarse for the sources, or null when it is fine. */
export function sourceStepProblem(config: SimulationConfig, timeStepPs: number): string | null {
  const bound = sourceStepBound(config, true)
  if (!bound || timeStepPs * 1e-12 <= bound.dtS) return null
  const maxPs = (bound.dtS * 1e12).toPrecision(3)
  return bound.kind === 'modulation'
    ? `The time step must resolve the frequency modulation: at most ${maxPs} ps, two samples per Carson bandwidth 2(Δf + f_m)`
    : `The time step must resolve the broadband source: at most ${maxPs} ps, so that its phase diffuses by no more than ${SOURCE_GRID_RULES.maxPhaseVariancePerStep} rad² per step (2πΔν·Δt)`
}
