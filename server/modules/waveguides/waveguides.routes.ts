import { Router } from 'express'
import { SavedWaveguideCreate, SavedWaveguideDuplicate, SavedWaveguideListQuery, SavedWaveguideUpdate } from '@shared/api/waveguides-api'
import { validate } from '../../middleware/validate'
import { requireAuth } from '../auth/auth.middleware'
import {
  createWaveguide,
  duplicateWaveguide,
  getWaveguide,
  listGroupWaveguides,
  removeWaveguide,
  replaceWaveguide,
  type WaveguidesDeps,
} from './waveguides.service'

/** /api/waveguides: a group's own waveguides. The group of an existing one comes from its row, never the client. */
export function waveguidesRoutes(deps: WaveguidesDeps): Router {
  const r = Router()
  r.use(requireAuth)

  r.get('/', validate({ query: SavedWaveguideListQuery }), async (req, res) => {
    const { groupId } = req.query as unknown as SavedWaveguideListQuery
    res.set('Cache-Control', 'no-store').json({ waveguides: await listGroupWaveguides(deps, req.auth, groupId) })
  })

  r.post('/', validate({ body: SavedWaveguideCreate }), async (req, res) => {
    const created = await createWaveguide(deps, req.auth, req.body)
    res.status(201).location(`/api/waveguides/${created.id}`).json(created)
  })

  r.get('/:id', async (req, res) => {
    res.set('Cache-Control', 'no-store').json(await getWaveguide(deps, req.auth, String(req.params.id)))
  })

  r.put('/:id', validate({ body: SavedWaveguideUpdate }), async (req, res) => {
    res.json(await replaceWaveguide(deps, req.auth, String(req.params.id), req.body))
  })

  r.delete('/:id', async (req, res) => {
    await removeWaveguide(deps, req.auth, String(req.params.id))
    res.status(204).end()
  })

  r.post('/:id/duplicate', validate({ body: SavedWaveguideDuplicate }), async (req, res) => {
    const copy = await duplicateWaveguide(deps, req.auth, String(req.params.id), req.body)
    res.status(201).location(`/api/waveguides/${copy.id}`).json(copy)
  })

  return r
}
