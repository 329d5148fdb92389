import { Router } from 'express'
import { FitListQuery, FitRequest } from '@shared/api/fits'
import { validate } from '../../middleware/validate'
import { requireAuth } from '../auth/auth.middleware'
import { createFit, getFit, listFitsFor, removeFit, type FitsDeps } from './fits.service'

export function fitsRoutes(deps: FitsDeps): Router {
  const r = Router()

  r.post('/', requireAuth, validate({ body: FitRequest }), async (req, res) => {
    const fit = await createFit(deps, req.auth, req.body)
    res.status(fit.status === 'succeeded' ? 201 : 202).location(`/api/fits/${fit.id}`).json(fit)
  })

  r.get('/', requireAuth, validate({ query: FitListQuery }), async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await listFitsFor(deps, req.auth, req.query as { traceId?: string; runId?: string }))
  })

  r.get('/:id', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await getFit(deps, req.auth, String(req.params.id)))
  })

  r.delete('/:id', requireAuth, async (req, res) => {
    await removeFit(deps, req.auth, String(req.params.id))
    res.status(204).end()
  })

  return r
}
