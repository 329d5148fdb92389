// The progress line of a running run. Progress covers the run and then the error estimate's companion
// run on the grid with twice the step, each taking its share of [0, 1] by cost in node-steps, as
// solver/error-estimate-run.ts hands it out; the resource estimate counts both runs' node-steps. Past the
// run's own share every map row is in, so the line says what the time is spent on instead of "512 of 512 map rows".
import { chooseGrid } from '@shared/physics/grid-step'
import { estimateResources } from '@shared/physics/resource-estimate'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { percentText } from '../sweep/sweep-format'

/** The run's own share of the progress fraction: 1 when there is no companion run. */
export function mainRunShare(config: unknown): number {
  const parsed = SimulationConfig.safeParse(config)
  if (!parsed.success) return 1
  const est = estimateResources(parsed.data, chooseGrid(parsed.data))
  const companion = est.errorEstimate?.cellUpdates ?? 0
  return companion > 0 && est.cellUpdates > 0 ? 1 - companion / est.cellUpdates : 1
}

export function runProgressLabel(fraction: number, rowsFilled: number, rows: number, share: number): string {
  // Below 10 % the digit after the point shows (a long run at 0.4 % is not "0 %").
  const pct = fraction > 0 && fraction < 0.1 ? percentText(fraction) : `${Math.round(100 * fraction)} %`
  // The run's last progress event lands a hair under its share; all its rows being in settles it.
  const companion = share < 1 && (fraction > share + 1e-9 || (rows > 0 && rowsFilled >= rows && fraction >= share - 1e-3))
  return companion ? `${pct} · computing the error estimate` : `${pct} · ${rowsFilled} of ${rows} map rows`
}
