// The companion run of the error estimate, in the same call as the run itself: simulate() and
// simulateSync() compute the run, then the same configuration on the grid with twice the step
// (shared/physics/error-estimate-plan.ts), and attach the Richardson estimate to the run's figures
// (observers/error-estimate.ts). Progress covers both: the run takes its share of [0, 1] by cost
// (node-steps), the companion the rest. The companion hands out no map frames.
import { planCoarseRun } from '@shared/physics/error-estimate-plan'
import { SimulationConfig } from '@shared/physics/simulation-config'
import type { FigureErrors } from '@shared/physics/figure-error'
import type { SimulateOptions, SimulationResult } from './index'
import { estimateFigureErrors, flaggedWarning, noFigureErrors } from './observers/error-estimate'

export interface CompanionPlan {
  /** Options for the run itself (progress scaled to its share). */
  fineOpts: SimulateOptions
  /** The companion's configuration and options, if the finished run `fine` gets one. */
  companionFor(fine: SimulationResult): { config: SimulationConfig; opts: SimulateOptions } | null
  /** The run's result with the estimate (or the reason there is none) in its figures. */
  finish(fine: SimulationResult, coarse: SimulationResult | null): SimulationResult
}

const passThrough: CompanionPlan = { fineOpts: {}, companionFor: () => null, finish: (fine) => fine }

export function planCompanion(input: unknown, opts: SimulateOptions): CompanionPlan {
  const parsed = SimulationConfig.safeParse(input)
  // An invalid configuration fails in the run itself, with its issues.
  if (!parsed.success) return { ...passThrough, fineOpts: opts }
  const plan = planCoarseRun(parsed.data)
  const cost = (g: { nz: number; nt: number }) => (g.nz + 1) * (g.nt + 1)
  const share = plan.ok ? cost(plan.fineGrid) / (cost(plan.fineGrid) + cost(plan.grid)) : 1
  const fineOpts: SimulateOptions = { ...opts, onProgress: opts.onProgress && ((f) => opts.onProgress!(share * f)) }
  const coarseOpts: SimulateOptions = {
    signal: opts.signal,
    shouldAbort: opts.shouldAbort,
    yieldEveryMs: opts.yieldEveryMs,
    forceGeneralKernel: opts.forceGeneralKernel,
    engine: opts.engine,
    onProgress: opts.onProgress && ((f) => opts.onProgress!(share + (1 - share) * f)),
  }
  return {
    fineOpts,
    companionFor: (fine) => (plan.ok && fine.status === 'finished' && fine.manifest.figures ? { config: plan.config, opts: coarseOpts } : null),
    finish(fine, coarse) {
      const figures = fine.manifest.figures
      if (fine.status !== 'finished' || !figures) return fine
      const dtS = fine.manifest.grid!.dtS
      let estimate: FigureErrors
      if (!plan.ok) estimate = noFigureErrors(plan.status, plan.reason, dtS)
      else if (!coarse || coarse.status === 'aborted') return stopped(fine)
      else if (coarse.status === 'failed' || !coarse.manifest.figures) {
        estimate = noFigureErrors('unavailable', `No error estimate: the run on the grid with twice the step failed (${coarse.message}).`, dtS, coarse.manifest.counters.cellUpdates)
      } else estimate = estimateFigureErrors(figures, coarse.manifest.figures, dtS, coarse.manifest.grid!.dtS, plan.order, coarse.manifest.counters.cellUpdates)
      const warning = flaggedWarning(estimate)
      const manifest = {
        ...fine.manifest,
        figures: { ...figures, errorEstimate: estimate },
        warnings: warning ? [...fine.manifest.warnings, warning] : fine.manifest.warnings,
      }
      return { ...fine, manifest }
    },
  }
}

/** Stopped while the companion ran: the run as a whole is stopped, like any other abort. */
function stopped(fine: SimulationResult): SimulationResult {
  const message = 'Stopped during the error-estimate run'
  return { ...fine, status: 'aborted', message, manifest: { ...fine.manifest, status: 'aborted', message, figures: null } }
}
