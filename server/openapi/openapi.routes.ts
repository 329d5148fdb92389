// GET /api/openapi.json: the API description, public. Built on first request from the registry and the
// routes this very app has mounted (their validate() schemas), then kept.
import { Router } from 'express'
import { API_OPERATIONS } from './operations'
import { buildOpenApiDocument } from './document'
import { mountedApiRoutes } from './route-walk'

export function openApiRoutes(deps: { version: string }): Router {
  const router = Router()
  let document: object | null = null
  router.get('/openapi.json', (req, res) => {
    document ??= buildOpenApiDocument(API_OPERATIONS, { version: deps.version, mounted: mountedApiRoutes(req.app) })
    res.set('Cache-Control', 'no-cache').json(document)
  })
  return router
}
