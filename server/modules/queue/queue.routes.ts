import { Router } from 'express'
import type { Pool } from 'pg'
import { requireAdmin } from '../auth/auth.middleware'
import { queueStatus } from './queue.service'

/** GET /api/queue: what the admin view shows about the job service. */
export function queueRoutes(deps: { pool: Pool }): Router {
  const r = Router()
  r.get('/', requireAdmin, async (_req, res) => {
    res.set('Cache-Control', 'no-store').json(await queueStatus(deps.pool))
  })
  return r
}
