import { jwtVerify, SignJWT } from 'jose'

const ISSUER = 'sonoweave'
const AUDIENCE = 'sonoweave-session'

export interface SessionClaims {
  userId: string
  sessionId: string
  /** Seconds since the epoch. */
  issuedAt: number
}

const keyOf = (secret: string) => new TextEncoder().encode(secret)

/** The cookie's content: an HS256 JWT naming the user and the sessions row. */
export function signSessionToken(secret: string, claims: { userId: string; sessionId: string }, expiresAt: Date, issuedAt = new Date()): Promise<string> {
  return new SignJWT({ sid: claims.sessionId })
    .setProtectedHeader({ alg: 'HS256', typ: 'JWT' })
    .setSubject(claims.userId)
    .setIssuer(ISSUER)
    .setAudience(AUDIENCE)
    .setIssuedAt(Math.floor(issuedAt.getTime() / 1000))
    .setExpirationTime(Math.floor(expiresAt.getTime() / 1000))
    .sign(keyOf(secret))
}

/** The claims of a valid token, or null for anything tampered, expired, unsigned or signed with another key. */
export async function verifySessionToken(secret: string, token: string): Promise<SessionClaims | null> {
  try {
    // algorithms pinned: a token announcing "none" or another algorithm is refused outright.
    const { payload } = await jwtVerify(token, keyOf(secret), { algorithms: ['HS256'], issuer: ISSUER, audience: AUDIENCE })
    if (typeof payload.sub !== 'string' || typeof payload.sid !== 'string' || typeof payload.iat !== 'number') return null
    return { userId: payload.sub, sessionId: payload.sid, issuedAt: payload.iat }
  } catch {
    return null
  }
}
