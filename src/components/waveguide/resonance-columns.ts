// Columns of the waveguide's resonance tables: short labels, with units and help from the schema's `.describe()`.
import { BackwardResonance, ForwardResonance } from '@shared/physics/resonances'
import { ProfileSegment } from '@shared/physics/longitudinal-profile'

export interface ResonanceColumn {
  key: string
  label: string
  description?: string
  placeholder?: string
}

const b = BackwardResonance.shape
const f = ForwardResonance.shape

export const BACKWARD_COLUMNS: ResonanceColumn[] = [
  { key: 'shiftGHz', label: 'Shift ν_B,r', description: b.shiftGHz.description },
  { key: 'linewidthMHz', label: 'Linewidth Δν_r', description: b.linewidthMHz.description },
  { key: 'gainCoefficientMPerW', label: 'Gain coefficient g_B,r', description: b.gainCoefficientMPerW.description },
]

export const FORWARD_COLUMNS: ResonanceColumn[] = [
  { key: 'frequencyMHz', label: 'Frequency ν_F', description: f.frequencyMHz.description },
  { key: 'linewidthMHz', label: 'Linewidth Δν_F', description: f.linewidthMHz.description },
  { key: 'gainCoefficientMPerW', label: 'Gain coefficient g_F', description: f.gainCoefficientMPerW.description },
  { key: 'antiStokesMismatchPerM', label: 'Anti-Stokes mismatch Δk', description: f.antiStokesMismatchPerM.description, placeholder: '0' },
]

const s = ProfileSegment.shape

/** Columns of the longitudinal profile: where a section lies and what differs there (empty = the waveguide's value). */
export const PROFILE_COLUMNS: ResonanceColumn[] = [
  { key: 'startM', label: 'From z', description: s.startM.description },
  { key: 'endM', label: 'To z', description: s.endM.description },
  { key: 'temperatureOffsetK', label: 'Temperature change ΔT', description: s.temperatureOffsetK.description, placeholder: '0' },
  { key: 'strainMicro', label: 'Strain ε', description: s.strainMicro.description, placeholder: '0' },
  { key: 'shiftOffsetMHz', label: 'Further shift change', description: s.shiftOffsetMHz.description, placeholder: '0' },
  { key: 'linewidthMHz', label: 'Linewidth Δν_B', description: s.linewidthMHz.description, placeholder: 'as the waveguide' },
  { key: 'gainCoefficientMPerW', label: 'Gain coefficient g_B', description: s.gainCoefficientMPerW.description, placeholder: 'as the waveguide' },
  { key: 'lossDbPerM', label: 'Loss', description: s.lossDbPerM.description, placeholder: 'as the waveguide' },
]
