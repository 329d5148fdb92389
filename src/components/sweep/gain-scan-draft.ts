// A gain-spectrum scan as the sweep form takes it: the detuning axis of shared/physics/gain-scan.ts as an
// axis draft, and the sentences that tell the user what will be swept and what the chart will show.
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { gainDrive } from '@shared/physics/gain-spectrum'
import { SCAN_LINEWIDTHS, SETTLED_TAIL_FRACTION, gainScanPlan, withSettledWindows, type GainScanPlan } from '@shared/physics/gain-scan'
import { pulseDurationNs } from '@shared/physics/pulse-duration'
import { isTimeOfFlightScan } from '@shared/physics/sensing-grid-rules'
import { profileIsActive } from '@shared/physics/longitudinal-profile'
import type { AxisDraft } from './axis-draft'
import { formatValue } from './sweep-format'

export interface GainScanStart {
  plan: GainScanPlan
  /** The base configuration of the sweep: for CW runs with the two settled-tail windows added. */
  config: SimulationConfig
  draft: AxisDraft
  /** What is swept, in words. */
  range: string
  /** What the chart will plot for this base configuration. */
  chart: string
  /** A CW window too short for the Stokes output to settle to its steady gain, or null. */
  settle: string | null
  /** A time-of-flight scan with a pump pulse of another shape: the rectangular pulse of the same duration, or null. */
  pulseOffer: { text: string; config: SimulationConfig } | null
}

/** Edges of the offered rectangular pulse, as a fraction of its duration (docs/analysis.md, sensing map). */
export const OFFERED_RISE_PER_DURATION = 1 / 5

/** A pulsed pump and a CW probe on a waveguide with a longitudinal profile: what a sensing scan is set up for. */
const isSensingScan = (config: SimulationConfig) => isTimeOfFlightScan(config) && profileIsActive(config.waveguide.profile)

/**
 * Time-domain analysers launch rectangular pump pulses, and the trade's resolution v_g·τ/2 is written for them
 * (common practice). The offer keeps the duration (so the energy) and the peak power; its 10–90 % edges of τ/5
 * keep the sensing step rule's edge bound (Δt ≤ t_rise/2) no finer than its resolution bound (Δt ≤ τ/10).
 */
function rectangularOffer(config: SimulationConfig): GainScanStart['pulseOffer'] {
  if (!isSensingScan(config)) return null
  const pulses = config.channels[0].pump.pulses
  if (pulses.length !== 1 || pulses[0].shape === 'rectangular' || pulses[0].shape === 'sampled') return null
  const p = pulses[0]
  const durationNs = Number(pulseDurationNs(p).toPrecision(4))
  const riseNs = Number((durationNs * OFFERED_RISE_PER_DURATION).toPrecision(3))
  const rect = { shape: 'rectangular' as const, label: p.label, peakPowerW: p.peakPowerW, centreNs: p.centreNs, phaseRad: p.phaseRad, frequencyOffsetMHz: p.frequencyOffsetMHz, fwhmNs: durationNs, riseNs }
  const ch = config.channels[0]
  return {
    text: `Time-domain analysers launch rectangular pump pulses. Use one of τ = ${formatValue(durationNs)} ns (the duration of the present ${p.shape === 'superGaussian' ? 'super-Gaussian' : p.shape === 'sech2' ? 'sech²' : 'Gaussian'} pulse: same energy and peak power), with ${formatValue(riseNs)} ns edges.`,
    config: { ...config, channels: [{ ...ch, pump: { ...ch.pump, pulses: [rect] } }] },
  }
}

/**
 * Phonon lifetimes 1/Γ_B a CW window should span before its last samples show the steady gain. Measured on
 * the validation chip (G₀ = 0.75): the peak gain is 15 % low after 4 lifetimes, 0.4 % after 13, exact after 32.
 */
export const CW_SETTLE_LIFETIMES = 25

export function gainScanStart(config: SimulationConfig): GainScanStart {
  const plan = gainScanPlan(config.waveguide)
  const draft: AxisDraft = {
    field: 'detuningMHz',
    pulseLabel: '',
    tiedLabels: [],
    kind: 'linear',
    listText: '',
    start: String(plan.startMHz),
    stop: String(plan.stopMHz),
    count: String(plan.count),
  }
  const where =
    plan.lines === 1
      ? `±${SCAN_LINEWIDTHS} linewidths around the Brillouin resonance`
      : `all ${plan.lines} backward resonances, from the lowest one − ${SCAN_LINEWIDTHS} of its linewidths to the highest + ${SCAN_LINEWIDTHS}`
  const span = plan.profileSpanMHz
  const profile = span && (span[0] < 0 || span[1] > 0) ? `, widened to the profile's local shift changes (${formatValue(span[0])} to ${formatValue(span[1])} MHz) ± ${SCAN_LINEWIDTHS} linewidths` : ''
  const range = `Detuning from ${formatValue(plan.startMHz)} to ${formatValue(plan.stopMHz)} MHz in ${plan.count} points, ${formatValue(plan.stepMHz)} MHz apart: ${where}${profile}.`
  const drive = gainDrive(config)
  const tailNs = formatValue(config.windowNs * SETTLED_TAIL_FRACTION)
  const chart = isSensingScan(config)
    ? 'A pulsed pump and a continuous probe: a sensing scan with the time-of-flight read-out. The sweep page shows the probe gain against position and frequency, the fitted shift profile over the true one, the spatial resolution (nominal and measured) and each hot spot of the profile.'
    : drive.kind === 'cw'
      ? `Pump and Stokes are continuous: the sweep page plots the Stokes gain against detuning over the closed-form small-signal gain (a sum of Lorentzians). The gain is read over the last ${tailNs} ns of each run, after the switch-on ringing, from two energy windows added to the base configuration.`
      : 'The pump or Stokes is pulsed: the sweep page plots the effective gain (peak Stokes output over peak input) against detuning, with the continuous-wave closed form at the peak pump power as a dashed reference.'
  // The narrowest line has the longest lifetime 1/Γ = 1/(2π·Δν).
  const lifetimeNs = 1e3 / (2 * Math.PI * Math.min(config.waveguide.linewidthMHz, ...(config.waveguide.additionalResonances ?? []).map((r) => r.linewidthMHz)))
  const lifetimes = config.windowNs / lifetimeNs
  const settle =
    drive.kind === 'cw' && lifetimes < CW_SETTLE_LIFETIMES
      ? `The window, ${formatValue(config.windowNs)} ns, spans ${formatValue(Number(lifetimes.toPrecision(2)))} phonon lifetimes: a CW run's Stokes output settles to its steady gain over tens of lifetimes, so the points may lie below the closed form. A window of ${formatValue(Math.ceil(CW_SETTLE_LIFETIMES * lifetimeNs))} ns or more lets them reach it.`
      : null
  return { plan, config: drive.kind === 'cw' ? withSettledWindows(config) : config, draft, range, chart, settle, pulseOffer: rectangularOffer(config) }
}
