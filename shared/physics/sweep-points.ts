// A sweep's points: the base configuration with each combination of axis values applied, validated one by
// one, and the resource estimate of the whole sweep with its limit check.
import { chooseGrid } from './grid-step'
import { describeIssuePath } from '../api/issue-path-labels'
import { checkLimits, DEFAULT_RESOURCE_LIMITS, estimateResources, type ResourceLimits } from './resource-estimate'
import type { SpeedCalibration, TimeBasis } from './speed-calibration'
import { SimulationConfig } from './simulation-config'
import { applySweepValue, fieldProblem } from './sweep-fields'
import { neededWindowNs } from './sweep-window'
import { axisLabel, axisValues, MAX_SWEEP_POINTS, type SweepDefinition, type SweepEstimate } from '../api/sweeps'

export interface BuiltPoint {
  index: number
  values: number[]
  config: SimulationConfig
  /** The base window when this point's window was lengthened to hold its pulses (sweep-window.ts). */
  windowExtendedFromNs?: number
}

export interface PointIssue {
  path: string
  message: string
}

export type BuiltSweep = { ok: true; points: BuiltPoint[]; axisValues: number[][] } | { ok: false; issues: PointIssue[] }

/** Stop listing bad points after this many; the first few say what is wrong. */
const MAX_REPORTED_POINTS = 5

/** Point index = i0 · n1 + i1 (axis 0 varies slowest: rows of the heatmap). */
export function buildSweepPoints(def: SweepDefinition): BuiltSweep {
  const issues: PointIssue[] = []
  def.axes.forEach((a, i) => {
    const problem = fieldProblem(def.baseConfig, a.field, a.pulseLabel)
    if (problem) issues.push({ path: `axes.${i}.${a.pulseLabel ? 'pulseLabel' : 'field'}`, message: problem })
    ;(a.tiedLabels ?? []).forEach((label, k) => {
      const tied = fieldProblem(def.baseConfig, a.field, label)
      if (tied) issues.push({ path: `axes.${i}.tiedLabels.${k}`, message: tied })
    })
  })
  if (issues.length) return { ok: false, issues }
  const values = def.axes.map((a) => axisValues(a.values))
  const n1 = values[1]?.length ?? 1
  const total = values[0].length * n1
  const points: BuiltPoint[] = []
  for (let index = 0; index < total; index++) {
    const at = values.length === 2 ? [values[0][Math.floor(index / n1)], values[1][index % n1]] : [values[0][index]]
    let config: SimulationConfig = def.baseConfig
    def.axes.forEach((a, i) => {
      for (const label of [a.pulseLabel, ...(a.tiedLabels ?? [])]) config = applySweepValue(config, a.field, at[i], label)
    })
    let windowExtendedFromNs: number | undefined
    if (def.extendWindow ?? true) {
      const needNs = neededWindowNs(config)
      if (needNs > config.windowNs) {
        windowExtendedFromNs = config.windowNs
        config = { ...config, windowNs: needNs }
      }
    }
    const parsed = SimulationConfig.safeParse(config)
    if (!parsed.success) {
      if (issues.length < MAX_REPORTED_POINTS) {
        const where = def.axes.map((a, i) => `${axisLabel(a)} = ${at[i]}`).join(', ')
        const first = parsed.error.issues[0]
        issues.push({ path: 'axes', message: `Point ${index + 1} (${where}) is not a valid run: ${describeIssuePath(first.path, def.baseConfig.channels.length)}: ${first.message}` })
      }
      continue
    }
    points.push({ index, values: at, config: parsed.data, ...(windowExtendedFromNs !== undefined ? { windowExtendedFromNs } : {}) })
  }
  return issues.length ? { ok: false, issues } : { ok: true, points, axisValues: values }
}

export interface SweepLimits {
  /**
   * Summed over every point: what one sweep may ask of the shared workers. Fifty full-size runs, so that the
   * one-click sensing scan of a 10 km fibre (41 detunings of about 1.2e10 cell-updates, 1.5e10 with the error
   * estimate) is accepted: hours on a queue, and still half of one account's daily quota (server/env.ts).
   */
  maxTotalCellUpdates: number
  /** Each point is a run and obeys the run limits. */
  run: ResourceLimits
  maxPoints: number
}

export const DEFAULT_SWEEP_LIMITS: SweepLimits = {
  maxTotalCellUpdates: 50 * DEFAULT_RESOURCE_LIMITS.maxCellUpdates,
  run: DEFAULT_RESOURCE_LIMITS,
  maxPoints: MAX_SWEEP_POINTS,
}

/** calibration: the server's measured speeds (speed-calibration.ts), as for a single run. */
export function estimateSweep(points: BuiltPoint[], calibration?: SpeedCalibration | null): { total: SweepEstimate; perPoint: ReturnType<typeof estimateResources>[] } {
  const perPoint = points.map((p) => estimateResources(p.config, chooseGrid(p.config), 1, calibration))
  return {
    perPoint,
    total: {
      points: points.length,
      cellUpdates: perPoint.reduce((s, e) => s + e.cellUpdates, 0),
      expectedSeconds: perPoint.reduce((s, e) => s + e.expectedSeconds, 0),
      maxMemoryBytes: perPoint.reduce((m, e) => Math.max(m, e.memoryBytes.total), 0),
      ...(perPoint.length > 0 ? { timeBasis: sweepTimeBasis(perPoint.map((e) => e.timeBasis)) } : {}),
    },
  }
}

/**
 * The basis of a sweep's time: measured only when every point's is, from the fewest runs any point's speed
 * rests on, with the kernel of the costliest point; the range is the sum of the points' ranges.
 */
function sweepTimeBasis(bases: TimeBasis[]): TimeBasis {
  const measured = bases.every((b) => b.source === 'recent-runs')
  const costliest = bases.reduce((a, b) => (b.slowSeconds > a.slowSeconds ? b : a))
  return {
    source: measured ? 'recent-runs' : 'benchmark',
    runs: measured ? Math.min(...bases.map((b) => b.runs)) : 0,
    kernel: costliest.kernel,
    fastSeconds: bases.reduce((s, b) => s + b.fastSeconds, 0),
    slowSeconds: bases.reduce((s, b) => s + b.slowSeconds, 0),
  }
}

const sig = (x: number) => x.toPrecision(3)

export type SweepLimitCheck = { ok: true } | { ok: false; message: string; reasons: string[] }

/** Refuses a sweep whose total, or any one point, is over the limits; the message names limit and total. */
export function checkSweepLimits(points: BuiltPoint[], limits: SweepLimits = DEFAULT_SWEEP_LIMITS): SweepLimitCheck {
  const { total, perPoint } = estimateSweep(points)
  const reasons: string[] = []
  if (total.cellUpdates > limits.maxTotalCellUpdates) {
    const f = total.cellUpdates / limits.maxTotalCellUpdates
    reasons.push(
      `The sweep needs ${sig(total.cellUpdates)} cell-updates in total over ${total.points} points, over the sweep limit of ` +
        `${sig(limits.maxTotalCellUpdates)}: use at most ${Math.max(1, Math.floor(total.points / f))} points, or make each run about ${sig(f)}× smaller (shorter window or coarser time step).`,
    )
  }
  const over = perPoint.map((e, i) => ({ i, check: checkLimits(e, limits.run) })).filter((x) => !x.check.ok)
  if (over.length) {
    const first = over[0].check as { message: string }
    reasons.push(`${over.length} of the ${total.points} points are over the run limits; point ${points[over[0].i].index + 1}: ${first.message}`)
  }
  return reasons.length ? { ok: false, message: reasons.join(' '), reasons } : { ok: true }
}
