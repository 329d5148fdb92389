// Fits of a run's model to a measured trace: what the user frees and bounds, and what comes back.
import { z } from 'zod'
import { TimeWindow } from './traces'

export const FIT_SCHEMA_VERSION = 1

/** Ports whose output a measurement can be compared with. */
export const FitPort = z.enum(['pumpOut', 'stokesOut'])
export type FitPort = z.infer<typeof FitPort>

const Bounds = z
  .object({ min: z.number().finite(), max: z.number().finite() })
  .refine((b) => b.max > b.min, { message: 'The upper bound must exceed the lower bound', path: ['max'] })
export type Bounds = z.infer<typeof Bounds>

/** Physical parameters that can be freed; each one changes the solver's input. */
export const PHYSICAL_FIT_PARAMETERS = ['linewidthMHz', 'gainCoefficientMPerW', 'pulseWidthScale', 'detuningMHz'] as const
export const PhysicalFitParameter = z.enum(PHYSICAL_FIT_PARAMETERS)
export type PhysicalFitParameter = z.infer<typeof PhysicalFitParameter>
export const FitParameterName = z.enum(['timeOffsetNs', 'scale', ...PHYSICAL_FIT_PARAMETERS])
export type FitParameterName = z.infer<typeof FitParameterName>

export const FIT_PARAMETER_META: Record<FitParameterName, { label: string; unit: string; help: string }> = {
  timeOffsetNs: { label: 'Time offset', unit: 'ns', help: 'Added to the model time axis to line it up with the measurement' },
  scale: { label: 'Amplitude scale', unit: '', help: 'Measurement ≈ scale × model power (detector gain, coupling loss)' },
  linewidthMHz: { label: 'Brillouin linewidth Δν_B', unit: 'MHz', help: 'Gain FWHM; phonon energy lifetime 1/(2πΔν_B)' },
  gainCoefficientMPerW: { label: 'Gain coefficient g_B', unit: 'm/W', help: 'Peak Brillouin gain coefficient' },
  pulseWidthScale: { label: 'Pulse width factor', unit: '×', help: 'Stretches the FWHM (and rise time) of every launched pulse' },
  detuningMHz: { label: 'Detuning', unit: 'MHz', help: '(ν_p − ν_s) − ν_B' },
}

/**
 * Which model(s) to fit. 'asRun' keeps the run's own higher-order setting; 'compare' fits both and ranks
 * them by residual and information criteria.
 */
export const HigherOrderChoice = z.enum(['asRun', 'off', 'on', 'compare'])
export type HigherOrderChoice = z.infer<typeof HigherOrderChoice>

/**
 * Where a search range may lie: the ranges the run schema itself allows (shared/physics/waveguide.ts,
 * shared/physics/simulation-config.ts), so every model the fit evaluates is a valid run; the offset and width
 * factor are bounded so grids and shifted axes derived from them stay finite.
 */
export const FIT_PARAMETER_RANGES: Record<FitParameterName, { min: number; max: number; positive?: boolean }> = {
  timeOffsetNs: { min: -1e6, max: 1e6 },
  scale: { min: -1e12, max: 1e12 },
  linewidthMHz: { min: 0, max: 10_000, positive: true },
  gainCoefficientMPerW: { min: 0, max: 1e-6, positive: true },
  pulseWidthScale: { min: 0.01, max: 100 },
  detuningMHz: { min: -1e5, max: 1e5 },
}

function checkRange(name: FitParameterName, b: Bounds, path: Array<string | number>, ctx: z.RefinementCtx) {
  const r = FIT_PARAMETER_RANGES[name]
  const low = r.positive ? b.min <= r.min : b.min < r.min
  if (low) ctx.addIssue({ code: 'custom', path: [...path, 'min'], message: `must be ${r.positive ? 'above' : 'at least'} ${r.min} ${FIT_PARAMETER_META[name].unit}`.trim() })
  if (b.max > r.max) ctx.addIssue({ code: 'custom', path: [...path, 'max'], message: `must be at most ${r.max} ${FIT_PARAMETER_META[name].unit}`.trim() })
}

export const FitRequest = z.object({
  schemaVersion: z.literal(FIT_SCHEMA_VERSION).default(FIT_SCHEMA_VERSION),
  traceId: z.uuid(),
  runId: z.uuid(),
  signalIndex: z.number().int().min(0).default(0).describe('Which signal of the trace'),
  port: FitPort.default('pumpOut'),
  channel: z.number().int().min(0).max(7).default(0).describe('Channel index (0 = channel 1)'),
  window: TimeWindow.nullable().default(null).describe('Part of the measurement to fit (ns, measurement time axis)'),
  timeOffsetNs: Bounds.describe('Search range of the time offset (ns)'),
  /** Parameters to free, each with its bounds; absent ones keep the run's value. */
  free: z.partialRecord(PhysicalFitParameter, Bounds).default({}),
  higherOrder: HigherOrderChoice.default('asRun'),
  maxIterations: z.number().int().min(1).max(100).default(20),
}).superRefine((r, ctx) => {
  checkRange('timeOffsetNs', r.timeOffsetNs, ['timeOffsetNs'], ctx)
  for (const [name, b] of Object.entries(r.free)) if (b) checkRange(name as PhysicalFitParameter, b, ['free', name], ctx)
})
export type FitRequest = z.infer<typeof FitRequest>
export type FitRequestInput = z.input<typeof FitRequest>

/** True when the fit needs no new solver runs: offset and scale alone, solved in closed form. */
export function isClosedFormFit(r: FitRequest): boolean {
  return Object.keys(r.free).length === 0 && r.higherOrder === 'asRun'
}

export const FitParameterValue = z.object({
  name: FitParameterName,
  value: z.number(),
  /** One standard deviation from covariance = s²(JᵀJ)⁻¹; null when JᵀJ is singular. */
  uncertainty: z.number().nullable(),
  initial: z.number(),
  min: z.number().nullable(),
  max: z.number().nullable(),
  /** The value sits on a bound: its uncertainty is not meaningful. */
  atBound: z.boolean(),
})
export type FitParameterValue = z.infer<typeof FitParameterValue>

export const FitModelResult = z.object({
  higherOrderAcoustic: z.boolean(),
  parameters: z.array(FitParameterValue),
  /** √(Σ r²) in the trace's unit. */
  residualNorm: z.number(),
  rmsResidual: z.number(),
  points: z.number().int().positive(),
  freeParameters: z.number().int().positive(),
  /** N ln(SSR/N) + 2k and N ln(SSR/N) + k ln N (Gaussian errors of unknown variance). */
  aic: z.number(),
  bic: z.number(),
  evaluations: z.number().int().nonnegative(),
  iterations: z.number().int().nonnegative(),
  /** The best model on the fitted samples (decimated for drawing). */
  curve: z.object({ timeNs: z.array(z.number()), model: z.array(z.number()), measured: z.array(z.number()) }),
})
export type FitModelResult = z.infer<typeof FitModelResult>

export const FitResult = z.object({
  method: z.enum(['closedForm', 'levenbergMarquardt']),
  signalUnit: z.enum(['W', 'arb']),
  window: TimeWindow,
  models: z.array(FitModelResult).min(1),
  /** Index into models of the lowest BIC. */
  preferred: z.number().int().min(0),
  /** BIC(higher-order on) − BIC(off) and the same for AIC, when both were fitted. Negative favours the term. */
  comparison: z.object({ deltaAic: z.number(), deltaBic: z.number(), deltaResidualNorm: z.number() }).nullable(),
})
export type FitResult = z.infer<typeof FitResult>

export const FitState = z.enum(['queued', 'running', 'succeeded', 'failed'])
export type FitState = z.infer<typeof FitState>

export const FitDetail = z.object({
  id: z.uuid(),
  groupId: z.uuid(),
  traceId: z.uuid(),
  runId: z.uuid(),
  authorName: z.string().nullable(),
  status: FitState,
  progress: z.number().min(0).max(1),
  message: z.string(),
  inputs: FitRequest,
  result: FitResult.nullable(),
  error: z.string().nullable(),
  createdAt: z.iso.datetime({ offset: true }),
  finishedAt: z.iso.datetime({ offset: true }).nullable(),
})
export type FitDetail = z.infer<typeof FitDetail>

export const FitListQuery = z.object({ traceId: z.uuid().optional(), runId: z.uuid().optional() }).refine((q) => q.traceId || q.runId, { message: 'Give a traceId or a runId' })
export const FitList = z.object({ items: z.array(FitDetail) })
export type FitList = z.infer<typeof FitList>

/** pg-boss payload of the fit queue. */
export const FitJobPayload = z.object({ schemaVersion: z.literal(1), fitId: z.uuid() })
export type FitJobPayload = z.infer<typeof FitJobPayload>
