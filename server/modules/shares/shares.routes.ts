import { Router } from 'express'
import { ShareCreateBody, ShareListQuery } from '@shared/api/shares'
import type { Db } from '../../db/client'
import { validate } from '../../middleware/validate'
import { requireAuth } from '../auth/auth.middleware'
import { createShare, listShares, revokeShare } from './shares.service'

/** /api/shares: make, list and revoke read-only links to registered resources. */
export function sharesRoutes(deps: { db: Db }): Router {
  const router = Router()
  router.use(requireAuth)
  router.post('/', validate({ body: ShareCreateBody }), async (req, res) => {
    res.status(201).json(await createShare(deps.db, req.auth, req.body))
  })
  router.get('/', validate({ query: ShareListQuery }), async (req, res) => {
    const q = req.query as unknown as { resourceType: string; resourceId: string }
    res.json({ shares: await listShares(deps.db, req.auth, q.resourceType, q.resourceId) })
  })
  router.delete('/:id', async (req, res) => {
    res.json(await revokeShare(deps.db, req.auth, req.params.id))
  })
  return router
}
