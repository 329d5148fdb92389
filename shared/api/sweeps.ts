// Parameter sweeps as the form, the API and the client see them: a base configuration plus one or two axes,
// each a sweepable field (shared/physics/sweep-fields.ts) and its values; the sweep's summary, detail and points.
import { z } from 'zod'
import { safeText } from './text'
import { RUN_NOTES_MAX, RUN_TITLE_MAX, RunState } from './runs'
import { ShareTokenQuery } from './shares'
import { SimulationConfig } from '../physics/simulation-config'
import { SWEEP_FIELD_IDS, sweepField } from '../physics/sweep-fields'
import { TimeBasis } from '../physics/speed-calibration'

const finite = () => z.number().finite()

/** Values on one axis; 2 × 64 keeps a heatmap readable. */
export const MAX_AXIS_VALUES = 64
/** Points (runs) in one sweep. */
export const MAX_SWEEP_POINTS = 256

export const AxisValues = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('list'), values: z.array(finite()).min(1, 'give at least one value').max(MAX_AXIS_VALUES) }),
  z.object({
    kind: z.literal('linear'),
    start: finite(),
    stop: finite(),
    count: z.number().int().min(2, 'a range needs at least 2 values').max(MAX_AXIS_VALUES),
  }),
  z.object({
    kind: z.literal('log'),
    start: finite().positive('a logarithmic range must start above 0'),
    stop: finite().positive('a logarithmic range must stop above 0'),
    count: z.number().int().min(2, 'a range needs at least 2 values').max(MAX_AXIS_VALUES),
  }),
])
export type AxisValues = z.infer<typeof AxisValues>

export const SweepAxis = z
  .object({
    field: z.enum(SWEEP_FIELD_IDS),
    pulseLabel: safeText().trim().max(60).optional().describe('Label of the pulse(s) a pulse field acts on'),
    tiedLabels: z
      .array(safeText().trim().min(1, 'must not be empty').max(60))
      .max(4, 'tie at most 4 further labels')
      .optional()
      .describe('Further pulse labels that take the same value (e.g. the data and write widths together)'),
    values: AxisValues,
  })
  .superRefine((a, ctx) => {
    const f = sweepField(a.field)
    if (f.needsPulseLabel && !a.pulseLabel) ctx.addIssue({ code: 'custom', path: ['pulseLabel'], message: `${f.label} needs the label of the pulse(s) to vary` })
    if (!f.needsPulseLabel && a.tiedLabels?.length) ctx.addIssue({ code: 'custom', path: ['tiedLabels'], message: `${f.label} does not act on labelled pulses; only pulse fields can be tied` })
    const bad = axisLengthOk(a.values) ? axisValues(a.values).find((v) => (f.positive ? v <= 0 : !f.signed && v < 0)) : undefined
    if (bad !== undefined) ctx.addIssue({ code: 'custom', path: ['values'], message: `${f.label} must be ${f.positive ? 'above 0' : 'at least 0'}; got ${bad} ${f.unit}` })
  })
export type SweepAxis = z.infer<typeof SweepAxis>

const sweepFields = {
  baseConfig: SimulationConfig,
  axes: z.array(SweepAxis).min(1, 'a sweep needs one axis').max(2, 'a sweep has at most two axes'),
  extendWindow: z.boolean().optional().describe('Lengthen a point’s window when its pulses or its storage echo would leave it (default: yes)'),
}

function checkAxes(s: { axes: SweepAxis[] }, ctx: z.RefinementCtx) {
  const [a, b] = s.axes
  if (a && b && a.field === b.field && (a.pulseLabel ?? '') === (b.pulseLabel ?? '')) {
    ctx.addIssue({ code: 'custom', path: ['axes', 1, 'field'], message: 'The two axes must vary different fields' })
  }
  const n = s.axes.reduce((p, x) => p * axisLength(x.values), 1)
  if (s.axes.every((x) => axisLengthOk(x.values)) && n > MAX_SWEEP_POINTS) ctx.addIssue({ code: 'custom', path: ['axes'], message: `The sweep has ${n} points; at most ${MAX_SWEEP_POINTS} are allowed` })
}

/** What the estimate needs: the base configuration and the axes. */
export const SweepDefinition = z.object(sweepFields).superRefine(checkAxes)
export type SweepDefinition = z.infer<typeof SweepDefinition>

export const SweepCreate = z
  .object({
    groupId: z.uuid({ error: 'must be the id of one of your groups' }),
    title: safeText().trim().min(1, 'must not be empty').max(RUN_TITLE_MAX).describe('Short name shown in the sweep list'),
    notes: safeText().max(RUN_NOTES_MAX).default('').describe('Free text kept with the sweep'),
    ...sweepFields,
  })
  .superRefine(checkAxes)
export type SweepCreate = z.infer<typeof SweepCreate>
export type SweepCreateInput = z.input<typeof SweepCreate>

/** How many values an axis takes, without building them. */
export function axisLength(v: AxisValues): number {
  return v.kind === 'list' ? v.values.length : v.count
}

// Refinements run even when a count broke its own max (zod reports both), so they must not build a
// list of 1e21 values before that issue is seen.
function axisLengthOk(v: AxisValues): boolean {
  const n = axisLength(v)
  return Number.isInteger(n) && n >= 1 && n <= MAX_AXIS_VALUES
}

/** The values an axis takes, in order. Log ranges are geometric: equal ratios between neighbours. */
export function axisValues(v: AxisValues): number[] {
  if (v.kind === 'list') return [...v.values]
  const out: number[] = []
  for (let i = 0; i < v.count; i++) {
    const f = i / (v.count - 1)
    out.push(v.kind === 'linear' ? v.start + f * (v.stop - v.start) : v.start * Math.pow(v.stop / v.start, f))
  }
  // Exact end points: the last value is what the user typed, not start·(stop/start)^1 rounded.
  out[out.length - 1] = v.stop
  return out
}

export const SweepState = z.enum(['running', 'finished', 'cancelled'])
export type SweepState = z.infer<typeof SweepState>

export const PointCounts = z.object({
  queued: z.number().int().nonnegative(),
  running: z.number().int().nonnegative(),
  succeeded: z.number().int().nonnegative(),
  failed: z.number().int().nonnegative(),
  cancelled: z.number().int().nonnegative(),
})
export type PointCounts = z.infer<typeof PointCounts>

/** Totals over every point of a sweep. */
export const SweepEstimate = z.object({
  points: z.number().int().nonnegative(),
  cellUpdates: z.number().nonnegative(),
  expectedSeconds: z.number().nonnegative(),
  /** The largest single point's memory (points run one per solver thread). */
  maxMemoryBytes: z.number().nonnegative(),
  /** Where the expected time comes from (absent in sweeps stored before it was given). */
  timeBasis: TimeBasis.optional(),
})
export type SweepEstimate = z.infer<typeof SweepEstimate>

export const SweepEstimateResponse = z.object({
  estimate: SweepEstimate,
  ok: z.boolean(),
  message: z.string().nullable(),
  limits: z.object({ maxTotalCellUpdates: z.number(), maxCellUpdatesPerPoint: z.number(), maxPoints: z.number().int() }),
})
export type SweepEstimateResponse = z.infer<typeof SweepEstimateResponse>

export const MetricColumn = z.object({ key: z.string(), label: z.string(), unit: z.string() })
export type MetricColumn = z.infer<typeof MetricColumn>

export const SweepPoint = z.object({
  index: z.number().int().nonnegative(),
  /** One value per axis, in the axes' units. */
  values: z.array(z.number()),
  runId: z.uuid(),
  status: RunState,
  progress: z.number().min(0).max(1),
  attempt: z.number().int().nonnegative(),
  error: z.string().nullable(),
  startedAt: z.iso.datetime({ offset: true }).nullable(),
  finishedAt: z.iso.datetime({ offset: true }).nullable(),
  /** Figures of merit by MetricColumn.key; null where the run gives none (or has not finished). */
  metrics: z.record(z.string(), z.number().nullable()),
})
export type SweepPoint = z.infer<typeof SweepPoint>

export const SweepSummary = z.object({
  id: z.uuid(),
  groupId: z.uuid(),
  authorId: z.uuid().nullable(),
  authorName: z.string().nullable(),
  title: z.string(),
  status: SweepState,
  pointCount: z.number().int().positive(),
  counts: PointCounts,
  /** Axis labels with units, e.g. "Pulse width [read] (ns)". */
  axisLabels: z.array(z.string()),
  estimate: SweepEstimate,
  createdAt: z.iso.datetime({ offset: true }),
  finishedAt: z.iso.datetime({ offset: true }).nullable(),
})
export type SweepSummary = z.infer<typeof SweepSummary>

export const SweepDetail = SweepSummary.extend({
  notes: z.string(),
  baseConfig: SimulationConfig,
  axes: z.array(SweepAxis),
  /** Whether points' windows were lengthened to hold their pulses. */
  extendWindow: z.boolean().default(true),
  /** axisValues of each axis. Point index = i0 · n1 + i1 for two axes. */
  axisValues: z.array(z.array(z.number())),
  metrics: z.array(MetricColumn),
  points: z.array(SweepPoint),
})
export type SweepDetail = z.infer<typeof SweepDetail>

export const SweepListQuery = z.object({
  groupId: z.uuid().optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
})
export type SweepListQuery = z.infer<typeof SweepListQuery>

export const SweepList = z.object({
  items: z.array(SweepSummary),
  total: z.number().int().nonnegative(),
  page: z.number().int().positive(),
  pageSize: z.number().int().positive(),
})
export type SweepList = z.infer<typeof SweepList>

export const SweepDownloadQuery = ShareTokenQuery.extend({
  arrays: z.enum(['0', '1', 'true', 'false']).optional().transform((v) => v === '1' || v === 'true'),
})

/** "Pulse width [read] (ns)", "Pulse width [data = write] (ns)". */
export function axisLabel(a: Pick<SweepAxis, 'field' | 'pulseLabel'> & { tiedLabels?: string[] }): string {
  const f = sweepField(a.field)
  const labels = [a.pulseLabel, ...(a.tiedLabels ?? [])].filter((l): l is string => !!l)
  return `${f.label}${f.needsPulseLabel && labels.length ? ` [${labels.join(' = ')}]` : ''} (${f.unit})`
}
