// Built-in waveguide platforms. Each carries the published source of its numbers, shown in the UI beside
// the preset, and the range the test holds its Brillouin shift and gain parameter to. The values in brackets
// were recalled rather than read from the papers (from memory), so the source tells the user they are
// typical values to check against the paper.
import type { WaveguideInput } from './waveguide'

export interface WaveguidePreset {
  /** Stable key (kebab-case); used in URLs and tests. */
  id: string
  /** Short name of the platform, e.g. "Standard single-mode silica fibre". */
  platform: string
  /** Where the numbers come from, as shown under the preset. */
  source: string
  /** What was chosen rather than taken from the source (length, polarisation, rounding). */
  notes: string
  waveguide: WaveguideInput
  /** Plausible ranges for this platform: ν_B (GHz) and G_B = η_pol g_B/A_eff (1/(W m)). */
  expected: { brillouinShiftGHz: [number, number]; gainParameterPerWM: [number, number] }
}

export const WAVEGUIDE_PRESETS: readonly WaveguidePreset[] = [
  {
    id: 'standard-smf',
    platform: 'Standard single-mode silica fibre (ITU-T G.652)',
    source:
      'Agrawal, Nonlinear Fiber Optics, ch. 9 (g_B ≈ 5×10⁻¹¹ m/W; ν_B ≈ 11 GHz near 1.55 µm); Kobyakov, Sauer & Chowdhury 2010, ' +
      'Adv. Opt. Photon. 2, 1 (ν_B ≈ 10.8–10.9 GHz and Δν_B ≈ 20–30 MHz measured in standard fibre). Typical values; check against the paper.',
    notes:
      'Sound speed set to 5800 m/s so that 2 n v_A/λ reproduces the measured shift (the Ge-doped core is slower than bulk silica at 5960 m/s). ' +
      'η_pol = 1 assumes aligned polarisations; use 2/3 for scrambled light. 1 km length is a starting point.',
    waveguide: {
      name: 'Standard single-mode silica fibre',
      lengthM: 1000,
      groupIndex: 1.468,
      phaseIndex: 1.45,
      lossDbPerM: 0.2e-3,
      effectiveAreaUm2: 80,
      gainCoefficientMPerW: 5e-11,
      polarisationFactor: 1,
      brillouinShiftGHz: 10.85,
      linewidthMHz: 25,
      acousticVelocityMPerS: 5800,
      kerrN2M2PerW: 2.6e-20,
      wavelengthNm: 1550,
    },
    expected: { brillouinShiftGHz: [10.7, 11.2], gainParameterPerWM: [0.4, 0.8] },
  },
  {
    id: 'highly-nonlinear-silica',
    platform: 'Highly nonlinear (small-core, Ge-doped) silica fibre',
    source:
      'Agrawal, Nonlinear Fiber Optics, ch. 9 and ch. 11 (A_eff ≈ 10–15 µm²); Kobyakov et al. 2010, Adv. Opt. Photon. 2, 1 ' +
      '(heavier Ge doping lowers ν_B towards 9.5–10 GHz and broadens the line). Typical values rather than one product; check against the paper.',
    notes: 'g_B and Δν_B vary strongly between fibres of this kind; measure your own if the threshold matters.',
    waveguide: {
      name: 'Highly nonlinear silica fibre',
      lengthM: 500,
      groupIndex: 1.48,
      phaseIndex: 1.46,
      lossDbPerM: 0.8e-3,
      effectiveAreaUm2: 11,
      gainCoefficientMPerW: 3e-11,
      polarisationFactor: 1,
      brillouinShiftGHz: 9.7,
      linewidthMHz: 40,
      kerrN2M2PerW: 4e-20,
      wavelengthNm: 1550,
    },
    expected: { brillouinShiftGHz: [9.3, 10.2], gainParameterPerWM: [1.5, 5] },
  },
  {
    id: 'as2s3-fibre',
    platform: 'Chalcogenide (As₂S₃) single-mode fibre',
    source:
      'Florea, Bashkansky, Dutton, Sanghera, Pureza & Aggarwal 2006, "Stimulated Brillouin scattering in single-mode As₂S₃ and As₂Se₃ ' +
      'chalcogenide fibers", Opt. Express 14, 12063 (g_B of order 4×10⁻⁹ m/W, about 80× silica). Typical values; check against the paper.',
    notes: 'Index, area and loss are typical of small-core As₂S₃ fibre, not taken from the paper; the length is a starting point.',
    waveguide: {
      name: 'As₂S₃ chalcogenide fibre',
      lengthM: 3,
      groupIndex: 2.45,
      phaseIndex: 2.41,
      lossDbPerM: 0.5,
      effectiveAreaUm2: 40,
      gainCoefficientMPerW: 3.9e-9,
      polarisationFactor: 1,
      brillouinShiftGHz: 7.95,
      linewidthMHz: 35,
      kerrN2M2PerW: 3e-18,
      wavelengthNm: 1550,
    },
    expected: { brillouinShiftGHz: [7.5, 8.4], gainParameterPerWM: [50, 150] },
  },
  {
    id: 'as2se3-fibre',
    platform: 'Chalcogenide (As₂Se₃) single-mode fibre',
    source:
      'Abedin 2005, "Observation of strong stimulated Brillouin scattering in single-mode As₂Se₃ chalcogenide fiber", ' +
      'Opt. Express 13, 10266 (ν_B ≈ 7.13 GHz, Δν_B ≈ 13 MHz, g_B ≈ 6×10⁻⁹ m/W at 1.55 µm). Typical values; check against the paper.',
    notes: 'Effective area and loss are typical of that fibre class, not read from the paper.',
    waveguide: {
      name: 'As₂Se₃ chalcogenide fibre',
      lengthM: 5,
      groupIndex: 2.9,
      phaseIndex: 2.81,
      lossDbPerM: 0.9,
      effectiveAreaUm2: 40,
      gainCoefficientMPerW: 6.1e-9,
      polarisationFactor: 1,
      brillouinShiftGHz: 7.13,
      linewidthMHz: 13.2,
      kerrN2M2PerW: 1.1e-17,
      wavelengthNm: 1550,
    },
    expected: { brillouinShiftGHz: [6.9, 7.4], gainParameterPerWM: [100, 250] },
  },
  {
    id: 'as2s3-rib-chip',
    platform: 'Chalcogenide (As₂S₃) rib waveguide on a chip',
    source:
      'Pant et al. 2011, "On-chip stimulated Brillouin scattering", Opt. Express 19, 8285 (ν_B ≈ 7.7 GHz, Δν_B ≈ 34 MHz, ' +
      'A_eff ≈ 2.3 µm², g_B ≈ 0.7×10⁻⁹ m/W; typical values, check against the paper), rounded to n_g = 2.44, L = 5 cm and G_B = 300 /(W m).',
    notes: 'g_B = 6.9×10⁻¹⁰ m/W with A_eff = 2.3 µm² gives G_B = 300 /(W m) exactly. Loss 0.3 dB/cm is a round starting value; use your own measurement.',
    waveguide: {
      name: 'As₂S₃ rib waveguide (chip)',
      lengthM: 0.05,
      groupIndex: 2.44,
      phaseIndex: 2.37,
      lossDbPerM: 30,
      effectiveAreaUm2: 2.3,
      gainCoefficientMPerW: 6.9e-10,
      polarisationFactor: 1,
      brillouinShiftGHz: 7.7,
      linewidthMHz: 34,
      kerrN2M2PerW: 3e-18,
      wavelengthNm: 1550,
    },
    expected: { brillouinShiftGHz: [7.6, 7.8], gainParameterPerWM: [299, 301] },
  },
]

export function findWaveguidePreset(id: string): WaveguidePreset | undefined {
  return WAVEGUIDE_PRESETS.find((p) => p.id === id)
}
