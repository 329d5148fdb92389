import { z } from 'zod'
import { safeText } from '../api/text'
import { BackwardResonance, ForwardResonance, MAX_EXTRA_RESONANCES } from './resonances'
import { LongitudinalProfile } from './longitudinal-profile'

const finite = () => z.number().finite()

/**
 * One guided mode of a waveguide and its Brillouin response (backward SBS).
 * The gain parameter the equations use is G_B = polarisationFactor · gainCoefficientMPerW / A_eff.
 */
export const Waveguide = z.object({
  name: safeText().trim().min(1, 'must not be empty').max(120).default('Untitled waveguide').describe('Name shown in lists'),
  lengthM: finite().positive().max(200_000).describe('Interaction length L (m)'),
  groupIndex: finite().min(1).max(10).describe('Group index n_g; sets v_g = c/n_g'),
  phaseIndex: finite().min(1).max(10).default(1.45).describe('Phase (effective) index n; sets ν_B = 2n·v_A/λ'),
  lossDbPerM: finite().min(0).max(1000).default(0).describe('Optical power loss (dB/m)'),
  effectiveAreaUm2: finite().positive().max(1e6).describe('Effective mode area A_eff (µm²)'),
  gainCoefficientMPerW: finite().positive().max(1e-6).describe('Peak Brillouin gain coefficient g_B (m/W)'),
  polarisationFactor: finite().positive().max(1).default(1).describe('Polarisation factor η_pol (1 = aligned, 2/3 = scrambled)'),
  brillouinShiftGHz: finite().positive().max(100).describe('Brillouin frequency shift ν_B (GHz)'),
  linewidthMHz: finite().positive().max(10_000).describe('Brillouin gain linewidth Δν_B, FWHM (MHz)'),
  acousticVelocityMPerS: finite().positive().max(20_000).optional().describe('Longitudinal sound speed v_A (m/s)'),
  kerrN2M2PerW: finite().min(0).max(1e-15).default(0).describe('Kerr index n₂ (m²/W); used when the Kerr option is on'),
  wavelengthNm: finite().min(200).max(20_000).default(1550).describe('Pump vacuum wavelength (nm)'),
  additionalResonances: z
    .array(BackwardResonance)
    .max(MAX_EXTRA_RESONANCES)
    .default([])
    .describe('Further backward resonances besides the main one (shift, linewidth, gain); the gain spectrum is their sum'),
  forwardResonances: z
    .array(ForwardResonance)
    .max(MAX_EXTRA_RESONANCES)
    .default([])
    .describe('Forward (co-propagating) acoustic resonances coupling the pump to forward Stokes and anti-Stokes waves'),
  profile: LongitudinalProfile.optional().describe('Sections along z whose shift, linewidth, gain or loss differ (temperature, strain)'),
})
export type Waveguide = z.infer<typeof Waveguide>
export type WaveguideInput = z.input<typeof Waveguide>
