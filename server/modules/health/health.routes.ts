import { Router } from 'express'
import type { AppDeps } from '../../app'
import { checkHealth } from './health.service'

export function healthRoutes(deps: AppDeps): Router {
  const router = Router()
  router.get('/health', async (_req, res) => {
    const status = await checkHealth(deps.pool, deps.queueCheck, deps.version)
    // 503 lets a load balancer or `curl -f` see trouble without parsing the body.
    res.status(status.ok ? 200 : 503).set('Cache-Control', 'no-store').json(status)
  })
  return router
}
