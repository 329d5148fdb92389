// The estimate of a single run before it is submitted, and the solver speeds this server has measured (the
// calibration the form's own estimate takes, so the form and the server predict the same time).
import { z } from 'zod'
import { SimulationConfig } from '../physics/simulation-config'
import { TimeBasis } from '../physics/speed-calibration'

export { SpeedCalibration } from '../physics/speed-calibration'

export const RunEstimateRequest = z.object({ config: SimulationConfig })
export type RunEstimateRequest = z.infer<typeof RunEstimateRequest>

export const RunEstimateResponse = z.object({
  /** shared/physics/resource-estimate.ts ResourceEstimate; the figures below are the ones the form shows. */
  estimate: z.looseObject({
    cells: z.number().int().nonnegative(),
    steps: z.number().int().nonnegative(),
    cellUpdates: z.number().nonnegative(),
    cellUpdatesPerS: z.number().positive(),
    expectedSeconds: z.number().nonnegative(),
    timeBasis: TimeBasis,
  }),
  ok: z.boolean(),
  /** Why the run is too large to queue, with the knob to turn; null when it fits. */
  message: z.string().nullable(),
})
export type RunEstimateResponse = z.infer<typeof RunEstimateResponse>
