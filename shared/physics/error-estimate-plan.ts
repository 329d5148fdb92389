// The companion run of the per-run error estimate: the same configuration on the grid with twice the
// time step (Δz = v_g Δt doubles too, so it costs about a quarter of the run). Shared by the solver, which
// runs it, and the resource estimate, which counts it, so both agree on whether it runs and what it costs.
// If the doubled step breaks a rule a user-chosen step must meet, there is no estimate and the reason says why.
import { chooseGrid, shortestFeatureNs, type GridChoice } from './grid-step'
import { SimulationConfig } from './simulation-config'

export const ERROR_ESTIMATE = {
  /** Formal order of the scheme in Δt (the characteristic lattice with trapezoidal interaction is second order). */
  order: 2,
  /** With acoustic advection the upwind step (first order) limits the scheme; the estimate then assumes order 1. */
  orderWithAdvection: 1,
  /** Coarse step / fine step. */
  stepRatio: 2,
  /** A figure is flagged when its estimated relative error exceeds this. */
  flagAboveRelError: 0.01,
  /** The suggested step aims under this relative error. */
  targetRelError: 0.001,
  /** The coarse grid needs this many cells along the waveguide (half the automatic grid's minimum of 16). */
  minCoarseCells: 8,
  /** The coarse grid needs this many steps per shortest pulse feature: the validation rule for a user step. */
  minCoarseStepsPerFeature: 4,
  /** The coarse run keeps only a small map: nobody looks at it. */
  coarseMapSize: 16,
} as const

export type CoarsePlan =
  | { ok: true; config: SimulationConfig; grid: GridChoice; fineGrid: FineGrid; order: number }
  | { ok: false; status: 'off' | 'unavailable'; reason: string }

/** What the plan needs of the run's own grid. */
export type FineGrid = Pick<GridChoice, 'dtS' | 'nz' | 'nt'>

const ps = (s: number) => `${(s * 1e12).toPrecision(3)} ps`

export function planCoarseRun(config: SimulationConfig, fine: FineGrid = chooseGrid(config)): CoarsePlan {
  if (!config.options.errorEstimate) return { ok: false, status: 'off', reason: 'The error estimate was switched off in the run settings.' }
  if (config.options.noise.enabled) {
    return {
      ok: false,
      status: 'unavailable',
      reason: 'No error estimate for runs with thermal noise: a grid with twice the step draws a different random field, so the difference would measure the noise, not the grid.',
    }
  }
  const coarseDtS = ERROR_ESTIMATE.stepRatio * fine.dtS
  const shortestS = shortestFeatureNs(config) * 1e-9
  if (Number.isFinite(shortestS) && shortestS / coarseDtS < ERROR_ESTIMATE.minCoarseStepsPerFeature) {
    const needS = shortestS / (ERROR_ESTIMATE.minCoarseStepsPerFeature * ERROR_ESTIMATE.stepRatio)
    return {
      ok: false,
      status: 'unavailable',
      reason: `No error estimate: with twice the step (${ps(coarseDtS)}) the shortest pulse feature would span only ${(shortestS / coarseDtS).toFixed(1)} steps (at least ${ERROR_ESTIMATE.minCoarseStepsPerFeature} are needed). A time step ≤ ${ps(needS)} makes it available.`,
    }
  }
  if (config.options.higherOrderAcoustic) {
    // The second-order acoustic equation resolves the carrier at ν_B: Δt ≤ 1/(20 ν_B) (simulation-config.ts).
    const maxS = 1 / (20 * config.waveguide.brillouinShiftGHz * 1e9)
    if (coarseDtS > maxS * (1 + 1e-9)) {
      return {
        ok: false,
        status: 'unavailable',
        reason: `No error estimate: the higher-order acoustic term needs Δt ≤ ${ps(maxS)}, and twice this run's step is ${ps(coarseDtS)}. A time step ≤ ${ps(maxS / ERROR_ESTIMATE.stepRatio)} makes it available.`,
      }
    }
  }
  const parsed = SimulationConfig.safeParse({
    ...config,
    grid: { ...config.grid, timeStepPs: coarseDtS * 1e12, mapRows: ERROR_ESTIMATE.coarseMapSize, mapCols: ERROR_ESTIMATE.coarseMapSize },
    options: { ...config.options, errorEstimate: false },
  })
  if (!parsed.success) return { ok: false, status: 'unavailable', reason: `No error estimate: a grid with twice the step (${ps(coarseDtS)}) is not a valid grid for this configuration.` }
  const grid = chooseGrid(parsed.data)
  if (grid.nz < ERROR_ESTIMATE.minCoarseCells) {
    return {
      ok: false,
      status: 'unavailable',
      reason: `No error estimate: a grid with twice the step would have only ${grid.nz} cells along the waveguide (at least ${ERROR_ESTIMATE.minCoarseCells} are needed). A time step ≤ ${ps((fine.dtS * fine.nz) / (ERROR_ESTIMATE.stepRatio * ERROR_ESTIMATE.minCoarseCells))} makes it available.`,
    }
  }
  const order = config.options.acousticAdvection ? ERROR_ESTIMATE.orderWithAdvection : ERROR_ESTIMATE.order
  return { ok: true, config: parsed.data, grid, fineGrid: fine, order }
}
