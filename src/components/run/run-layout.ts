// What a run's maps will look like before any block arrives: the grid the solver picks (shared rule) and the
// map decimation it applies, so live maps are drawn at their final size and axes from the start.
import { chooseGrid } from '@shared/physics/grid-step'
import type { SimulationConfig } from '@shared/physics/simulation-config'

export interface MapFrame {
  rows: number
  cols: number
  /** Axis extents: z from 0 to L, t from 0 to the last time sample nt·Δt. */
  zRangeM: [number, number]
  tRangeNs: [number, number]
}

/** Same decimation as the solver's map recorder: whole steps per row and whole nodes per column. */
export function mapFrameOf(config: SimulationConfig): MapFrame {
  const g = chooseGrid(config)
  const samples = g.nt + 1
  const nodes = g.nz + 1
  const rowSteps = Math.ceil(samples / Math.min(config.grid.mapRows, samples))
  const colNodes = Math.ceil(nodes / Math.min(config.grid.mapCols, nodes))
  return {
    rows: Math.ceil(samples / rowSteps),
    cols: Math.ceil(nodes / colNodes),
    zRangeM: [0, config.waveguide.lengthM],
    tRangeNs: [0, g.nt * g.dtS * 1e9],
  }
}
