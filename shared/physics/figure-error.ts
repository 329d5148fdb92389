// The per-run discretisation-error estimate that rides along with the figures of merit. The run is
// repeated on the grid with q ≈ 2 times the step; for a scheme of order p the fine value's error is
// err(h) = f_h − f ≈ (f_qh − f_h)/(q^p − 1) (Richardson extrapolation: Hairer, Nørsett & Wanner, Solving Ordinary
// Differential Equations I, §II.4; LeVeque, Finite Difference Methods, §A.6).
import { z } from 'zod'

/** One figure: its value, the companion's value and the estimated error of the value. */
export const FigureError = z.object({
  value: z.number(),
  coarseValue: z.number(),
  /** |f_h − f_qh|/(q^p − 1), in the figure's own unit. */
  absError: z.number().nonnegative(),
  /** absError/|value| (phases: absError/2π); null when the value is 0. */
  relError: z.number().nonnegative().nullable(),
  /** relError above the flag threshold. */
  flagged: z.boolean(),
  /** Time step (ps) that brings relError under the target by the order-p scaling; null unless flagged. */
  suggestedTimeStepPs: z.number().positive().nullable(),
})
export type FigureError = z.infer<typeof FigureError>

export const FigureErrorStatus = z.enum(['estimated', 'unavailable', 'off'])

/** Keyed by the figure's path in FiguresOfMerit, e.g. "channels.0.reflectivity" or "windows.1.energyJ". */
export const FigureErrors = z.object({
  status: FigureErrorStatus,
  /** Why there is no estimate (status 'unavailable' or 'off'), in words a user can act on. */
  reason: z.string().nullable(),
  order: z.number().int().positive(),
  timeStepPs: z.number().positive().nullable(),
  coarseTimeStepPs: z.number().positive().nullable(),
  flagAboveRelError: z.number().positive(),
  targetRelError: z.number().positive(),
  /** Node-steps of the companion run (0 when none ran): its cost beside the run's own counter. */
  cellUpdates: z.number().nonnegative(),
  figures: z.record(z.string(), FigureError),
})
export type FigureErrors = z.infer<typeof FigureErrors>

/** Keys whose values are inputs, bookkeeping or the scheme's own check (photon balance, at round-off), not figures. */
export const NOT_FIGURES: ReadonlySet<string> = new Set([
  'channel',
  'startNs',
  'endNs',
  'readWindowNs',
  'retrievalWindow',
  'anchor',
  'arrivalNs',
  'fwhmNs',
  'notDetermined',
  'wallTimeS',
  'cellUpdatesPerS',
  'errorEstimate',
  'manleyRoweResidual',
])

/** Every finite numeric figure by its dotted path (array items by index), skipping NOT_FIGURES. */
export function numericLeaves(value: unknown, prefix = '', out = new Map<string, number>()): Map<string, number> {
  if (typeof value === 'number') {
    if (Number.isFinite(value)) out.set(prefix, value)
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => numericLeaves(v, prefix ? `${prefix}.${i}` : String(i), out))
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) if (!NOT_FIGURES.has(k)) numericLeaves(v, prefix ? `${prefix}.${k}` : k, out)
  }
  return out
}

/**
 * The figures with every figure replaced by its estimated absolute error (null where there is none), labels
 * and channel indices kept: whatever reads a figure from the figures reads its error from this copy the same way.
 */
export function errorShaped<T>(figures: T, errors: FigureErrors['figures'], prefix = ''): T {
  const at = (k: string | number) => (prefix ? `${prefix}.${k}` : String(k))
  if (Array.isArray(figures)) return figures.map((v, i) => errorShaped(v, errors, at(i))) as T
  if (figures && typeof figures === 'object') {
    const out: Record<string, unknown> = {}
    for (const [k, v] of Object.entries(figures)) {
      // The channel index is how readers find a channel; other non-figures have no error.
      if (NOT_FIGURES.has(k)) out[k] = k === 'channel' ? v : null
      else if (typeof v === 'number' || v === null) out[k] = errors[at(k)]?.absError ?? null
      else out[k] = errorShaped(v, errors, at(k))
    }
    return out as T
  }
  return figures
}
