import { Router } from 'express'
import { ApiTokenCreateBody } from '@shared/api/auth'
import type { Db } from '../../db/client'
import { validate } from '../../middleware/validate'
import { requireAuth } from '../auth/auth.middleware'
import { createToken, listMyTokens, revokeMyToken } from './tokens.service'

/** /api/tokens: the caller's own API tokens. The secret appears only in the POST answer. */
export function tokensRoutes(deps: { db: Db }): Router {
  const router = Router()
  router.use(requireAuth)
  router.get('/', async (req, res) => res.set('Cache-Control', 'no-store').json({ tokens: await listMyTokens(deps.db, req.auth!.userId) }))
  router.post('/', validate({ body: ApiTokenCreateBody }), async (req, res) =>
    res.status(201).set('Cache-Control', 'no-store').json(await createToken(deps.db, req.auth!.userId, req.body)),
  )
  router.delete('/:id', async (req, res) => {
    await revokeMyToken(deps.db, req.auth!.userId, req.params.id)
    res.status(204).end()
  })
  return router
}
