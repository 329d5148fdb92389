// Built-in starting points for the form. Waveguides come from the shared presets; the runs are ours.
import type { SimulationConfigInput } from '@shared/physics/simulation-config'
import { findWaveguidePreset } from '@shared/physics/waveguide-presets'

export interface SimulationStart {
  id: string
  title: string
  /** One line: what the run shows. */
  summary: string
  config: SimulationConfigInput
}

const presetWaveguide = (id: string) => structuredClone(findWaveguidePreset(id)!.waveguide)
const gauss = (label: string, peakPowerW: number, centreNs: number, fwhmNs = 0.2) => ({ shape: 'gaussian' as const, label, peakPowerW, centreNs, fwhmNs })

export const SIMULATION_STARTS: SimulationStart[] = [
  {
    id: 'store-retrieve',
    title: 'Store and retrieve on a chip',
    summary: 'A 10 mW data pulse is written into the acoustic grating by a 10 W counter-propagating pulse and read back 3 ns later.',
    config: {
      waveguide: presetWaveguide('as2s3-rib-chip'),
      channels: [
        {
          label: 'memory',
          pump: { pulses: [gauss('data', 0.01, 1)], backgroundPowerW: 0 },
          stokes: { pulses: [gauss('write', 10, 1), gauss('read', 10, 4)], backgroundPowerW: 0 },
        },
      ],
      detuningMHz: 0,
      windowNs: 6,
      grid: { mapRows: 256, mapCols: 256, mapReduction: 'max' },
      energyWindows: [{ label: 'read-out', port: 'pumpOut', startNs: 3.8, endNs: 5.5 }],
    },
  },
  {
    id: 'refresh-train',
    title: 'Storage with a refresh train',
    summary: 'As above, with four 0.5 W refresh pulses every 1.5 ns in the pump role holding the grating until a read at 9 ns.',
    config: {
      waveguide: presetWaveguide('as2s3-rib-chip'),
      channels: [
        {
          label: 'memory with refresh',
          pump: {
            pulses: [gauss('data', 0.01, 1), ...[2.5, 4, 5.5, 7].map((t) => gauss('refresh', 0.5, t))],
            backgroundPowerW: 0,
          },
          stokes: { pulses: [gauss('write', 10, 1), gauss('read', 10, 9)], backgroundPowerW: 0 },
        },
      ],
      detuningMHz: 0,
      windowNs: 11,
      grid: { mapRows: 256, mapCols: 256, mapReduction: 'max' },
      energyWindows: [{ label: 'read-out', port: 'pumpOut', startNs: 8.8, endNs: 10.5 }],
    },
  },
  {
    id: 'cw-amplifier',
    title: 'CW Brillouin amplifier, 1 km of standard fibre',
    summary: 'A 10 mW CW pump amplifies a 1 µW counter-propagating Stokes seed; the window covers two transits and the acoustic settling.',
    config: {
      waveguide: presetWaveguide('standard-smf'),
      channels: [{ label: 'amplifier', pump: { pulses: [], backgroundPowerW: 0.01 }, stokes: { pulses: [], backgroundPowerW: 1e-6 } }],
      detuningMHz: 0,
      windowNs: 12000,
      grid: { mapRows: 256, mapCols: 256, mapReduction: 'mean' },
      energyWindows: [{ label: 'amplified Stokes, settled', port: 'stokesOut', startNs: 10000, endNs: 12000 }],
    },
  },
]

export const DEFAULT_START_ID = 'store-retrieve'

export function startConfig(id: string = DEFAULT_START_ID): SimulationConfigInput {
  const start = SIMULATION_STARTS.find((s) => s.id === id) ?? SIMULATION_STARTS[0]
  return structuredClone(start.config)
}
