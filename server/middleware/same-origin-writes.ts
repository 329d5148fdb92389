import type { Request, RequestHandler } from 'express'
import { AppError } from '../errors'

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS'])

function originOf(url: string): string | null {
  try {
    return new URL(url).origin
  } catch {
    return null
  }
}

/**
 * Refuses a state-changing request that a browser made from another site: the session cookie rides
 * along on those (SameSite=Lax still lets top-level form posts through in some browsers, and never
 * covers sibling subdomains), so without this check any page could act as the signed-in user.
 *
 * The rule, in order:
 * 1. GET, HEAD and OPTIONS pass (they change nothing).
 * 2. A request with an Authorization header passes: a Bearer token is not ambient, a page on another
 *    site cannot attach it, and authenticate() refuses a bad one with 401.
 * 3. Sec-Fetch-Site, when the browser sends it (scripts cannot forge it), must be same-origin.
 * 4. Otherwise Origin, or failing that Referer, must be this server's own origin (scheme, host and
 *    port, as the request reached us through a trusted proxy) or PUBLIC_URL's. Origin "null"
 *    (sandboxed frames, privacy redirects) is foreign.
 * 5. A request with none of the three is not from a browser (curl, scripts, supertest): it passes,
 *    because browsers always send Origin on cross-origin POST, PUT, PATCH and DELETE (Fetch
 *    standard, "append a request `Origin` header"; common practice, OWASP CSRF cheat sheet).
 */
export function sameOriginWrites(publicUrl: string | undefined): RequestHandler {
  const configured = publicUrl ? originOf(publicUrl) : null
  const allowed = (req: Request, origin: string | null) => origin !== null && (origin === `${req.protocol}://${req.host}` || origin === configured)

  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method) || req.get('authorization') !== undefined) return next()
    const fetchSite = req.get('sec-fetch-site')
    const origin = req.get('origin')
    const referer = req.get('referer')
    let ok: boolean
    if (fetchSite !== undefined) ok = fetchSite === 'same-origin'
    else if (origin !== undefined) ok = allowed(req, originOf(origin))
    else if (referer !== undefined) ok = allowed(req, originOf(referer))
    else ok = true
    next(ok ? undefined : new AppError('cross_site_request', 403, 'This request came from another site; open Sonoweave itself and try again'))
  }
}
