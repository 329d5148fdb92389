import { Router } from 'express'
import { SweepCreate, SweepDefinition, SweepDownloadQuery, SweepListQuery } from '@shared/api/sweeps'
import { SensingMapQuery } from '@shared/api/sensing-map'
import { validate } from '../../middleware/validate'
import { isUuid } from '../../policy/ids'
import { requireAuth } from '../auth/auth.middleware'
import { registerShareable, shareTokenOf } from '../shares'
import { streamSweepZip } from './sweep-download'
import { sendSensingMap } from './sensing-map-download'
import { sensingMapFor } from './sensing-map.service'
import { findSweep } from './sweeps.repo'
import { cancelSweep, createSweep, estimateSweepFor, getSweep, listSweepsFor, rerunFailed, type SweepsDeps } from './sweeps.service'

export function sweepsRoutes(deps: SweepsDeps): Router {
  // Sweeps get share links like runs (read-only: detail and download).
  registerShareable('sweep', { groupOf: async (_db, id) => (isUuid(id) ? ((await findSweep(deps.pool, id))?.groupId ?? null) : null), pathOf: (id) => `/sweeps/${id}` })
  const r = Router()

  r.post('/estimate', requireAuth, validate({ body: SweepDefinition }), async (req, res) => {
    res.json(await estimateSweepFor(deps, req.body))
  })

  r.post('/', requireAuth, validate({ body: SweepCreate }), async (req, res) => {
    const sweep = await createSweep(deps, req.auth, req.body)
    res.status(202).location(`/api/sweeps/${sweep.id}`).json(sweep)
  })

  r.get('/', requireAuth, validate({ query: SweepListQuery }), async (req, res) => {
    res.json(await listSweepsFor(deps, req.auth, req.query as unknown as SweepListQuery))
  })

  r.get('/:id', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await getSweep(deps, req.auth, String(req.params.id), shareTokenOf(req)))
  })

  r.post('/:id/cancel', requireAuth, async (req, res) => {
    res.json(await cancelSweep(deps, req.auth, String(req.params.id)))
  })

  r.post('/:id/rerun-failed', requireAuth, async (req, res) => {
    res.status(202).json(await rerunFailed(deps, req.auth, String(req.params.id)))
  })

  r.get('/:id/download', validate({ query: SweepDownloadQuery }), async (req, res) => {
    const q = req.query as unknown as { arrays: boolean; share?: string }
    const sweep = await getSweep(deps, req.auth, String(req.params.id), shareTokenOf(req))
    await streamSweepZip(res, deps.db, sweep, q.arrays, req.log)
  })

  r.get('/:id/sensing-map', validate({ query: SensingMapQuery }), async (req, res) => {
    const q = req.query as unknown as SensingMapQuery
    const id = String(req.params.id)
    sendSensingMap(res, await sensingMapFor(deps, req.auth, id, q.noiseRms, shareTokenOf(req)), q.format, id)
  })

  return r
}
