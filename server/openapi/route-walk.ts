// The routes an Express app actually serves, read from its router stack, with the zod schemas their
// validate() middleware carries. The OpenAPI document takes each route's input schemas from here, and the
// documentation test compares this list with the registry, so a route and its description cannot part.
import type { Application } from 'express'
import type { z } from 'zod'

export interface RouteSchemas {
  body?: z.ZodType
  query?: z.ZodType
  params?: z.ZodType
}

export interface MountedRoute {
  method: string
  /** Express pattern, e.g. /api/runs/:id/clone. */
  path: string
  schemas: RouteSchemas
}

interface LayerLike {
  rawPath?: unknown
  route?: { path?: unknown; methods?: Record<string, boolean>; stack?: LayerLike[] }
  handle?: { stack?: LayerLike[]; schemas?: RouteSchemas }
}

const joinPath = (a: string, b: string) => `${a}/${b}`.replace(/\/+/g, '/').replace(/(.)\/$/, '$1')

function walk(stack: LayerLike[], prefix: string, out: MountedRoute[]): void {
  for (const layer of stack) {
    if (layer.route && typeof layer.route.path === 'string') {
      const path = joinPath(prefix, layer.route.path)
      const schemas: RouteSchemas = {}
      for (const l of layer.route.stack ?? []) Object.assign(schemas, l.handle?.schemas ?? {})
      for (const [m, on] of Object.entries(layer.route.methods ?? {})) {
        if (on && m !== '_all') out.push({ method: m.toUpperCase(), path, schemas })
      }
    } else if (layer.handle?.stack && typeof layer.rawPath === 'string') {
      walk(layer.handle.stack, joinPath(prefix, layer.rawPath), out)
    }
  }
}

/** Every route under /api (the client's static files and its SPA fallback are left out). */
export function mountedApiRoutes(app: Application): MountedRoute[] {
  const out: MountedRoute[] = []
  walk((app as unknown as { router: { stack: LayerLike[] } }).router.stack, '', out)
  return out.filter((r) => r.path.startsWith('/api/'))
}
