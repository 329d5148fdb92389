import type { Request, Response } from 'express'
import type { Db } from '../../db/client'
import { SESSION_ABSOLUTE_MS, SESSION_COOKIE, SESSION_IDLE_MS, type AuthOptions } from './auth-options'
import { signSessionToken } from './session-token'
import { createSession, extendSession } from './sessions.repo'

function setCookie(req: Request, res: Response, jwt: string, expiresAt: Date): void {
  res.cookie(SESSION_COOKIE, jwt, {
    httpOnly: true,
    sameSite: 'lax',
    // req.secure is true behind an HTTPS proxy on loopback (app 'trust proxy'); plain http in dev.
    secure: req.secure,
    path: '/',
    expires: expiresAt,
  })
}

export function clearSessionCookie(req: Request, res: Response): void {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: req.secure, path: '/' })
}

/** A new sessions row and its cookie. */
export async function startSession(db: Db, opts: AuthOptions, req: Request, res: Response, userId: string): Promise<string> {
  const expiresAt = new Date(Date.now() + SESSION_IDLE_MS)
  const session = await createSession(db, userId, expiresAt, req.get('user-agent'))
  setCookie(req, res, await signSessionToken(opts.jwtSecret, { userId, sessionId: session.id }, expiresAt), expiresAt)
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
  setCookie(req, res, await signSessionToken(opts.jwtSecret, session, expiresAt), expiresAt)
}
