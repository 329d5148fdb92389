// Measured traces: the choices made when importing a file, and what the API answers about stored traces.
import { z } from 'zod'
import { safeText } from './text'

/** Largest file accepted by POST /api/traces (bytes); the upload form states it. */
export const TRACE_UPLOAD_LIMIT_BYTES = 25 * 1024 * 1024
/** Most samples (rows) one trace may hold. */
export const TRACE_MAX_SAMPLES = 1_000_000
/** Most signal columns one trace may hold. */
export const TRACE_MAX_SIGNALS = 16
/** Longest time between samples (ns): 1000 s, far beyond any oscilloscope trace; keeps derived times finite. */
export const TRACE_MAX_SAMPLE_INTERVAL_NS = 1e12
/** Smallest detector conversion gain (V/W); volts are divided by it, so a subnormal one would give infinite watts. */
export const TRACE_MIN_RESPONSIVITY_V_PER_W = 1e-6
/** Most columns a delimited file may have (the signals are picked from them). */
export const TRACE_MAX_COLUMNS = 64
/** Longest line of a delimited file (characters): a data line holds a few numbers; one longer is not a table. */
export const TRACE_MAX_LINE_CHARS = 65_536

export const TIME_UNITS = ['s', 'ms', 'us', 'ns', 'ps'] as const
export const TraceTimeUnit = z.enum(TIME_UNITS)
export type TraceTimeUnit = z.infer<typeof TraceTimeUnit>
/** Nanoseconds per unit. */
export const NS_PER_TIME_UNIT: Record<TraceTimeUnit, number> = { s: 1e9, ms: 1e6, us: 1e3, ns: 1, ps: 1e-3 }
export const TIME_UNIT_LABEL: Record<TraceTimeUnit, string> = { s: 's', ms: 'ms', us: 'µs', ns: 'ns', ps: 'ps' }

export const SIGNAL_UNITS = ['W', 'mW', 'uW', 'V', 'mV', 'arb'] as const
export const TraceSignalUnit = z.enum(SIGNAL_UNITS)
export type TraceSignalUnit = z.infer<typeof TraceSignalUnit>
export const SIGNAL_UNIT_LABEL: Record<TraceSignalUnit, string> = { W: 'W', mW: 'mW', uW: 'µW', V: 'V (photodetector)', mV: 'mV (photodetector)', arb: 'arbitrary' }
/** Stored traces are in watts, or in the file's own arbitrary unit. */
export const StoredSignalUnit = z.enum(['W', 'arb'])
export type StoredSignalUnit = z.infer<typeof StoredSignalUnit>

export const Delimiter = z.enum(['auto', 'comma', 'semicolon', 'tab', 'whitespace'])
export type Delimiter = z.infer<typeof Delimiter>
export const DecimalSeparator = z.enum(['auto', 'dot', 'comma'])
export type DecimalSeparator = z.infer<typeof DecimalSeparator>

export const TimeWindow = z
  .object({ startNs: z.number().finite(), endNs: z.number().finite() })
  .refine((w) => w.endNs > w.startNs, { message: 'The window must end after it starts', path: ['endNs'] })
export type TimeWindow = z.infer<typeof TimeWindow>

/** How a file becomes a trace: the same object drives the browser preview and the stored parse. */
export const TraceImportSettings = z
  .object({
    name: safeText().trim().min(1, 'must not be empty').max(200).describe('Name shown in the trace list'),
    notes: safeText().max(10_000).default(''),
    delimiter: Delimiter.default('auto').describe('Column separator of a text file'),
    decimalSeparator: DecimalSeparator.default('auto').describe('Decimal mark of a text file'),
    /** Column holding time; null when samples are equally spaced by sampleIntervalNs. */
    timeColumn: z.number().int().min(0).nullable().default(0),
    /** May be left out only when the file names the unit (header, number suffixes or metadata). */
    timeUnit: TraceTimeUnit.optional().describe('Unit of the time column'),
    // Bounded so the derived time axis (index × interval, up to TRACE_MAX_SAMPLES samples) stays finite.
    sampleIntervalNs: z.number().finite().positive().max(TRACE_MAX_SAMPLE_INTERVAL_NS, `must be at most ${TRACE_MAX_SAMPLE_INTERVAL_NS} ns`).optional().describe('Time between samples (ns), when there is no time column'),
    signalColumns: z.array(z.number().int().min(0)).min(1, 'pick at least one signal column').max(TRACE_MAX_SIGNALS),
    signalUnit: TraceSignalUnit.default('arb').describe('Unit of the signal columns'),
    responsivityVPerW: z.number().finite().min(TRACE_MIN_RESPONSIVITY_V_PER_W, `must be at least ${TRACE_MIN_RESPONSIVITY_V_PER_W} V/W`).max(1e9).optional().describe('Photodetector conversion gain (V/W), for signals in volts'),
    baseline: TimeWindow.nullable().default(null).describe('Time window (ns) whose mean is subtracted from each signal'),
  })
  .superRefine((s, ctx) => {
    if ((s.signalUnit === 'V' || s.signalUnit === 'mV') && s.responsivityVPerW === undefined) {
      ctx.addIssue({ code: 'custom', path: ['responsivityVPerW'], message: 'Signals in volts need the detector responsivity (V/W) to become powers' })
    }
    if (s.timeColumn === null && s.sampleIntervalNs === undefined) {
      ctx.addIssue({ code: 'custom', path: ['sampleIntervalNs'], message: 'Without a time column, give the time between samples' })
    }
    if (s.timeColumn !== null && s.signalColumns.includes(s.timeColumn)) {
      ctx.addIssue({ code: 'custom', path: ['signalColumns'], message: 'The time column cannot also be a signal column' })
    }
    if (new Set(s.signalColumns).size !== s.signalColumns.length) {
      ctx.addIssue({ code: 'custom', path: ['signalColumns'], message: 'Each signal column may be picked once' })
    }
  })
export type TraceImportSettings = z.infer<typeof TraceImportSettings>
export type TraceImportSettingsInput = z.input<typeof TraceImportSettings>

/** The multipart form of POST /api/traces: a `file` part and a `settings` part holding this as JSON. */
export const TraceUploadSettings = z.object({ groupId: z.uuid({ error: 'must be the id of one of your groups' }) }).and(TraceImportSettings)
export type TraceUploadSettings = z.infer<typeof TraceUploadSettings>

export const TraceColumn = z.object({ index: z.number().int().min(0), name: z.string(), unitHint: z.string().nullable() })
export type TraceColumn = z.infer<typeof TraceColumn>

export const TraceSignalInfo = z.object({
  column: z.number().int().min(0),
  label: z.string(),
  unit: StoredSignalUnit,
  /** Mean over the baseline window that was subtracted (in `unit`); 0 without a window. */
  baseline: z.number(),
  /** Largest value after the baseline was removed. */
  peak: z.number(),
})
export type TraceSignalInfo = z.infer<typeof TraceSignalInfo>

const iso = () => z.iso.datetime({ offset: true })

export const TraceSummary = z.object({
  id: z.uuid(),
  groupId: z.uuid(),
  authorId: z.uuid().nullable(),
  authorName: z.string().nullable(),
  name: z.string(),
  fileName: z.string(),
  byteSize: z.number().int().nonnegative(),
  format: z.enum(['delimited', 'npy']),
  sampleCount: z.number().int().positive(),
  startNs: z.number(),
  endNs: z.number(),
  signals: z.array(TraceSignalInfo),
  createdAt: iso(),
})
export type TraceSummary = z.infer<typeof TraceSummary>

export const TraceDetail = TraceSummary.extend({
  notes: z.string(),
  contentType: z.string(),
  sha256: z.string(),
  settings: TraceImportSettings,
  columns: z.array(TraceColumn),
})
export type TraceDetail = z.infer<typeof TraceDetail>

export const TraceList = z.object({ items: z.array(TraceSummary), total: z.number().int().nonnegative() })
export type TraceList = z.infer<typeof TraceList>

export const TraceListQuery = z.object({
  groupId: z.uuid(),
  q: safeText().trim().max(200).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(50),
})
export type TraceListQuery = z.infer<typeof TraceListQuery>

/** GET /api/traces/:id/data: the parsed arrays; `maxPoints` thins them evenly for drawing. */
export const TraceDataQuery = z.object({ maxPoints: z.coerce.number().int().min(10).max(TRACE_MAX_SAMPLES).optional() })
export const TraceData = z.object({
  timeNs: z.array(z.number()),
  signals: z.array(z.object({ label: z.string(), unit: StoredSignalUnit, values: z.array(z.number()) })),
  /** Every `stride`-th sample was kept (1 = all). */
  stride: z.number().int().positive(),
})
export type TraceData = z.infer<typeof TraceData>
