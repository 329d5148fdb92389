// Which Waveguide fields the editor shows, in which group. Labels, units and help come from the schema.
import { Waveguide, type WaveguideInput } from '@shared/physics/waveguide'

export type WaveguideNumberKey = Exclude<keyof WaveguideInput, 'name'>

export interface WaveguideFieldGroup {
  title: string
  fields: { key: WaveguideNumberKey; label?: string; optional?: boolean }[]
}

export const WAVEGUIDE_FIELD_GROUPS: WaveguideFieldGroup[] = [
  {
    title: 'Guide and light',
    fields: [
      { key: 'lengthM', label: 'Length L' },
      { key: 'lossDbPerM', label: 'Loss α' },
      { key: 'groupIndex', label: 'Group index n_g' },
      { key: 'phaseIndex', label: 'Phase index n' },
      { key: 'effectiveAreaUm2', label: 'Effective area A_eff' },
      { key: 'wavelengthNm', label: 'Pump wavelength λ' },
    ],
  },
  {
    title: 'Brillouin response',
    fields: [
      { key: 'brillouinShiftGHz', label: 'Brillouin shift ν_B' },
      { key: 'linewidthMHz', label: 'Linewidth Δν_B (FWHM)' },
      { key: 'gainCoefficientMPerW', label: 'Gain coefficient g_B' },
      { key: 'polarisationFactor', label: 'Polarisation factor η_pol' },
      { key: 'acousticVelocityMPerS', label: 'Sound speed v_A', optional: true },
      { key: 'kerrN2M2PerW', label: 'Kerr index n₂' },
    ],
  },
]

export const waveguideDescription = (key: keyof WaveguideInput): string | undefined => Waveguide.shape[key].description
