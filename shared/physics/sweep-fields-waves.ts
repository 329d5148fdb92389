// Sweepable fields of the resonances, the cascade and the co-propagating probe (shared/physics/resonances.ts),
// joined to the sweep field list in sweep-fields.ts. Each names the one value it moves.
import type { SimulationConfig } from './simulation-config'
import type { SweepField } from './sweep-fields'

export const WAVE_SWEEP_FIELD_IDS = [
  'brillouinShiftGHz',
  'gainCoefficientMPerW',
  'furtherResonanceShiftGHz',
  'furtherResonanceLinewidthMHz',
  'furtherResonanceGainMPerW',
  'forwardFrequencyMHz',
  'forwardLinewidthMHz',
  'cascadeSeedPowerW',
  'coProbePowerW',
] as const
export type WaveSweepFieldId = (typeof WAVE_SWEEP_FIELD_IDS)[number]

export const isWaveSweepField = (id: string): id is WaveSweepFieldId => (WAVE_SWEEP_FIELD_IDS as readonly string[]).includes(id)

const field = (id: WaveSweepFieldId, label: string, unit: string, path: string, help: string): SweepField => ({ id, label, unit, path, needsPulseLabel: false, positive: true, help })

export const WAVE_SWEEP_FIELDS: readonly SweepField[] = [
  field('brillouinShiftGHz', 'Brillouin shift', 'GHz', 'waveguide.brillouinShiftGHz', 'Shift ν_B of the main backward resonance'),
  field('gainCoefficientMPerW', 'Brillouin gain coefficient', 'm/W', 'waveguide.gainCoefficientMPerW', 'Peak gain coefficient g_B of the main backward resonance'),
  field('furtherResonanceShiftGHz', 'Further resonance 1: shift', 'GHz', 'waveguide.additionalResonances[0].shiftGHz', 'Shift of the first further backward resonance'),
  field('furtherResonanceLinewidthMHz', 'Further resonance 1: linewidth', 'MHz', 'waveguide.additionalResonances[0].linewidthMHz', 'Linewidth (FWHM) of the first further backward resonance'),
  field('furtherResonanceGainMPerW', 'Further resonance 1: gain coefficient', 'm/W', 'waveguide.additionalResonances[0].gainCoefficientMPerW', 'Peak gain coefficient of the first further backward resonance'),
  field('forwardFrequencyMHz', 'Forward resonance 1: frequency', 'MHz', 'waveguide.forwardResonances[0].frequencyMHz', 'Frequency ν_F of the first forward resonance'),
  field('forwardLinewidthMHz', 'Forward resonance 1: linewidth', 'MHz', 'waveguide.forwardResonances[0].linewidthMHz', 'Linewidth (FWHM) of the first forward resonance'),
  { ...field('cascadeSeedPowerW', 'Seed power of the higher Stokes orders', 'W', 'options.cascade.seedPowerW', 'CW power launched into each Stokes order above the first'), positive: false },
  { ...field('coProbePowerW', 'CW co-propagating probe power', 'W', 'channels[*].coProbe.backgroundPowerW', 'Continuous power of the probe launched with the pump'), positive: false },
]

export function waveFieldProblem(config: SimulationConfig, id: WaveSweepFieldId): string | null {
  const w = config.waveguide
  if (id.startsWith('furtherResonance') && (w.additionalResonances ?? []).length === 0) return 'The base waveguide has no further backward resonance'
  if (id.startsWith('forward') && (w.forwardResonances ?? []).length === 0) return 'The base waveguide has no forward resonance'
  if (id === 'cascadeSeedPowerW' && config.options.cascade.stokesOrders < 2) return 'The base configuration has one Stokes order: set two or more to sweep the seed of the higher orders'
  if (id === 'coProbePowerW' && !config.channels.some((c) => c.coProbe)) return 'The base configuration has no co-propagating probe'
  return null
}

/** Sets the field on `c` in place (the caller has copied it). */
export function applyWaveSweepValue(c: SimulationConfig, id: WaveSweepFieldId, value: number): void {
  const w = c.waveguide
  const further = w.additionalResonances?.[0]
  const forward = w.forwardResonances?.[0]
  switch (id) {
    case 'brillouinShiftGHz':
      w.brillouinShiftGHz = value
      break
    case 'gainCoefficientMPerW':
      w.gainCoefficientMPerW = value
      break
    case 'furtherResonanceShiftGHz':
      if (further) further.shiftGHz = value
      break
    case 'furtherResonanceLinewidthMHz':
      if (further) further.linewidthMHz = value
      break
    case 'furtherResonanceGainMPerW':
      if (further) further.gainCoefficientMPerW = value
      break
    case 'forwardFrequencyMHz':
      if (forward) forward.frequencyMHz = value
      break
    case 'forwardLinewidthMHz':
      if (forward) forward.linewidthMHz = value
      break
    case 'cascadeSeedPowerW':
      c.options.cascade.seedPowerW = value
      break
    case 'coProbePowerW':
      for (const ch of c.channels) if (ch.coProbe) ch.coProbe.backgroundPowerW = value
      break
  }
}

export function readWaveSweepValue(config: SimulationConfig, id: WaveSweepFieldId): number | null {
  const w = config.waveguide
  switch (id) {
    case 'brillouinShiftGHz':
      return w.brillouinShiftGHz
    case 'gainCoefficientMPerW':
      return w.gainCoefficientMPerW
    case 'furtherResonanceShiftGHz':
      return w.additionalResonances?.[0]?.shiftGHz ?? null
    case 'furtherResonanceLinewidthMHz':
      return w.additionalResonances?.[0]?.linewidthMHz ?? null
    case 'furtherResonanceGainMPerW':
      return w.additionalResonances?.[0]?.gainCoefficientMPerW ?? null
    case 'forwardFrequencyMHz':
      return w.forwardResonances?.[0]?.frequencyMHz ?? null
    case 'forwardLinewidthMHz':
      return w.forwardResonances?.[0]?.linewidthMHz ?? null
    case 'cascadeSeedPowerW':
      return config.options.cascade.seedPowerW
    case 'coProbePowerW':
      return config.channels.find((c) => c.coProbe)?.coProbe?.backgroundPowerW ?? null
  }
}
