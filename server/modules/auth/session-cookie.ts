import type { Request, Response } from 'express'
import type { Db } from '../../db/client'
import { SESSION_ABSOLUTE_MS, SESSION_COOKIE, SESSION_IDLE_MS, type AuthOptions } from './auth-options'
import { signSessionToken } from './session-token'
import { createSession, extendSession } from './sessions.repo'

/**
 * Secure whenever the public address is https, even when the request reached us as plain http (a
 * TLS proxy that does not send X-Forwarded-Proto); otherwise when this request came over https
 * (req.secure, through a loopback proxy: app 'trust proxy'). Plain http in development.
 */
function secureCookie(opts: AuthOptions, req: Request): boolean {
  return opts.appUrl?.startsWith('https://') === true || req.secure
}

function setCookie(opts: AuthOptions, req: Request, res: Response, jwt: string, expiresAt: Date): void {
  res.cookie(SESSION_COOKIE, jwt, { httpOnly: true, sameSite: 'lax', secure: secureCookie(opts, req), path: '/', expires: expiresAt })
}

export function clearSessionCookie(opts: AuthOptions, req: Request, res: Response): void {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: secureCookie(opts, req), path: '/' })
}

/** A new sessions row and its cookie. */
export async function startSession(db: Db, opts: AuthOptions, req: Request, res: Response, userId: string): Promise<string> {
  const expiresAt = new Date(Date.now() + SESSION_IDLE_MS)
  const session = await createSession(db, userId, expiresAt, req.get('user-agent'))
  setCookie(opts, req, res, await signSessionToken(opts.jwtSecret, { userId, sessionId: session.id }, expiresAt), expiresAt)
  return session.id
}

/** Replaces the cookie with a fresh JWT and slides the session's end, never past its absolute limit. */
export async function rotateSession(
  db: Db,
  opts: AuthOptions,
  req: Request,
  res: Response,
  session: { sessionId: string; userId: string; createdAt: Date },
): Promise<void> {
  const expiresAt = new Date(Math.min(Date.now() + SESSION_IDLE_MS, session.createdAt.getTime() + SESSION_ABSOLUTE_MS))
  await extendSession(db, session.sessionId, expiresAt)
  setCookie(opts, req, res, await signSessionToken(opts.jwtSecret, session, expiresAt), expiresAt)
}
