// Which route parameter a path segment fills. Express decodes parameters while it matches routes, so a
// malformed percent-encoding fails before any handler knows the route; this walks the mounted routers
// once more, matching segments without decoding, to name the parameter in the 400.
import type { Application } from 'express'

interface LayerLike {
  rawPath?: unknown
  route?: { path?: unknown; stack?: LayerLike[] }
  handle?: { stack?: LayerLike[] }
}

/** Matches `pattern` ('/runs/:id') against the start (or, with `end`, the whole) of `segments`. */
function matchSegments(pattern: string, segments: string[], end: boolean): { rest: string[]; params: Record<string, string> } | null {
  const parts = pattern.split('/').filter(Boolean)
  if (parts.length > segments.length || (end && parts.length !== segments.length)) return null
  const params: Record<string, string> = {}
  for (let i = 0; i < parts.length; i++) {
    if (parts[i].startsWith(':')) params[parts[i].slice(1)] = segments[i]
    else if (parts[i] !== segments[i]) return null
  }
  return { rest: segments.slice(parts.length), params }
}

function search(stack: LayerLike[], segments: string[], raw: string): string | null {
  for (const layer of stack) {
    const route = layer.route
    const pattern = typeof route?.path === 'string' ? route.path : typeof layer.rawPath === 'string' ? layer.rawPath : null
    if (pattern === null) continue
    const m = matchSegments(pattern, segments, Boolean(route))
    if (!m) continue
    const name = Object.keys(m.params).find((k) => m.params[k] === raw)
    if (name) return name
    const inner = layer.handle?.stack
    if (!route && inner) {
      const found = search(inner, m.rest, raw)
      if (found) return found
    }
  }
  return null
}

/** The name of the route parameter that `raw` (still percent-encoded) stands in, or null. */
export function pathParamName(app: Application, path: string, raw: string): string | null {
  const stack = (app as unknown as { router?: { stack?: LayerLike[] } }).router?.stack
  if (!stack) return null
  return search(stack, path.split('/').filter(Boolean), raw)
}
