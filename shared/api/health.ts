import { z } from 'zod'

/** GET /api/health. `queue` is 'not-configured' until a job service is attached to the app. */
export const HealthStatus = z.object({
  ok: z.boolean(),
  db: z.enum(['ok', 'down']),
  queue: z.enum(['ok', 'down', 'not-configured']),
  version: z.string(),
})
export type HealthStatus = z.infer<typeof HealthStatus>
