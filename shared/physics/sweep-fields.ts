// The configuration fields a sweep may vary: label, unit, where in SimulationConfig the value goes, and how
// to set and read it. One list for the sweep form, the API and the CSV header.
import type { Pulse } from './pulse'
import type { BroadbandSource, FrequencyModulation } from './source-modulation'
import type { SimulationConfig } from './simulation-config'
import { criticalPowerOf, energyPerPeakNs, setStorageDelay, storageDelayNs } from './sweep-derived'
import { WAVE_SWEEP_FIELD_IDS, WAVE_SWEEP_FIELDS, applyWaveSweepValue, isWaveSweepField, readWaveSweepValue, waveFieldProblem } from './sweep-fields-waves'

export const SWEEP_FIELD_IDS = [
  'pulseFwhmNs',
  'pulsePeakPowerW',
  'pulseCentreNs',
  'pulseSpacingNs',
  'pulseEnergyNJ',
  'storageDelayNs',
  'detuningMHz',
  'pumpPowerCritical',
  'pumpPowerW',
  'stokesPowerW',
  'lengthM',
  'linewidthMHz',
  'lossDbPerM',
  'modulationRateMHz',
  'modulationExcursionMHz',
  'modulationDelayNs',
  ...WAVE_SWEEP_FIELD_IDS,
] as const
export type SweepFieldId = (typeof SWEEP_FIELD_IDS)[number]

export interface SweepField {
  id: SweepFieldId
  label: string
  unit: string
  /** Where the value lands, for people: [*] = every channel, [label] = every pulse with the axis's label. */
  path: string
  /** Pulse fields act on every pulse carrying the axis's label (all channels, both ports). */
  needsPulseLabel: boolean
  /** Values must be > 0 (a width, a length); else ≥ 0 unless `signed`. */
  positive: boolean
  signed?: boolean
  help: string
}

export const SWEEP_FIELDS: readonly SweepField[] = [
  { id: 'pulseFwhmNs', label: 'Pulse width', unit: 'ns', path: 'channels[*].{pump,stokes}.pulses[label].fwhmNs', needsPulseLabel: true, positive: true, help: 'Power FWHM of the labelled pulse(s)' },
  { id: 'pulsePeakPowerW', label: 'Pulse peak power', unit: 'W', path: 'channels[*].{pump,stokes}.pulses[label].peakPowerW', needsPulseLabel: true, positive: false, help: 'Peak power of the labelled pulse(s)' },
  { id: 'pulseCentreNs', label: 'Pulse centre (e.g. write–read delay)', unit: 'ns', path: 'channels[*].{pump,stokes}.pulses[label].centreNs', needsPulseLabel: true, positive: false, help: 'Centre time of the labelled pulse(s); sweeping the read pulse sweeps the storage time' },
  { id: 'pulseSpacingNs', label: 'Pulse spacing (e.g. refresh spacing)', unit: 'ns', path: 'channels[*].{pump,stokes}.pulses[label].centreNs = first + k·spacing', needsPulseLabel: true, positive: true, help: 'The labelled pulses keep the first one’s centre and are re-spaced evenly' },
  { id: 'pulseEnergyNJ', label: 'Pulse energy (fixed width)', unit: 'nJ', path: 'channels[*].{pump,stokes}.pulses[label].peakPowerW = E/∫P/P_peak dt', needsPulseLabel: true, positive: false, help: 'Energy of the labelled pulse(s); the peak power follows at the pulse’s own width and shape' },
  { id: 'storageDelayNs', label: 'Write–read delay', unit: 'ns', path: 'channels[*].stokes.pulses[read].centreNs = write centre + delay', needsPulseLabel: false, positive: true, help: 'Storage time: the read pulse moves, the write pulse stays' },
  { id: 'detuningMHz', label: 'Detuning', unit: 'MHz', path: 'detuningMHz', needsPulseLabel: false, positive: false, signed: true, help: '(ν_p − ν_s) − ν_B' },
  { id: 'pumpPowerW', label: 'CW pump power', unit: 'W', path: 'channels[*].pump.backgroundPowerW', needsPulseLabel: false, positive: false, help: 'Continuous pump power in every channel' },
  { id: 'pumpPowerCritical', label: 'CW pump power / critical power', unit: '× P_cr', path: 'channels[*].pump.backgroundPowerW = x·21/(G_B L_eff)', needsPulseLabel: false, positive: false, help: 'Continuous pump power in units of the critical power P_cr = 21/(G_B L_eff) (Smith 1972)' },
  { id: 'stokesPowerW', label: 'CW Stokes seed power', unit: 'W', path: 'channels[*].stokes.backgroundPowerW', needsPulseLabel: false, positive: false, help: 'Continuous Stokes power in every channel' },
  { id: 'lengthM', label: 'Waveguide length', unit: 'm', path: 'waveguide.lengthM', needsPulseLabel: false, positive: true, help: 'Interaction length L' },
  { id: 'linewidthMHz', label: 'Brillouin linewidth', unit: 'MHz', path: 'waveguide.linewidthMHz', needsPulseLabel: false, positive: true, help: 'Gain linewidth Δν_B (FWHM); sets the phonon lifetime' },
  { id: 'lossDbPerM', label: 'Optical loss', unit: 'dB/m', path: 'waveguide.lossDbPerM', needsPulseLabel: false, positive: false, help: 'Propagation loss of both optical waves' },
  { id: 'modulationRateMHz', label: 'Modulation rate', unit: 'MHz', path: 'channels[*].{pump,stokes}.modulation.rateMHz', needsPulseLabel: false, positive: true, help: 'Rate f_m of every frequency-modulated input; sets the spacing of correlation peaks' },
  { id: 'modulationExcursionMHz', label: 'Frequency excursion', unit: 'MHz', path: 'channels[*].{pump,stokes}.modulation.excursionMHz', needsPulseLabel: false, positive: false, help: 'Excursion Δf of every frequency-modulated input; sets the width of correlation peaks' },
  { id: 'modulationDelayNs', label: 'Stokes source delay', unit: 'ns', path: 'channels[*].stokes.{modulation,broadband}.delayNs', needsPulseLabel: false, positive: false, signed: true, help: 'Delay of the Stokes input’s modulation or random phase; moves the correlation peaks along the guide' },
  ...WAVE_SWEEP_FIELDS,
]

export function sweepField(id: SweepFieldId): SweepField {
  if (isWaveSweepField(id)) return WAVE_SWEEP_FIELDS.find((f) => f.id === id)!
  return SWEEP_FIELDS.find((f) => f.id === id)!
}

const sameLabel = (p: Pulse, label: string) => (p.label ?? '').trim().toLowerCase() === label.trim().toLowerCase()

/** Every pulse with the label, across channels and ports, in centre order. */
export function labelledPulses(config: SimulationConfig, label: string): Pulse[] {
  return config.channels
    .flatMap((c) => [...c.pump.pulses, ...c.stokes.pulses])
    .filter((p) => sameLabel(p, label))
    .sort((a, b) => a.centreNs - b.centreNs)
}

/** Pulse labels present in a config (for the form's choice list). */
export function pulseLabels(config: SimulationConfig): string[] {
  const out = new Set<string>()
  for (const c of config.channels) for (const p of [...c.pump.pulses, ...c.stokes.pulses]) if (p.label?.trim()) out.add(p.label.trim())
  return [...out]
}

/** Every frequency-modulated input (both ports of every channel). */
function modulations(config: SimulationConfig): FrequencyModulation[] {
  return config.channels.flatMap((c) => [c.pump, c.stokes]).flatMap((p) => (p.modulation ? [p.modulation] : []))
}

/** The modulation and broadband source of every Stokes input: what a delay sweep moves. */
function stokesSources(config: SimulationConfig): { delayNs: number }[] {
  return config.channels.flatMap((c) => [c.stokes.modulation, c.stokes.broadband]).filter((x): x is FrequencyModulation | BroadbandSource => x !== undefined)
}

/** Why the field cannot be swept on this config, or null when it can. */
export function fieldProblem(config: SimulationConfig, id: SweepFieldId, pulseLabel?: string): string | null {
  const f = sweepField(id)
  if (isWaveSweepField(id)) return waveFieldProblem(config, id)
  if (id === 'modulationDelayNs' && stokesSources(config).length === 0) return 'The base configuration has no modulated or broadband Stokes input'
  if ((id === 'modulationRateMHz' || id === 'modulationExcursionMHz') && modulations(config).length === 0) return 'The base configuration has no frequency-modulated input'
  if (id === 'storageDelayNs' && storageDelayNs(config) === null) return 'The base configuration has no storage pulses: label a pump pulse “data”, and Stokes pulses “write” and “read”'
  if (!f.needsPulseLabel) return null
  if (!pulseLabel?.trim()) return `${f.label} needs the label of the pulse(s) to vary`
  const pulses = labelledPulses(config, pulseLabel)
  if (pulses.length === 0) {
    const known = pulseLabels(config)
    return `The base configuration has no pulse labelled "${pulseLabel}"${known.length ? ` (labels: ${known.join(', ')})` : ''}`
  }
  if (id === 'pulseEnergyNJ' && pulses.some((p) => !(energyPerPeakNs(p) > 0))) return `A pulse labelled "${pulseLabel}" has no power profile to scale`
  if (id === 'pulseFwhmNs' && pulses.some((p) => !('fwhmNs' in p))) return `A pulse labelled "${pulseLabel}" is sampled and has no width to vary`
  if (id === 'pulseSpacingNs' && pulses.length < 2) return `Spacing needs at least two pulses labelled "${pulseLabel}"`
  return null
}

/**
 * A copy of `config` with the field set to `value`. The result is not re-validated here: the caller parses it
 * with SimulationConfig, so a value that breaks a cross-field rule (a centre outside the window) is reported.
 */
export function applySweepValue(config: SimulationConfig, id: SweepFieldId, value: number, pulseLabel?: string): SimulationConfig {
  const c: SimulationConfig = JSON.parse(JSON.stringify(config))
  const pulses = () => (pulseLabel ? labelledPulses(c, pulseLabel) : [])
  switch (id) {
    case 'pulseFwhmNs':
      for (const p of pulses()) if ('fwhmNs' in p) p.fwhmNs = value
      break
    case 'pulsePeakPowerW':
      for (const p of pulses()) p.peakPowerW = value
      break
    case 'pulseCentreNs':
      for (const p of pulses()) p.centreNs = value
      break
    case 'pulseSpacingNs': {
      const ps = pulses()
      const first = ps[0]?.centreNs ?? 0
      ps.forEach((p, k) => (p.centreNs = first + k * value))
      break
    }
    case 'pulseEnergyNJ':
      for (const p of pulses()) p.peakPowerW = value / energyPerPeakNs(p)
      break
    case 'storageDelayNs':
      setStorageDelay(c, value)
      break
    case 'pumpPowerCritical': {
      const pCr = criticalPowerOf(c)
      for (const ch of c.channels) ch.pump.backgroundPowerW = value * pCr
      break
    }
    case 'detuningMHz':
      c.detuningMHz = value
      break
    case 'pumpPowerW':
      for (const ch of c.channels) ch.pump.backgroundPowerW = value
      break
    case 'stokesPowerW':
      for (const ch of c.channels) ch.stokes.backgroundPowerW = value
      break
    case 'lengthM':
      c.waveguide.lengthM = value
      break
    case 'linewidthMHz':
      c.waveguide.linewidthMHz = value
      break
    case 'lossDbPerM':
      c.waveguide.lossDbPerM = value
      break
    case 'modulationRateMHz':
      for (const m of modulations(c)) m.rateMHz = value
      break
    case 'modulationExcursionMHz':
      for (const m of modulations(c)) m.excursionMHz = value
      break
    case 'modulationDelayNs':
      for (const m of stokesSources(c)) m.delayNs = value
      break
    default:
      applyWaveSweepValue(c, id, value)
  }
  return c
}

/** The field's value in a config (the first labelled pulse's; mean spacing), or null when absent. */
export function readSweepValue(config: SimulationConfig, id: SweepFieldId, pulseLabel?: string): number | null {
  const ps = pulseLabel ? labelledPulses(config, pulseLabel) : []
  switch (id) {
    case 'pulseFwhmNs':
      return ps[0] && 'fwhmNs' in ps[0] ? ps[0].fwhmNs : null
    case 'pulsePeakPowerW':
      return ps[0]?.peakPowerW ?? null
    case 'pulseCentreNs':
      return ps[0]?.centreNs ?? null
    case 'pulseSpacingNs':
      return ps.length >= 2 ? (ps[ps.length - 1].centreNs - ps[0].centreNs) / (ps.length - 1) : null
    case 'pulseEnergyNJ':
      return ps[0] ? ps[0].peakPowerW * energyPerPeakNs(ps[0]) : null
    case 'storageDelayNs':
      return storageDelayNs(config)
    case 'pumpPowerCritical':
      return config.channels[0].pump.backgroundPowerW / criticalPowerOf(config)
    case 'detuningMHz':
      return config.detuningMHz
    case 'pumpPowerW':
      return config.channels[0].pump.backgroundPowerW
    case 'stokesPowerW':
      return config.channels[0].stokes.backgroundPowerW
    case 'lengthM':
      return config.waveguide.lengthM
    case 'linewidthMHz':
      return config.waveguide.linewidthMHz
    case 'lossDbPerM':
      return config.waveguide.lossDbPerM
    case 'modulationRateMHz':
      return modulations(config)[0]?.rateMHz ?? null
    case 'modulationExcursionMHz':
      return modulations(config)[0]?.excursionMHz ?? null
    case 'modulationDelayNs':
      return stokesSources(config)[0]?.delayNs ?? null
    default:
      return readWaveSweepValue(config, id)
  }
}
