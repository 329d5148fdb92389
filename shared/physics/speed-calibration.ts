// The solver speed this server has measured on its own recent runs, per kernel class: the input that lets
// the resource estimate (resource-estimate.ts) predict a run's time on the machine that will run it, instead
// of from figures measured once on another day under another load. The server builds it from the runs its
// workers finished (server/modules/estimates/); the estimate falls back to the benchmark figures where it
// has no history for a class.
import { z } from 'zod'
import { KernelClass, kernelKey } from './kernel-class'

/** Observed speed of one kernel class. Speeds count plain-scheme cell-updates: a multi-wave run's count × envelopes/3. */
export const KernelSpeed = z.object({
  kernel: KernelClass,
  /** The recency-weighted median over the runs kept. */
  cellUpdatesPerS: z.number().positive(),
  /** The slow and fast ends of the runs kept (10th and 90th percentile of their speeds). */
  slowPerS: z.number().positive(),
  fastPerS: z.number().positive(),
  /** Runs the figures come from (outliers left out). */
  runs: z.number().int().positive(),
  newestAt: z.iso.datetime({ offset: true }),
})
export type KernelSpeed = z.infer<typeof KernelSpeed>

export const SpeedCalibration = z.object({
  kernels: z.array(KernelSpeed),
  /** The step engine the server's solver threads are set to: 'ts' when the WebAssembly engine is switched off there. */
  engine: z.enum(['auto', 'ts']).optional(),
})
export type SpeedCalibration = z.infer<typeof SpeedCalibration>

/**
 * Fewest runs of a class before their speed replaces the benchmark figures: one or two runs may have met an
 * unusual moment of the machine.
 */
export const MIN_CALIBRATION_RUNS = 3

/** The measured speed of a class, or null when the server has too few runs of it. */
export function speedOf(calibration: SpeedCalibration | null | undefined, kernel: KernelClass): KernelSpeed | null {
  const key = kernelKey(kernel)
  const s = calibration?.kernels.find((k) => kernelKey(k.kernel) === key)
  return s && s.runs >= MIN_CALIBRATION_RUNS ? s : null
}

/** Where an expected time comes from: this server's recent runs of the same kernel class, or the benchmark figures. */
export const TimeBasis = z.object({
  source: z.enum(['recent-runs', 'benchmark']),
  /** Runs the speed was measured on (0 for the benchmark figures). */
  runs: z.number().int().nonnegative(),
  /** The class whose speed was used. */
  kernel: KernelClass,
  /** The expected time's range: at the fast and the slow end of the measured speeds. */
  fastSeconds: z.number().nonnegative(),
  slowSeconds: z.number().nonnegative(),
})
export type TimeBasis = z.infer<typeof TimeBasis>
