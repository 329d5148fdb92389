/*
 * Time step of a time-of-flight sensing run on a fibre long against its pump pulse (docs/numerics.md, step
 * rules). Such a run is a pulsed pump and a CW probe (Stokes) on one channel; what it is for is the map of
 * gain against position at the resolution δz = v_g·τ/2 (τ the pulse's duration, pulse-duration.ts). The
 * general rule of 20 steps per shortest pulse feature is replaced by
 *
 *   Δt ≤ τ/10   (Δz = v_g Δt ≤ δz/5: five cells per resolution)   and, for a rectangular pulse, Δt ≤ t_rise/2
 *
 * (the edge spans two steps). Measured on a 12-resolution fibre with a 5 MHz shift step (docs/numerics.md):
 * the 10–90 % width of the fitted shift moves by +2.3 % for a 10 ns Gaussian pulse at Δt = τ/10 against
 * Δt = τ/100, and by +2.6 % for a 10 ns rectangular pulse of 1 ns edges at Δt = t_rise/2; at Δt = t_rise it
 * moves by +12 %, hence the edge bound. The cost of a run grows as L² (cells × steps), so the coarser step
 * is what keeps a 10 km fibre inside the per-run limit; below LONG_FIBRE_RESOLUTIONS the general rule stays
 * (the run is cheap and the finer step is free accuracy). The other rules (gain and coupling per step, the
 * profile's features ≥ 2 cells) still apply; this bound only takes the place of the pulse-feature rule.
 */
import { SPEED_OF_LIGHT_M_PER_S } from './physical-constants'
import { pulseDurationNs } from './pulse-duration'
import type { SimulationConfig } from './simulation-config'

export const SENSING_GRID_RULES = {
  stepsPerDuration: 10,
  stepsPerEdge: 2,
  /** The fibre must hold this many resolutions v_g·τ/2 for the sensing rule to replace the general one. */
  longFibreResolutions: 100,
} as const

/** A pulsed pump and a continuous probe on one channel, nothing else launched or modulated. */
export function isTimeOfFlightScan(c: SimulationConfig): boolean {
  if (c.channels.length !== 1) return false
  const ch = c.channels[0]
  const plain = (p: SimulationConfig['channels'][number]['pump']) => !p.modulation && !p.broadband
  return (
    ch.pump.pulses.length > 0 &&
    ch.pump.pulses.every((p) => p.shape !== 'sampled') &&
    ch.stokes.pulses.length === 0 &&
    ch.stokes.backgroundPowerW > 0 &&
    plain(ch.pump) &&
    plain(ch.stokes) &&
    !ch.coProbe &&
    ch.forwardInputs.length === 0
  )
}

/** The sensing bound on Δt (s), or null where the general pulse-feature rule holds. */
export function sensingStepBound(c: SimulationConfig): { dtS: number; reason: string } | null {
  if (!isTimeOfFlightScan(c)) return null
  const vg = SPEED_OF_LIGHT_M_PER_S / c.waveguide.groupIndex
  let dtS = Infinity
  let longestResolutionM = 0
  for (const p of c.channels[0].pump.pulses) {
    const durationS = pulseDurationNs(p) * 1e-9
    longestResolutionM = Math.max(longestResolutionM, (vg * durationS) / 2)
    dtS = Math.min(dtS, durationS / SENSING_GRID_RULES.stepsPerDuration)
    if (p.shape === 'rectangular') dtS = Math.min(dtS, (p.riseNs * 1e-9) / SENSING_GRID_RULES.stepsPerEdge)
  }
  if (!(dtS > 0) || c.waveguide.lengthM < SENSING_GRID_RULES.longFibreResolutions * longestResolutionM) return null
  const ps = `${(dtS * 1e12).toPrecision(3)} ps`
  return { dtS, reason: `time-of-flight sensing on a fibre of ≥ ${SENSING_GRID_RULES.longFibreResolutions} resolutions: 5 cells per resolution v_g·τ/2 (and 2 steps per pulse edge) give Δt ≤ ${ps}` }
}
