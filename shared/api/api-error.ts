// The one error envelope every API route answers with, and the `details` each error code may carry.
// Services build details (server/errors.ts AppError's last argument); the error handler passes all of them
// on under `details`, except `fields`, which has its own key. The client turns details into sentences
// (src/api/error-details.ts); a code not listed here carries no details.
import { z } from 'zod'

export const ApiFieldError = z.object({ path: z.string(), message: z.string() })
export type ApiFieldError = z.infer<typeof ApiFieldError>

/** `over_limit` of a run: one sentence per limit the run is over, each naming the knob that fixes it. */
export const RunOverLimitDetails = z.object({ reasons: z.array(z.string()) })
export type RunOverLimitDetails = z.infer<typeof RunOverLimitDetails>

/** `over_limit` of a sweep: the reasons and the sweep's totals against the limit. */
export const SweepOverLimitDetails = RunOverLimitDetails.extend({
  totalCellUpdates: z.number(),
  limitCellUpdates: z.number(),
  points: z.number().int(),
})
export type SweepOverLimitDetails = z.infer<typeof SweepOverLimitDetails>

/** `unreadable_trace`: where in the uploaded file the problem is (1-based line and column, or a byte offset). */
export const TraceParseErrorDetails = z.object({
  where: z.object({ line: z.number().int().optional(), column: z.number().int().optional(), byteOffset: z.number().int().optional() }),
})
export type TraceParseErrorDetails = z.infer<typeof TraceParseErrorDetails>

/** `quota_runs_in_flight`, `quota_cell_updates_per_day`: which quota, its limit, the use so far, and when it frees up. */
export const QuotaErrorDetails = z.object({
  quota: z.object({
    scope: z.enum(['user', 'group']),
    limit: z.number(),
    used: z.number(),
    /** ISO time; null when it frees with the next finished run, or never (the demand alone is too big). */
    freesAt: z.string().nullable(),
  }),
})
export type QuotaErrorDetails = z.infer<typeof QuotaErrorDetails>

/** The shape of `details` per error code. */
export const ERROR_DETAILS = {
  over_limit: z.union([SweepOverLimitDetails, RunOverLimitDetails]),
  unreadable_trace: TraceParseErrorDetails,
  quota_runs_in_flight: QuotaErrorDetails,
  quota_cell_updates_per_day: QuotaErrorDetails,
} as const

export const ApiErrorBody = z.object({
  error: z.object({
    /** Stable, machine-readable (`invalid_input`, `over_limit`, `not_found` …). */
    code: z.string(),
    /** A sentence safe to show as it is. */
    message: z.string(),
    /** The request fields at fault, by dotted path as in the request body. */
    fields: z.array(ApiFieldError).optional(),
    /** What the service knows beyond the message; its shape per code is ERROR_DETAILS. */
    details: z.record(z.string(), z.unknown()).optional(),
    /** Quote it when reporting a 500. */
    requestId: z.string().optional(),
  }),
})
export type ApiErrorBody = z.infer<typeof ApiErrorBody>
