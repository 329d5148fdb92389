// Columns of the waveguide's resonance tables: short labels, with units and help from the schema's `.describe()`.
import { BackwardResonance, ForwardResonance } from '@shared/physics/resonances'

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
