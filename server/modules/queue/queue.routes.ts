import { Router } from 'express'
import type { Pool } from 'pg'
import { requireAdmin } from '../auth/auth.middleware'
import type { QueueActivity } from '@shared/api/queue'
import { queueStatus, workerActivity } from './queue.service'
import { SAMPLE_INTERVAL_S, WINDOW_S, recentQueueSamples } from './queue-history'

/** GET /api/queue and /api/queue/activity: what the admin view shows about the job service. */
export function queueRoutes(deps: { pool: Pool }): Router {
  const r = Router()
  r.get('/', requireAdmin, async (_req, res) => {
    res.set('Cache-Control', 'no-store').json(await queueStatus(deps.pool))
  })
  r.get('/activity', requireAdmin, async (_req, res) => {
    const [samples, workers] = await Promise.all([recentQueueSamples(deps.pool), workerActivity(deps.pool)])
    const body: QueueActivity = { sampleIntervalS: SAMPLE_INTERVAL_S, windowS: WINDOW_S, samples, workers }
    res.set('Cache-Control', 'no-store').json(body)
  })
  return r
}
