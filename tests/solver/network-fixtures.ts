// Helpers of the multi-wave solver tests: the chip of docs/validation.md with whole-cell steps and readers of
// the per-wave port traces.
import { SPEED_OF_LIGHT_M_PER_S } from '@shared/physics/physical-constants'
import { simulateSync, type SimulationResult } from '../../solver/index'
import { CHIP_WAVEGUIDE, chipConfig } from './chip-fixtures'

export const VG_M_PER_S = SPEED_OF_LIGHT_M_PER_S / CHIP_WAVEGUIDE.groupIndex

/** Time step (ps) that tiles the chip's 5 cm into exactly nz cells. */
export const stepForCells = (nz: number, lengthM = CHIP_WAVEGUIDE.lengthM) => (lengthM / (nz * VG_M_PER_S)) * 1e12

export const cw = (powerW: number) => ({ pulses: [], backgroundPowerW: powerW })

export function runNetwork(o: Parameters<typeof chipConfig>[0]): SimulationResult {
  const r = simulateSync(chipConfig({ ...o, options: { errorEstimate: false, ...(o.options ?? {}) } }))
  if (r.status !== 'finished') throw new Error(r.message)
  return r
}

/** Power (W) of a wave's output at the last time sample. */
export function lastOutPowerW(r: SimulationResult, key: string, port: 'in' | 'out' = 'out'): number {
  const a = r.arrays[`wave_${key}_${port}`] as Float64Array
  const n = a.length / 2 - 1
  return a[2 * n] ** 2 + a[2 * n + 1] ** 2
}
