// The long-fibre sensing point the benchmarks time (long-fibre.ts, estimate-check.ts): standard single-mode
// fibre (n_g = 1.468, A_eff = 80 µm², g_B = 5e-11 m/W, ν_B = 10.8 GHz, Δν_B = 30 MHz, 0.2 dB/km), a 10 ns Gaussian
// pump pulse (resolution v_g·τ/2 ≈ 1 m) of 0.5 W and a 1 mW CW probe, a 2 m section 35 K warmer at `hotAtM`.
import { SimulationConfig } from '@shared/physics/simulation-config'

export const VG_M_PER_NS = 0.299792458 / 1.468
export const TAU_NS = 10

export function fibre(lengthM: number, hotAtM: number, opts: { profile?: boolean; timeStepPs?: number } = {}): SimulationConfig {
  const transitNs = lengthM / VG_M_PER_NS
  const centreNs = transitNs + 4 * TAU_NS
  return SimulationConfig.parse({
    waveguide: {
      name: 'Standard single-mode fibre',
      lengthM,
      groupIndex: 1.468,
      effectiveAreaUm2: 80,
      gainCoefficientMPerW: 5e-11,
      brillouinShiftGHz: 10.8,
      linewidthMHz: 30,
      lossDbPerM: 0.0002,
      ...(opts.profile === false ? {} : { profile: { segments: [{ startM: hotAtM, endM: hotAtM + 2, temperatureOffsetK: 35 }] } }),
    },
    channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.5, centreNs, fwhmNs: TAU_NS, label: 'pump' }] }, stokes: { backgroundPowerW: 1e-3 } }],
    detuningMHz: 35,
    windowNs: centreNs + 2 * transitNs + 3 * TAU_NS,
    grid: { mapRows: 512, mapCols: 512, ...(opts.timeStepPs ? { timeStepPs: opts.timeStepPs } : {}) },
    options: { errorEstimate: false },
  })
}
