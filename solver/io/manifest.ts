// manifest.json of a run directory: the solver's manifest plus the config, the resource estimate, wall-clock
// timings, and for every array the NPY file that holds it. Pure: the CLI does the writing.
import type { ArrayDescriptor, ArrayDtype, SimulationManifest } from '@shared/physics/simulation-result'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import type { ResourceEstimate } from '@shared/physics/resource-estimate'
import { deriveQuantities, type DerivedRow } from '@shared/physics/derived-quantities'
import type { NpyDescr } from './npy'

export const MANIFEST_FILE = 'manifest.json'
export const RUN_MANIFEST_VERSION = 1

export interface RunTimings {
  startedAt: string
  finishedAt: string
  wallTimeS: number
}

export type StoredArray = ArrayDescriptor & { file: string; npyDescr: NpyDescr; byteOrder: 'little'; order: 'C' }

export interface RunManifest extends Omit<SimulationManifest, 'arrays'> {
  runManifestVersion: number
  config: SimulationConfig
  estimate: ResourceEstimate
  /** The derived quantities the form showed (gain parameters, κ, thresholds…), on the run's own grid. */
  derived: DerivedRow[]
  timings: RunTimings
  arrays: StoredArray[]
}

const DESCR: Record<ArrayDtype, NpyDescr> = { c16: '<c16', f8: '<f8', f4: '<f4' }

export function npyDescrOf(dtype: ArrayDtype): NpyDescr {
  return DESCR[dtype]
}

/** A file name that is safe on every filesystem and unique per array name. */
export function arrayFileName(name: string): string {
  if (!/^[A-Za-z0-9_-]{1,100}$/.test(name)) throw new Error(`Array name ${JSON.stringify(name)} cannot be used as a file name`)
  return `${name}.npy`
}

export function buildRunManifest(
  manifest: SimulationManifest,
  config: SimulationConfig,
  estimate: ResourceEstimate,
  timings: RunTimings,
): RunManifest {
  const { arrays, ...rest } = manifest
  return {
    runManifestVersion: RUN_MANIFEST_VERSION,
    ...rest,
    config,
    estimate,
    derived: deriveQuantities({ waveguide: config.waveguide, config, grid: manifest.grid ?? undefined }).rows,
    timings,
    arrays: arrays.map((a) => ({ ...a, file: arrayFileName(a.name), npyDescr: npyDescrOf(a.dtype), byteOrder: 'little', order: 'C' })),
  }
}
