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
  figures: z.record(z.string(), FigureError),
})
export type FigureErrors = z.infer<typeof FigureErrors>
