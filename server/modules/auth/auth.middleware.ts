import type { RequestHandler } from 'express'
import type { Db } from '../../db/client'
import { forbidden, unauthorized } from '../../errors'
import { findLiveToken, touchToken } from '../tokens/tokens.repo'
import { hashSecretToken } from './secret-token'
import { resolveAuthOptions, SESSION_COOKIE, SESSION_ROTATE_AFTER_MS, type AuthOptions } from './auth-options'
import { clearSessionCookie, rotateSession } from './session-cookie'
import { verifySessionToken } from './session-token'
import { findActiveSession } from './sessions.repo'

export interface AuthDeps {
  db: Db
  auth?: Partial<AuthOptions>
}

const BEARER = /^Bearer\s+(\S{16,200})\s*$/i

/**
 * Establishes req.auth from `Authorization: Bearer <api token>` or the session cookie, or leaves it
 * undefined. A Bearer header that is malformed or names no live token is refused with 401 rather
 * than treated as anonymous, so a script with a revoked token fails loudly. A bad or ended session
 * cookie is cleared and the request goes on anonymously.
 */
export function authenticate(deps: AuthDeps): RequestHandler {
  const opts = resolveAuthOptions(deps.auth)
  return async (req, res, next) => {
    const header = req.get('authorization')
    if (header !== undefined) {
      const match = BEARER.exec(header)
      const found = match ? await findLiveToken(deps.db, hashSecretToken(match[1])) : null
      if (!found) return next(unauthorized('The API token is not valid (revoked, expired or mistyped)'))
      req.auth = { userId: found.user.id, email: found.user.email, isAdmin: found.user.isAdmin, via: 'token', tokenId: found.tokenId }
      await touchToken(deps.db, found.tokenId)
      return next()
    }

    const cookie: unknown = req.cookies?.[SESSION_COOKIE]
    if (typeof cookie !== 'string' || cookie === '') return next()
    const claims = await verifySessionToken(opts.jwtSecret, cookie)
    const session = claims && (await findActiveSession(deps.db, claims.sessionId, claims.userId))
    if (!claims || !session) {
      clearSessionCookie(opts, req, res)
      return next()
    }
    req.auth = { userId: session.user.id, email: session.user.email, isAdmin: session.user.isAdmin, via: 'session', sessionId: session.sessionId }
    if (Date.now() - claims.issuedAt * 1000 > SESSION_ROTATE_AFTER_MS) {
      await rotateSession(deps.db, opts, req, res, { sessionId: session.sessionId, userId: session.user.id, createdAt: session.createdAt })
    }
    next()
  }
}

/** 401 unless someone is signed in (cookie or token). */
export const requireAuth: RequestHandler = (req, _res, next) => {
  next(req.auth ? undefined : unauthorized())
}

/** 401 when anonymous, 403 unless a site admin. */
export const requireAdmin: RequestHandler = (req, _res, next) => {
  if (!req.auth) return next(unauthorized())
  next(req.auth.isAdmin ? undefined : forbidden('Only site administrators can do this'))
}
