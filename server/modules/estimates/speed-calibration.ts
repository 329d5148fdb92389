// This server's solver speed per kernel class, from the cost of its recent runs (table run_costs): the
// calibration the resource estimate takes as input (shared/physics/speed-calibration.ts). Per class: the
// newest runs that say something about the speed, outliers left out, and a median weighted towards the
// newest, since the machine's load changes through the day.
//
//   speed_i = cellUpdates_i · envelopeRatio_i / wall_i        (plain-scheme cell-updates per second)
//   weight_i = RECENCY_DECAY^rank_i                           (rank 0 = newest)
import type { KernelSpeed, SpeedCalibration } from '@shared/physics/speed-calibration'
import { kernelKey, type KernelClass } from '@shared/physics/kernel-class'

/** One finished run's cost, as stored by the worker (run-costs.repo.ts). */
export interface CostObservation {
  kernel: KernelClass
  cellUpdates: number
  envelopeRatio: number
  wallS: number
  cpuS: number | null
  at: Date
}

/** Shorter runs are dominated by what is not stepping (allocation, the error estimate's set-up, the hand-over). */
export const MIN_WALL_S = 0.5
/**
 * A run whose thread computed for less than this share of its wall time was paused or starved of a core for
 * most of it: its time says more about that moment than about the speed.
 */
export const MIN_CPU_SHARE = 0.2
/** Speeds further than this factor from the class's median are left out (a run that met a stall or a burst). */
export const OUTLIER_FACTOR = 3
/** Newest runs per class that count. */
export const MAX_RUNS = 20
/** Each older run weighs this much less than the next newer one (half weight after about 7 runs). */
export const RECENCY_DECAY = 0.9

/** Whether an observation tells the speed at all (long enough, not paused). */
export function usable(o: CostObservation): boolean {
  if (!(o.wallS >= MIN_WALL_S) || !(o.cellUpdates > 0)) return false
  return o.cpuS === null || o.cpuS >= MIN_CPU_SHARE * o.wallS
}

const speedOf = (o: CostObservation) => (o.cellUpdates * o.envelopeRatio) / o.wallS

/** Quantile q of sorted values, linear between neighbours. */
function quantile(sorted: number[], q: number): number {
  const x = q * (sorted.length - 1)
  const i = Math.floor(x)
  return i + 1 < sorted.length ? sorted[i] + (x - i) * (sorted[i + 1] - sorted[i]) : sorted[i]
}

/** The weighted median: the smallest value whose cumulative weight reaches half the total. */
function weightedMedian(values: number[], weights: number[]): number {
  const order = values.map((v, i) => i).sort((a, b) => values[a] - values[b])
  const half = weights.reduce((s, w) => s + w, 0) / 2
  let acc = 0
  for (const i of order) {
    acc += weights[i]
    if (acc >= half) return values[i]
  }
  return values[order[order.length - 1]]
}

/** The speed of one class from its observations (any order), or null when none is usable. */
export function kernelSpeed(observations: CostObservation[]): KernelSpeed | null {
  const newest = observations.filter(usable).sort((a, b) => b.at.getTime() - a.at.getTime()).slice(0, MAX_RUNS)
  if (newest.length === 0) return null
  const median = quantile(newest.map(speedOf).sort((a, b) => a - b), 0.5)
  const kept = newest.filter((o) => speedOf(o) <= median * OUTLIER_FACTOR && speedOf(o) >= median / OUTLIER_FACTOR)
  const speeds = kept.map(speedOf)
  const sorted = [...speeds].sort((a, b) => a - b)
  return {
    kernel: kept[0].kernel,
    cellUpdatesPerS: weightedMedian(speeds, kept.map((_, rank) => RECENCY_DECAY ** rank)),
    slowPerS: quantile(sorted, 0.1),
    fastPerS: quantile(sorted, 0.9),
    runs: kept.length,
    newestAt: kept[0].at.toISOString(),
  }
}

/** Every class's speed from the observations of all classes. */
export function calibrate(observations: CostObservation[]): SpeedCalibration {
  const byKernel = new Map<string, CostObservation[]>()
  for (const o of observations) {
    const key = kernelKey(o.kernel)
    byKernel.set(key, [...(byKernel.get(key) ?? []), o])
  }
  const kernels = [...byKernel.values()].map(kernelSpeed).filter((k) => k !== null)
  return { kernels }
}
