// Fixed benchmark problems. Grids are set through grid.timeStepPs: with Δz = v_g Δt the grid rule of
// shared/physics/grid-step.ts gives N_z = L/(v_g Δt) and N_t = T_window/Δt, so L and the window follow from N_z, N_t.
import { SimulationConfig } from '@shared/physics/simulation-config'
import { SPEED_OF_LIGHT_M_PER_S } from '@shared/physics/physical-constants'

/** The validation "chip" (docs/validation.md): n_g = 2.44, G_B = 300 /(W m) via g_B/A_eff, ν_B = 7.7 GHz. */
const CHIP = {
  name: 'benchmark chip',
  groupIndex: 2.44,
  effectiveAreaUm2: 1,
  gainCoefficientMPerW: 3e-10,
  brillouinShiftGHz: 7.7,
  linewidthMHz: 34,
  wavelengthNm: 1550,
}
/** 1 ps satisfies Δt ≤ 1/(20 ν_B) = 6.5 ps, so the same grid serves the higher-order runs. */
export const BENCH_STEP_PS = 1

export interface BenchOptions {
  higherOrderAcoustic?: boolean
  noise?: boolean
  /** Pump–Stokes pairs, 1 GHz apart (30 linewidths: the validation's spacing rule asks for 10). */
  channels?: number
}

/** A pulsed pump (1 W, 1 ns FWHM) crossing a CW Stokes seed: coupling active over much of the grid. */
export function gridCase(nz: number, nt: number, o: BenchOptions = {}): SimulationConfig {
  const dtS = BENCH_STEP_PS * 1e-12
  const vg = SPEED_OF_LIGHT_M_PER_S / CHIP.groupIndex
  const windowNs = nt * dtS * 1e9
  return SimulationConfig.parse({
    waveguide: { ...CHIP, lengthM: nz * vg * dtS },
    channels: Array.from({ length: o.channels ?? 1 }, (_, k) => ({
      offsetGHz: k,
      pump: { pulses: [{ shape: 'gaussian', peakPowerW: 1, centreNs: Math.min(5, windowNs / 2), fwhmNs: 1 }], backgroundPowerW: 0.01 },
      stokes: { pulses: [], backgroundPowerW: 1e-3 },
    })),
    windowNs,
    grid: { timeStepPs: BENCH_STEP_PS },
    options: { higherOrderAcoustic: o.higherOrderAcoustic ?? false, noise: { enabled: o.noise ?? false, temperatureK: 295, seed: 7 } },
  })
}

/** V4 of docs/validation.md: chip, α = 0, Δν_B = 34 MHz, CW P₀ = 0.5 W, P_L = 1 mW, 150 ns (Tang 1966). */
export function cwDepletionCase(timeStepPs: number): SimulationConfig {
  return SimulationConfig.parse({
    waveguide: { ...CHIP, lengthM: 0.05 },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.5 }, stokes: { pulses: [], backgroundPowerW: 1e-3 } }],
    windowNs: 150,
    grid: { timeStepPs },
  })
}

/**
 * Small-signal CW gain with a 200 MHz line and 0.3 dB/cm loss: a 50 mW pump, a 1 nW Stokes seed (depletion ≈ 1e-8),
 * closed form exp(G_B P L_eff − αL) (Agrawal, Nonlinear Fiber Optics, ch. 9); the wide line makes Γ_B Δt large.
 */
export function cwWideLineGainCase(timeStepPs: number): SimulationConfig {
  return SimulationConfig.parse({
    waveguide: { ...CHIP, lengthM: 0.05, linewidthMHz: 200, lossDbPerM: 30 },
    channels: [{ pump: { pulses: [], backgroundPowerW: 0.05 }, stokes: { pulses: [], backgroundPowerW: 1e-9 } }],
    windowNs: 60,
    grid: { timeStepPs, mapRows: 16, mapCols: 16 },
    options: { errorEstimate: false },
  })
}
