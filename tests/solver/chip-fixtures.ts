// Builders for the "chip" validation cases of the docs/validation.md: n_g = 2.44, L = 5 cm,
// G_B = 300 /(W m) (A_eff = 1 µm², g_B = 3e-10 m/W), λ = 1550 nm.
import { SimulationConfig, SimulationConfigBase, type SimulationConfigInput } from '@shared/physics/simulation-config'

export const CHIP_WAVEGUIDE = {
  name: 'Halden test rib',
  lengthM: 0.05,
  groupIndex: 2.44,
  effectiveAreaUm2: 1,
  gainCoefficientMPerW: 3e-10,
  brillouinShiftGHz: 7.7,
  linewidthMHz: 34,
  wavelengthNm: 1550,
}

/** Gaussian of amplitude rms width T (ns), as the validation cases write it, converted to the power FWHM the schema uses. */
export function gaussian(peakPowerW: number, centreNs: number, rmsNs: number, label?: string, extra: Record<string, unknown> = {}) {
  return { shape: 'gaussian' as const, peakPowerW, centreNs, fwhmNs: 2 * Math.sqrt(Math.LN2) * rmsNs, label, ...extra }
}

type Overrides = Omit<Partial<SimulationConfigInput>, 'waveguide'> & { waveguide?: Partial<SimulationConfigInput['waveguide']> }

export function chipConfig(o: Overrides): SimulationConfig {
  return SimulationConfig.parse({ channels: [{}], windowNs: 10, ...o, waveguide: { ...CHIP_WAVEGUIDE, ...(o.waveguide ?? {}) } })
}

/** Skips the cross-field refinements (used only where a reference run must sit outside the user limits). */
export function chipConfigUnrefined(o: Overrides): SimulationConfig {
  return SimulationConfigBase.parse({ channels: [{}], windowNs: 10, ...o, waveguide: { ...CHIP_WAVEGUIDE, ...(o.waveguide ?? {}) } }) as SimulationConfig
}

export const powerAt = (a: Float64Array, n: number) => a[2 * n] * a[2 * n] + a[2 * n + 1] * a[2 * n + 1]
export const last = (a: Float64Array) => a.length / 2 - 1
